import { createWriteStream, type WriteStream } from 'node:fs';
import { once } from 'node:events';
import path from 'node:path';
import type { Writable } from 'node:stream';
import type { ObjectStore } from '@toneledger/storage/object-store';
import { mayRead } from '@toneledger/common/fields/field';
import { PRINT_FIELDS } from '@toneledger/common/fields/print';
import { STEP_FIELDS } from '@toneledger/common/fields/step';
import type { Role } from '@toneledger/common/domain/roles';
import type { BagProblem, BagSelection } from '@toneledger/common/schemas/preservation';
import { printListQuerySchema } from '@toneledger/common/schemas/catalogue';
import { buildListSql } from '../print-list.service';
import { PRINT_ROWS_SQL, STEP_ROWS_SQL, exportCellInRow, type DbRow } from '../print-csv';
import { toCsv } from '../csv-cells';
import { BagWriter } from './bag-writer';
import { readSchema, rowJson, type RawConnection, type Schema } from './connection';
import { writeDictionary } from './dictionary';
import { PRINT_SECTIONS } from './sections';
import type { BagTable } from './section';
import { AUDIT_TABLE, COLLECTION_TABLES } from './tables';

/** Prints read and written per round: their files, CSV rows and images. */
export const PRINT_BATCH = 200;
const ROW_BATCH = 2000;

export interface ExportOptions {
  selection: BagSelection | null;
  withImages: boolean;
  /** Who exports: the CSVs hold the fields this role may read. */
  role: Role;
  store: ObjectStore;
  /** A folder of the export's own for its temporary files (the manifest, CSVs, record files). */
  workDir: string;
  /** The bag's folder inside the tar. */
  root: string;
  progress(stage: string, done: number, total: number): Promise<void>;
}

export interface ExportResult {
  payloadOxum: string;
  files: number;
  prints: number;
  problems: BagProblem[];
}

/** A print's file name: its accession number when that is a safe file name, otherwise made safe and suffixed with its id. */
export function printFileName(accession: string, id: string): string {
  const safe = accession.replace(/[^A-Za-z0-9._-]/g, '_').replace(/^\.+/, '_');
  return safe === accession && safe.length <= 120 ? `${safe}.json` : `${safe.slice(0, 80)}--${id}.json`;
}

/** jsonb of a table's rows under a parent row, each with its own nested rows. */
function nestedSql(schema: Schema, t: BagTable, parent: string, depth: number): string {
  const a = `t${depth}`;
  const kids = (t.children ?? []).filter((c) => schema.has(c.table));
  const row = kids.length
    ? `${rowJson(schema, t.table, a)} || jsonb_build_object(${kids.map((c) => `'${c.key}', ${nestedSql(schema, c, a, depth + 1)}`).join(', ')})`
    : rowJson(schema, t.table, a);
  const order = t.orderBy.replace(/\bt\./g, `${a}.`);
  const extra = t.where ? ` AND (${t.where.replace(/\bt\./g, `${a}.`)})` : '';
  return `COALESCE((SELECT jsonb_agg(${row} ORDER BY ${order}) FROM ${t.table} ${a} WHERE ${a}.${t.parentColumn} = ${parent}.${t.parentKey ?? 'id'}${extra}), '[]'::jsonb)`;
}

/** The statement that gives each print of a batch (`$1`) with its whole file as text. */
export function printDocumentSql(schema: Schema): string {
  const sections = PRINT_SECTIONS.filter((s) => schema.has(s.table)).map((s) => `'${s.key}', ${nestedSql(schema, s, 'p', 1)}`);
  // Compact JSON: indented, the files of a large catalogue were about three times the size.
  return `SELECT p.id, p.accession_number, jsonb_build_object(
      'format', 'toneledger-print/1', 'accessionNumber', p.accession_number, 'print', ${rowJson(schema, 'prints', 'p')},
      'sections', jsonb_build_object(${sections.join(', ')}))::text AS doc
    FROM bag_prints b JOIN prints p ON p.id = b.id WHERE b.n > $1 ORDER BY b.n LIMIT $2`;
}

async function writeLine(out: WriteStream, text: string) {
  if (!out.write(text)) await once(out, 'drain');
}

async function closeFile(out: WriteStream) {
  out.end();
  await once(out, 'finish');
}

/** Rows of a statement a batch at a time through a cursor of the snapshot. */
async function* cursorRows<T>(c: RawConnection, name: string, sql: string, values: unknown[] = []): AsyncGenerator<T[]> {
  await c.query(`DECLARE ${name} NO SCROLL CURSOR FOR ${sql}`, values);
  try {
    for (;;) {
      const { rows } = await c.query<T>(`FETCH ${ROW_BATCH} FROM ${name}`);
      if (!rows.length) return;
      yield rows;
    }
  } finally {
    await c.query(`CLOSE ${name}`);
  }
}

/** A table to a JSON Lines file on disk (one stored row per line), then into the bag. */
async function addJsonLines(c: RawConnection, bag: BagWriter, workDir: string, rel: string, sql: string, values: unknown[] = []): Promise<number> {
  const file = path.join(workDir, rel.replace(/\//g, '_'));
  const out = createWriteStream(file);
  let n = 0;
  for await (const rows of cursorRows<{ j: string }>(c, 'bag_rows', sql, values)) {
    await writeLine(out, rows.map((r) => `${r.j}\n`).join(''));
    n += rows.length;
  }
  await closeFile(out);
  await bag.addPayloadFile(rel, file);
  return n;
}

/** Fills the temporary table `bag_prints (id, n)` with the prints the bag holds, in accession order. */
async function choosePrints(c: RawConnection, selection: BagSelection | null, role: Role): Promise<number> {
  await c.query('CREATE TEMPORARY TABLE bag_prints (id uuid PRIMARY KEY, n integer NOT NULL UNIQUE) ON COMMIT DROP');
  const order = 'row_number() OVER (ORDER BY p.accession_sort, p.id)';
  if (!selection) await c.query(`INSERT INTO bag_prints SELECT p.id, ${order} FROM prints p`);
  else if (selection.kind === 'ids') await c.query(`INSERT INTO bag_prints SELECT p.id, ${order} FROM prints p WHERE p.id = ANY($1::uuid[])`, [selection.ids]);
  else {
    const sql = buildListSql(printListQuerySchema.parse({ ...selection.query }), role);
    const where = sql.where.trim();
    await c.query(`INSERT INTO bag_prints SELECT p.id, ${order} FROM prints p ${where && !/^where\b/i.test(where) ? `WHERE ${where}` : where}`, sql.countParams);
  }
  const { rows } = await c.query<{ n: number }>('SELECT count(*)::int AS n FROM bag_prints');
  return rows[0].n;
}

/**
 * Writes the bag into `out` (a tar), from one snapshot of the database (REPEATABLE READ), so every
 * file agrees with every other. Prints go a batch at a time: their files, their CSV rows (to files on
 * disk, added at the end) and their images streamed from object storage, each hashed on the way.
 */
export async function writeBag(c: RawConnection, out: Writable, o: ExportOptions, info: { institution: string; description: string; query: string }): Promise<ExportResult> {
  const problems: BagProblem[] = [];
  await c.query('BEGIN ISOLATION LEVEL REPEATABLE READ');
  try {
    await c.query("SET LOCAL TIME ZONE 'UTC'");
    const schema = await readSchema(c);
    const total = await choosePrints(c, o.selection, o.role);
    const bag = new BagWriter(out, o.root, o.workDir);

    await o.progress('Reference records', 0, total);
    for (const t of COLLECTION_TABLES.filter((x) => schema.has(x.table))) {
      const order = t.orderBy ?? schema.primaryKey(t.table).map((k) => `t.${k}`).join(', ');
      await addJsonLines(c, bag, o.workDir, `records/${t.table}.jsonl`, t.fromSql ?? `SELECT ${rowJson(schema, t.table, 't')}::text AS j FROM ${t.table} t ORDER BY ${order}`);
    }

    const printFields = PRINT_FIELDS.filter((f) => mayRead(o.role, f));
    const printsCsv = createWriteStream(path.join(o.workDir, 'prints.csv'));
    const stepsCsv = createWriteStream(path.join(o.workDir, 'process-steps.csv'));
    await writeLine(printsCsv, `\uFEFF${toCsv([printFields.map((f) => f.column)])}`);
    await writeLine(stepsCsv, `\uFEFF${toCsv([STEP_FIELDS.map((f) => f.column)])}`);

    const docSql = printDocumentSql(schema);
    let done = 0;
    for (let after = 0; ; ) {
      const { rows } = await c.query<{ id: string; accession_number: string; doc: string }>(docSql, [after, PRINT_BATCH]);
      if (!rows.length) break;
      after += rows.length;
      const ids = rows.map((r) => r.id);
      for (const r of rows) await bag.addPayload(`prints/${printFileName(r.accession_number, r.id)}`, Buffer.from(`${r.doc}\n`, 'utf8'));
      const printRows = (await c.query<DbRow>(`${PRINT_ROWS_SQL} WHERE p.id = ANY($1::uuid[])`, [ids])).rows;
      const byId = new Map(printRows.map((r) => [r.id as string, r]));
      await writeLine(printsCsv, toCsv(ids.map((id) => printFields.map((f) => exportCellInRow(f, byId.get(id)!)))));
      const stepRows = (await c.query<DbRow>(`${STEP_ROWS_SQL} WHERE s.print_id = ANY($1::uuid[]) ORDER BY p.accession_sort, p.id, s.position`, [ids])).rows;
      if (stepRows.length) await writeLine(stepsCsv, toCsv(stepRows.map((r) => STEP_FIELDS.map((f) => exportCellInRow(f, r)))));
      if (o.withImages) await addImages(c, bag, o.store, ids, problems);
      done += rows.length;
      await o.progress('Prints', done, total);
    }
    await closeFile(printsCsv);
    await closeFile(stepsCsv);
    await o.progress('Audit trail', done, total);
    if (schema.has(AUDIT_TABLE)) {
      const onlySelected = o.selection ? 'WHERE t.entity_id IN (SELECT id::text FROM bag_prints)' : '';
      await addJsonLines(c, bag, o.workDir, `audit/${AUDIT_TABLE}.jsonl`, `SELECT ${rowJson(schema, AUDIT_TABLE, 't')}::text AS j FROM ${AUDIT_TABLE} t ${onlySelected} ORDER BY t.id`);
    }
    await bag.addPayloadFile('csv/prints.csv', path.join(o.workDir, 'prints.csv'));
    await bag.addPayloadFile('csv/process-steps.csv', path.join(o.workDir, 'process-steps.csv'));
    await writeDictionary(bag, schema, printFields.map((f) => f.column));
    await o.progress('Tag files', done, total);
    const result = await bag.finish([
      ['Source-Organization', info.institution],
      ['External-Description', info.description],
      ['Bag-Software-Agent', 'Toneledger'],
      ['Toneledger-Export-Query', info.query],
      ['Toneledger-Prints', String(total)],
      ['Toneledger-Images', o.withImages ? 'originals and display copies' : 'left out'],
    ], new Date().toISOString().slice(0, 10));
    await c.query('COMMIT');
    return { ...result, prints: total, problems };
  } catch (err) {
    await c.query('ROLLBACK').catch(() => {});
    throw err;
  }
}

/** The images of a batch of prints: each original byte for byte (checked against its stored SHA-256) and its display copies. */
async function addImages(c: RawConnection, bag: BagWriter, store: ObjectStore, printIds: string[], problems: BagProblem[]) {
  const { rows } = await c.query<{ id: string; sha256: string; original_key: string; thumb_key: string | null; screen_key: string | null }>(
    `SELECT i.id, i.sha256, i.original_key, i.thumb_key, i.screen_key FROM images i JOIN bag_prints b ON b.id = i.print_id
     WHERE i.print_id = ANY($1::uuid[]) AND i.purged_at IS NULL ORDER BY b.n, i.captured_on NULLS LAST, i.uploaded_at, i.id`,
    [printIds],
  );
  for (const image of rows) {
    for (const key of [image.original_key, image.screen_key, image.thumb_key]) {
      if (!key) continue;
      const head = await store.head(key);
      if (!head) {
        problems.push({ path: `data/images/${key}`, message: `The stored file of image ${image.id} is missing from object storage; it is not in the bag` });
        continue;
      }
      const sha = await bag.addPayload(`images/${key}`, { stream: await store.get(key), size: head.size });
      if (key === image.original_key && sha !== image.sha256.trim()) {
        problems.push({ path: `data/images/${key}`, message: `The original of image ${image.id} no longer matches its fixity value (stored ${image.sha256}, read ${sha})` });
      }
    }
  }
}
