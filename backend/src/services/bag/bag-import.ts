import { Readable } from 'node:stream';
import { createInterface } from 'node:readline';
import type { ObjectStore } from '@toneledger/storage/object-store';
import type { BagProblem } from '@toneledger/common/schemas/preservation';
import { readTar, type EntryBody } from './bag-check';
import { readSchema, type RawConnection, type Schema } from './connection';
import { PRINT_SECTIONS } from './sections';
import { tablesOf, type BagTable } from './section';
import { AUDIT_TABLE, COLLECTION_TABLES } from './tables';

type Row = Record<string, unknown>;

/** An installation that already holds prints is not empty: a bag is brought only into an empty one. */
export class NotEmptyError extends Error {}

/** A bag that checked clean but whose records could not be written (a file that is not what its place says). */
export class BagContentError extends Error {
  constructor(readonly problem: BagProblem) {
    super(`${problem.path}: ${problem.message}`);
  }
}

const PRINTS_PER_WRITE = 100;
/**
 * Tables whose triggers would refuse the import's writes: rows of a signed report or treatment
 * (refused on insert once it is signed), and the audit trail (the installation's own events are moved
 * after the bag's). Their user triggers are off inside the import's transaction only; every other
 * trigger runs (the research cache of process steps fills itself).
 */
const REFUSING_INSERTS = ['observations', 'treatment_images', AUDIT_TABLE];
const ROWS_PER_WRITE = 1000;

export interface ImportCounts {
  prints: number;
  records: number;
  images: number;
  auditEvents: number;
}

/**
 * Writes a checked bag's records into this installation in one transaction, keeping every id: the
 * records of `data/records/` table by table, each print's file (its row, then its sections' rows table
 * by table), the audit trail, and the image files into the bucket at their storage keys. People are
 * matched to the installation's own accounts by sign-in identity or email (their rows keep the
 * installation's id and every reference to them is rewritten); settings and condition terms the
 * installation already holds take the bag's values; the installation's own audit events (its first
 * sign-ins) are kept and numbered after the bag's. Files are read in the order the export writes them.
 * The triggers that refuse rows of signed records are off for the run (inside the transaction): the
 * rows arrive as they were, signed ones included.
 */
export async function importBag(c: RawConnection, source: Readable, root: string, store: ObjectStore, progress: (done: number) => Promise<void>): Promise<ImportCounts> {
  const written: string[] = [];
  await c.query('BEGIN');
  try {
    await c.query("SET LOCAL TIME ZONE 'UTC'");
    await c.query('LOCK TABLE prints IN SHARE ROW EXCLUSIVE MODE');
    const { rows: any } = await c.query('SELECT 1 FROM prints LIMIT 1');
    if (any.length) throw new NotEmptyError('This installation already holds prints; a bag is brought only into an empty installation');
    const schema = await readSchema(c);
    const tables = [...new Set([...COLLECTION_TABLES.map((t) => t.table), 'prints', ...PRINT_SECTIONS.flatMap(tablesOf).map((t) => t.table), AUDIT_TABLE])].filter((t) => schema.has(t));
    const triggered = REFUSING_INSERTS.filter((t) => schema.has(t));
    for (const t of triggered) await c.query(`ALTER TABLE ${t} DISABLE TRIGGER USER`);
    const ownAudit = (await c.query<Row>(`SELECT * FROM ${AUDIT_TABLE} ORDER BY id`)).rows;
    await c.query(`DELETE FROM ${AUDIT_TABLE}`);

    const w = new Writer(c, schema);
    const counts: ImportCounts = { prints: 0, records: 0, images: 0, auditEvents: 0 };
    let pending: Row[] = [];
    const flushPrints = async () => {
      if (!pending.length) return;
      await w.insertPrints(pending);
      counts.prints += pending.length;
      pending = [];
      await progress(counts.prints);
    };

    await readTar(source, async (name, size, body) => {
      const rel = root ? name.slice(root.length + 1) : name;
      const record = /^data\/records\/([a-z_]+)\.jsonl$/.exec(rel);
      if (record) {
        await flushPrints();
        counts.records += await readJsonLines(body, rel, (rows) => w.insert(record[1], rows));
      } else if (rel.startsWith('data/prints/') && rel.endsWith('.json')) {
        pending.push(parsePrintFile(await text(body), rel));
        if (pending.length >= PRINTS_PER_WRITE) await flushPrints();
      } else if (rel.startsWith('data/images/')) {
        const key = rel.slice('data/images/'.length);
        await store.put(key, Readable.from(body), { contentLength: size });
        written.push(key);
        counts.images += 1;
      } else if (rel === `data/audit/${AUDIT_TABLE}.jsonl`) {
        await flushPrints();
        counts.auditEvents += await readJsonLines(body, rel, (rows) => w.insert(AUDIT_TABLE, rows));
      } else body.resume();
    });
    await flushPrints();

    for (const t of tables) {
      for (const col of schema.serial(t)) {
        await c.query(`SELECT setval(pg_get_serial_sequence('${t}', '${col}'), GREATEST((SELECT max(${col}) FROM ${t}), 1))`);
      }
    }
    for (const row of ownAudit) {
      const cols = Object.keys(row).filter((k) => k !== 'id');
      await c.query(`INSERT INTO ${AUDIT_TABLE} (${cols.join(', ')}) VALUES (${cols.map((_, i) => `$${i + 1}`).join(', ')})`, cols.map((k) => row[k]));
    }
    for (const t of triggered) await c.query(`ALTER TABLE ${t} ENABLE TRIGGER USER`);
    await c.query('COMMIT');
    return counts;
  } catch (err) {
    await c.query('ROLLBACK').catch(() => {});
    for (const key of written) await store.delete(key).catch(() => {});
    throw err;
  }
}

async function text(body: EntryBody): Promise<string> {
  const parts: Buffer[] = [];
  for await (const chunk of body) parts.push(chunk);
  return Buffer.concat(parts).toString('utf8');
}

function parsePrintFile(json: string, rel: string): Row {
  let doc: unknown;
  try {
    doc = JSON.parse(json);
  } catch {
    throw new BagContentError({ path: rel, message: 'This print file is not valid JSON' });
  }
  const d = doc as { format?: unknown; print?: unknown; sections?: unknown };
  if (d.format !== 'toneledger-print/1' || !d.print || typeof d.print !== 'object' || !d.sections || typeof d.sections !== 'object') {
    throw new BagContentError({ path: rel, message: 'This is not a print file of format toneledger-print/1 (format, print, sections)' });
  }
  return d as Row;
}

/** Reads JSON Lines, handing rows over in batches. */
async function readJsonLines(body: EntryBody, rel: string, write: (rows: Row[]) => Promise<void>): Promise<number> {
  let batch: Row[] = [];
  let n = 0;
  for await (const line of createInterface({ input: Readable.from(body), crlfDelay: Infinity })) {
    if (!line.trim()) continue;
    try {
      batch.push(JSON.parse(line) as Row);
    } catch {
      throw new BagContentError({ path: rel, message: `Line ${n + batch.length + 1} is not valid JSON` });
    }
    if (batch.length >= ROWS_PER_WRITE) {
      await write(batch);
      n += batch.length;
      batch = [];
    }
  }
  if (batch.length) await write(batch);
  return n + batch.length;
}

/** Inserts rows by their stored column names through jsonb_populate_recordset (PostgreSQL converts each value to its column's type). */
class Writer {
  /** The bag's user ids that are an installation's own account under another id. */
  private readonly sameUser = new Map<string, string>();

  constructor(private readonly c: RawConnection, private readonly schema: Schema) {}

  async insert(table: string, rows: Row[]): Promise<void> {
    if (!this.schema.has(table) || !rows.length) return;
    if (table === 'users') rows = await this.matchUsers(rows);
    this.mapUsers(table, rows);
    const present = new Set(rows.flatMap((r) => Object.keys(r)));
    const cols = this.schema.columns(table).filter((col) => present.has(col));
    if (!cols.length) return;
    const list = cols.map((col) => `"${col}"`).join(', ');
    const conflict = COLLECTION_TABLES.find((t) => t.table === table)?.onConflict === 'update'
      ? ` ON CONFLICT (${this.schema.primaryKey(table).join(', ')}) DO UPDATE SET ${cols.map((col) => `"${col}" = EXCLUDED."${col}"`).join(', ')}`
      : '';
    await this.c.query(`INSERT INTO ${table} (${list}) SELECT ${list} FROM jsonb_populate_recordset(NULL::${table}, $1::jsonb)${conflict}`, [JSON.stringify(rows)]);
  }

  /** References to a person the installation already has under another id take that id. */
  mapUsers(table: string, rows: Row[]): void {
    for (const col of this.schema.userColumns(table)) {
      for (const r of rows) if (typeof r[col] === 'string' && this.sameUser.has(r[col] as string)) r[col] = this.sameUser.get(r[col] as string);
    }
    // An event about a person (provisioned, role changed) names them by id too.
    if (table === AUDIT_TABLE) {
      for (const r of rows) if (r.entity_type === 'user' && typeof r.entity_id === 'string' && this.sameUser.has(r.entity_id)) r.entity_id = this.sameUser.get(r.entity_id);
    }
  }

  /** People already here (same issuer and subject, or same email) keep their account; the others arrive with their ids. */
  private async matchUsers(rows: Row[]): Promise<Row[]> {
    const { rows: here } = await this.c.query<{ id: string; issuer: string | null; subject: string | null; email: string | null }>('SELECT id, issuer, subject, email FROM users');
    const fresh: Row[] = [];
    for (const r of rows) {
      const same = here.find((h) => (h.issuer !== null && h.issuer === r.issuer && h.subject === r.subject) || (h.email !== null && typeof r.email === 'string' && h.email.toLowerCase() === r.email.toLowerCase()) || h.id === r.id);
      if (same) {
        if (same.id !== r.id) this.sameUser.set(r.id as string, same.id);
      } else fresh.push(r);
    }
    return fresh;
  }

  /** A batch of print files: the prints, then each section's table (parents before their nested rows). */
  async insertPrints(docs: Row[]): Promise<void> {
    await this.insert('prints', docs.map((d) => d.print as Row));
    // Rows are kept by the section or nested list they came from, not by table: one table can be nested
    // in two places (addenda of a report and of a treatment), and each place is written in its turn.
    const byPlace = new Map<BagTable, Row[]>();
    const collect = (t: BagTable, rows: unknown) => {
      if (!Array.isArray(rows)) return;
      const list = byPlace.get(t) ?? [];
      for (const row of rows as Row[]) {
        list.push(row);
        for (const child of t.children ?? []) collect(child, row[child.key]);
      }
      byPlace.set(t, list);
    };
    for (const s of PRINT_SECTIONS) for (const d of docs) collect(s, (d.sections as Record<string, unknown>)[s.key]);
    const later: { table: string; columns: string[]; rows: Row[] }[] = [];
    for (const t of PRINT_SECTIONS.flatMap(tablesOf)) {
      let rows = byPlace.get(t) ?? [];
      if (t.writeAfter?.length && rows.length) {
        later.push({ table: t.table, columns: t.writeAfter, rows });
        rows = rows.map((r) => Object.fromEntries(Object.entries(r).filter(([k]) => !t.writeAfter!.includes(k))));
      }
      for (let i = 0; i < rows.length; i += ROWS_PER_WRITE) await this.insert(t.table, rows.slice(i, i + ROWS_PER_WRITE));
    }
    // Columns that refer to rows written after their own (a spot's baseline reading), once those are in.
    for (const { table, columns, rows } of later) {
      this.mapUsers(table, rows);
      for (let i = 0; i < rows.length; i += ROWS_PER_WRITE) {
        await this.c.query(
          `UPDATE ${table} t SET ${columns.map((c) => `"${c}" = r."${c}"`).join(', ')} FROM jsonb_populate_recordset(NULL::${table}, $1::jsonb) r WHERE t.id = r.id`,
          [JSON.stringify(rows.slice(i, i + ROWS_PER_WRITE).map((r) => Object.fromEntries([['id', r.id], ...columns.map((c) => [c, r[c] ?? null])])))],
        );
      }
    }
  }
}
