import { parse } from 'csv-parse/sync';
import { QueryTypes, type Transaction } from 'sequelize';
import { checkAccession } from '@toneledger/common/domain/accession';
import { IMPORT_COLUMNS, printInputSchema } from '@toneledger/common/schemas/catalogue';
import { LIGHT_RESPONSIVITY, PROCESS, STATUS, SUPPORT, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { db } from '../db';
import { EnclosureType, ImportJobModel, Location, Maker, Paper, Print } from '../models';
import { conflict, notFound, validationFailed } from '../errors';
import { getCatalogueSettings } from './settings.service';
import { recordAudit, type AuditActor } from './audit.service';
import { accessionSortKey, deriveDate, warningsOf } from './print-derive';
import { paperLabel, presentImport } from '../presenters/catalogue.presenter';

/**
 * CSV import of prints, in two steps: validate every row and show the errors (nothing written),
 * then commit all rows in one transaction. Both run in the background with progress on the job
 * row, which the client polls. A restart marks unfinished jobs as failed; a commit interrupted
 * half-way has written nothing, because it is one transaction.
 */

export const MAX_IMPORT_BYTES = 20 * 1024 * 1024;
export const MAX_IMPORT_ROWS = 100_000;
const MAX_REPORTED_ERRORS = 1000;
const PROGRESS_EVERY = 500;

type Row = Record<string, string>;
interface Issue { row: number; column: string; value: string | null; message: string }

/** Accepts a controlled value by its code or its label, case-insensitively. */
function vocab<T extends string>(list: { codes: readonly T[]; labels: Record<T, string> }, raw: string): T | null {
  const v = raw.trim().toLowerCase();
  if (!v) return null;
  for (const c of list.codes) if (c === v || list.labels[c].toLowerCase() === v) return c;
  return undefined as never;
}

interface Lookups {
  makers: Map<string, string>;
  papers: Map<string, string>;
  locations: Map<string, string>;
  enclosures: Map<string, { id: string; name: string; alkalineBuffered: boolean | null; patResult: 'passed' | 'failed' | 'not_tested' }>;
  accessions: Set<string>;
  pattern: string;
}

async function lookups(t?: Transaction): Promise<Lookups> {
  const [makers, papers, locations, enclosures, accessions, settings] = await Promise.all([
    Maker.findAll({ attributes: ['id', 'name'], transaction: t }),
    Paper.findAll({ attributes: ['id', 'manufacturer', 'product', 'surface'], transaction: t }),
    Location.findAll({ attributes: ['id', 'pathLabel', 'code'], transaction: t }),
    EnclosureType.findAll({ transaction: t }),
    db().query<{ a: string }>('SELECT lower(accession_number) AS a FROM prints', { type: QueryTypes.SELECT, transaction: t }),
    getCatalogueSettings(),
  ]);
  const loc = new Map<string, string>();
  for (const l of locations) {
    loc.set(l.pathLabel.toLowerCase(), l.id);
    loc.set(l.pathLabel.toLowerCase().replace(/\s*›\s*/g, ' > '), l.id);
    if (l.code) loc.set(l.code.toLowerCase(), l.id);
  }
  return {
    makers: new Map(makers.map((m) => [m.name.toLowerCase(), m.id])),
    papers: new Map(papers.map((p) => [paperLabel(p).toLowerCase(), p.id])),
    locations: loc,
    enclosures: new Map(enclosures.map((e) => [e.name.toLowerCase(), { id: e.id, name: e.name, alkalineBuffered: e.alkalineBuffered, patResult: e.patResult }])),
    accessions: new Set(accessions.map((r) => r.a)),
    pattern: settings.accessionPattern,
  };
}

function readCsv(source: string): { header: string[]; rows: Row[] } {
  const records = parse(source, { bom: true, skip_empty_lines: true, relax_column_count: false, trim: false }) as string[][];
  if (!records.length) throw validationFailed([{ path: 'file', message: 'The file is empty', code: 'empty' }]);
  const header = records[0].map((h) => h.trim().toLowerCase());
  const unknown = header.filter((h) => !(IMPORT_COLUMNS as readonly string[]).includes(h));
  const issues = [];
  if (unknown.length) issues.push({ path: 'file', message: `Unknown columns: ${unknown.join(', ')}. Known: ${IMPORT_COLUMNS.join(', ')}`, code: 'columns' });
  for (const need of ['accession_number', 'title', 'process']) if (!header.includes(need)) issues.push({ path: 'file', message: `The column ${need} is required`, code: 'columns' });
  if (records.length - 1 > MAX_IMPORT_ROWS) issues.push({ path: 'file', message: `At most ${MAX_IMPORT_ROWS} rows per file`, code: 'too_many' });
  if (issues.length) throw validationFailed(issues, 'The file cannot be imported.');
  return { header, rows: records.slice(1).map((r) => Object.fromEntries(header.map((h, i) => [h, r[i] ?? '']))) };
}

export interface PreparedRow {
  values: Record<string, unknown>;
  makerName: string | null;
  tonerClasses: string[];
  locationId: string | null;
}

/** Checks one row; returns the values to insert or the row's issues. Row numbers count the header as row 1. */
export function prepareRow(row: Row, rowNumber: number, l: Lookups, seen: Map<string, number>): { ok: PreparedRow | null; issues: Issue[] } {
  const issues: Issue[] = [];
  const add = (column: string, message: string) => issues.push({ row: rowNumber, column, value: row[column] ?? null, message });
  const s = (k: string) => (row[k] ?? '').trim();

  const accession = s('accession_number');
  if (accession) {
    const check = checkAccession(l.pattern, accession);
    if (!check.ok) add('accession_number', check.message);
    const key = accession.toLowerCase();
    if (l.accessions.has(key)) add('accession_number', 'A print with this accession number is in the catalogue already');
    else if (seen.has(key)) add('accession_number', `Repeats the accession number of row ${seen.get(key)}`);
    else seen.set(key, rowNumber);
  }
  const pick = <T extends string>(col: string, list: { codes: readonly T[]; labels: Record<T, string> }) => {
    const raw = s(col);
    const v = raw ? vocab(list, raw) : null;
    if (raw && v === undefined) add(col, `Not one of: ${list.codes.join(', ')}`);
    return v ?? null;
  };
  const process = pick('process', PROCESS);
  const support = pick('support', SUPPORT);
  const status = pick('status', STATUS);
  const light = pick('light_responsivity', LIGHT_RESPONSIVITY);
  const toners: string[] = [];
  for (const part of s('toner_classes').split(';').map((x) => x.trim()).filter(Boolean)) {
    const v = vocab(TONER_CLASS, part);
    if (v === undefined) add('toner_classes', `"${part}" is not one of: ${TONER_CLASS.codes.join(', ')}`);
    else if (v && !toners.includes(v)) toners.push(v);
  }
  let paperId: string | null = null;
  if (s('paper')) {
    paperId = l.papers.get(s('paper').toLowerCase()) ?? null;
    if (!paperId) add('paper', 'No paper with this name: add it under Papers first (manufacturer product, surface)');
  }
  let locationId: string | null = null;
  if (s('location')) {
    locationId = l.locations.get(s('location').toLowerCase()) ?? null;
    if (!locationId) add('location', 'No place with this path or code: add it under Locations first');
  }
  let enclosure: Lookups['enclosures'] extends Map<string, infer V> ? V | null : never = null;
  if (s('enclosure')) {
    enclosure = l.enclosures.get(s('enclosure').toLowerCase()) ?? null;
    if (!enclosure) add('enclosure', 'No enclosure type with this name');
  }
  let date = null;
  try {
    date = deriveDate(s('date_made') || null);
  } catch (err) {
    add('date_made', ((err as { details?: { message: string }[] }).details?.[0]?.message) ?? 'Not an EDTF date');
  }
  const candidate = {
    accessionNumber: accession, title: s('title'), process: process ?? undefined, support, status: status ?? undefined,
    lightResponsivity: light, inscriptions: s('inscriptions'), provenance: s('provenance'), creditLine: s('credit_line'), staffNotes: s('staff_notes'),
    imageWidthMm: s('image_width_mm'), imageHeightMm: s('image_height_mm'), sheetWidthMm: s('sheet_width_mm'),
    sheetHeightMm: s('sheet_height_mm'), mountWidthMm: s('mount_width_mm'), mountHeightMm: s('mount_height_mm'),
  };
  const parsed = printInputSchema.safeParse(candidate);
  const columnOf: Record<string, string> = {
    accessionNumber: 'accession_number', title: 'title', process: 'process', imageWidthMm: 'image_width_mm', imageHeightMm: 'image_height_mm',
    sheetWidthMm: 'sheet_width_mm', sheetHeightMm: 'sheet_height_mm', mountWidthMm: 'mount_width_mm', mountHeightMm: 'mount_height_mm',
    creditLine: 'credit_line', staffNotes: 'staff_notes',
  };
  if (!parsed.success) {
    for (const i of parsed.error.issues) {
      const col = columnOf[String(i.path[0])] ?? String(i.path[0]);
      if (!issues.some((x) => x.column === col)) add(col, i.message);
    }
  }
  if (issues.length || !parsed.success) return { ok: null, issues };
  const v = parsed.data;
  const steps = toners.map((tc) => ({ type: 'toning', tonerClass: tc, agent: null, alkaline: null }));
  return {
    ok: {
      makerName: s('maker') || null,
      tonerClasses: toners,
      locationId,
      values: {
        ...v, accessionSort: accessionSortKey(v.accessionNumber), ...date, paperId, paperLabel: paperId ? s('paper') : null,
        enclosureId: enclosure?.id ?? null, tonerClasses: toners,
        warningCodes: warningsOf(v.process, steps, enclosure).map((w) => w.code), locationId,
      },
    },
    issues: [],
  };
}

async function progress(id: string, values: Record<string, unknown>) {
  // Outside any transaction, so a poller sees it while a commit is still open.
  await ImportJobModel.update(values, { where: { id } });
}

async function validateJob(id: string) {
  const job = await ImportJobModel.findByPk(id);
  if (!job) return;
  try {
    const { rows } = readCsv(job.source);
    await progress(id, { totalRows: rows.length });
    const l = await lookups();
    const seen = new Map<string, number>();
    const errors: Issue[] = [];
    let errorCount = 0;
    const newMakers = new Set<string>();
    for (let i = 0; i < rows.length; i++) {
      const r = prepareRow(rows[i], i + 2, l, seen);
      errorCount += r.issues.length;
      for (const issue of r.issues) if (errors.length < MAX_REPORTED_ERRORS) errors.push(issue);
      if (r.ok?.makerName && !l.makers.has(r.ok.makerName.toLowerCase())) newMakers.add(r.ok.makerName);
      if ((i + 1) % PROGRESS_EVERY === 0) {
        await progress(id, { processedRows: i + 1 });
        await new Promise((resolve) => setImmediate(resolve));
      }
    }
    await progress(id, {
      processedRows: rows.length, errors, errorCount, newMakers: [...newMakers].sort(), status: errorCount ? 'invalid' : 'ready',
      message: errorCount ? `${errorCount} problem(s) in the file. Nothing was written.` : `${rows.length} prints are ready to import.`,
      finishedAt: errorCount ? new Date() : null,
    });
  } catch (err) {
    const details = (err as { details?: { message: string }[] }).details;
    await progress(id, { status: 'invalid', message: details?.map((d) => d.message).join(' ') ?? 'The file could not be read as CSV.', finishedAt: new Date() });
  }
}

async function commitJob(id: string, actor: AuditActor, requestId: string | null) {
  const job = await ImportJobModel.findByPk(id);
  if (!job) return;
  try {
    const created = await db().transaction(async (t) => {
      // One import at a time, and no two commits of the same file.
      await db().query('SELECT pg_advisory_xact_lock(727003)', { transaction: t });
      const { rows } = readCsv(job.source);
      const l = await lookups(t);
      const seen = new Map<string, number>();
      const prepared: PreparedRow[] = [];
      for (let i = 0; i < rows.length; i++) {
        const r = prepareRow(rows[i], i + 2, l, seen);
        if (!r.ok) throw new Error(`Row ${i + 2} no longer passes its checks (${r.issues[0]?.message}). Validate the file again.`);
        prepared.push(r.ok);
      }
      for (const name of new Set(prepared.map((p) => p.makerName).filter(Boolean) as string[])) {
        if (!l.makers.has(name.toLowerCase())) {
          const m = await Maker.create({ name, lifeDates: null, notes: null }, { transaction: t });
          l.makers.set(name.toLowerCase(), m.id);
          await recordAudit({ actor, action: 'maker.created', entityType: 'maker', entityId: m.id, after: { name, via: `import ${id}` }, requestId }, t);
        }
      }
      const BATCH = 1000;
      for (let i = 0; i < prepared.length; i += BATCH) {
        const batch = prepared.slice(i, i + BATCH);
        const inserted = await Print.bulkCreate(
          batch.map((p) => ({ ...(p.values as Record<string, unknown>), makerId: p.makerName ? l.makers.get(p.makerName.toLowerCase()) : null, makerName: p.makerName }) as never),
          { transaction: t, returning: true },
        );
        const steps = inserted.flatMap((row, k) => batch[k].tonerClasses.map((tc, n) => ({ print_id: row.id, position: n + 1, type: 'toning', toner_class: tc, notes: 'Toner class from CSV import' })));
        if (steps.length) await db().getQueryInterface().bulkInsert('process_steps', steps, { transaction: t });
        const moves = inserted.flatMap((row, k) => (batch[k].locationId ? [{ print_id: row.id, to_location_id: batch[k].locationId, moved_by: actor.id, moved_by_name: actor.name, reason: `Placed by CSV import ${job.fileName}` }] : []));
        if (moves.length) await db().getQueryInterface().bulkInsert('movements', moves, { transaction: t });
        await db().getQueryInterface().bulkInsert(
          'audit_events',
          inserted.map((row, k) => ({
            actor_id: actor.id, actor_name: actor.name, action: 'print.imported', entity_type: 'print', entity_id: row.id,
            after: JSON.stringify({ ...batch[k].values, maker: batch[k].makerName, importId: id }), request_id: requestId,
          })),
          { transaction: t },
        );
        await progress(id, { processedRows: Math.min(i + BATCH, prepared.length) });
      }
      return prepared.length;
    });
    await progress(id, { status: 'committed', createdPrints: created, message: `${created} prints imported.`, finishedAt: new Date() });
  } catch (err) {
    await progress(id, { status: 'failed', message: `Nothing was imported: ${(err as Error).message}`, finishedAt: new Date() });
  }
}

/** Jobs running in this process, so tests and shutdown can wait for them. */
const running = new Set<Promise<void>>();
function background(work: Promise<void>) {
  running.add(work);
  void work.finally(() => running.delete(work));
}
export async function settleImports(): Promise<void> {
  await Promise.all([...running]);
}

export async function startImport(fileName: string, source: string, actor: AuditActor) {
  const job = await ImportJobModel.create({ fileName, source, status: 'validating', createdBy: actor.id, message: null, finishedAt: null });
  background(validateJob(job.id));
  return presentImport(job);
}

async function findImport(id: string) {
  const job = await ImportJobModel.findByPk(id, { attributes: { exclude: ['source'] } });
  if (!job) throw notFound('The import');
  return job;
}

export async function getImport(id: string) {
  return presentImport(await findImport(id));
}

export async function commitImport(id: string, actor: AuditActor, requestId: string | null) {
  const [n] = await ImportJobModel.update({ status: 'committing', processedRows: 0 }, { where: { id, status: 'ready' } });
  if (n === 0) {
    const job = await getImport(id);
    throw conflict(`This import is ${job.status}; only a validated file that is ready can be imported.`);
  }
  background(commitJob(id, actor, requestId));
  return getImport(id);
}

/** At start: jobs left half-way by a stopped server are marked failed (a commit wrote nothing). */
export async function failInterruptedImports(): Promise<number> {
  const [n] = await ImportJobModel.update(
    { status: 'failed', message: 'Interrupted by a server restart. Nothing was imported; upload the file again.', finishedAt: new Date() },
    { where: { status: ['validating', 'committing'] } },
  );
  return n;
}
