import { QueryTypes, type Transaction } from 'sequelize';
import type { Acquisition, AcquisitionInput, EntryInput, ObjectEntry } from '@toneledger/common/schemas/acquisitions';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import { db } from '../db';
import { notFound, validationFailed } from '../errors';
import { recordAudit } from './audit.service';
import { assertPrintsEditable } from './print-lock';
import type { Actor } from './print.service';
import { changedFields, staleEdit } from './versioning';

/**
 * Object entry (objects come in, a receipt is given) and acquisition with accessioning (title
 * passes; the catalogued prints are linked to it). Entry numbers are E<year>.<n>, numbered in order
 * within the year of entry (three digits at least: E2025.004), given by the server under an
 * advisory lock so two entries saved at once never share one.
 */
const ENTRY = 'object_entry';
const ACQ = 'acquisition';
const NUMBER_LOCK = 727_013;
const iso = (d: Date) => new Date(d).toISOString();
const today = () => new Date().toISOString().slice(0, 10);

export function entryNumber(year: number, n: number): string {
  return `E${year}.${String(n).padStart(3, '0')}`;
}

type EntryRow = {
  id: string; entry_number: string; entered_on: string; depositor: string; depositor_contact: string | null; reason: ObjectEntry['reason'];
  object_count: number; objects_description: string; return_by: string | null; notes: string | null; received_by_name: string;
  version: number; created_at: Date; updated_at: Date;
};
const ENTRY_SELECT = `SELECT id, entry_number, to_char(entered_on, 'YYYY-MM-DD') AS entered_on, depositor, depositor_contact, reason, object_count,
  objects_description, to_char(return_by, 'YYYY-MM-DD') AS return_by, notes, received_by_name, version, created_at, updated_at FROM object_entries`;

async function presentEntry(r: EntryRow, t?: Transaction): Promise<ObjectEntry> {
  const acqs = await db().query<{ id: string; acquired_on: string; method: ObjectEntry['acquisitions'][number]['method']; prints: number }>(
    `SELECT a.id, to_char(a.acquired_on, 'YYYY-MM-DD') AS acquired_on, a.method, (SELECT count(*)::int FROM acquisition_prints ap WHERE ap.acquisition_id = a.id) AS prints
       FROM acquisitions a WHERE a.entry_id = $1 ORDER BY a.acquired_on`,
    { bind: [r.id], type: QueryTypes.SELECT, transaction: t },
  );
  return {
    id: r.id, entryNumber: r.entry_number, enteredOn: r.entered_on, depositor: r.depositor, depositorContact: r.depositor_contact, reason: r.reason,
    objectCount: r.object_count, objectsDescription: r.objects_description, returnBy: r.return_by, notes: r.notes, receivedBy: r.received_by_name,
    acquisitions: acqs.map((a) => ({ id: a.id, acquiredOn: a.acquired_on, method: a.method, prints: a.prints })),
    version: r.version, createdAt: iso(r.created_at), updatedAt: iso(r.updated_at),
  };
}

async function entryRow(id: string, t?: Transaction, lock = false): Promise<EntryRow> {
  const [r] = await db().query<EntryRow>(`${ENTRY_SELECT} WHERE id = $1${lock ? ' FOR UPDATE' : ''}`, { bind: [id], type: QueryTypes.SELECT, transaction: t });
  if (!r) throw notFound('The object entry');
  return r;
}

function entryIssues(v: { enteredOn?: string; returnBy?: string | null }): FieldIssue[] {
  const issues: FieldIssue[] = [];
  if (v.enteredOn && v.enteredOn > today()) issues.push({ path: 'enteredOn', message: 'Cannot be in the future', code: 'future' });
  if (v.enteredOn && v.returnBy && v.returnBy < v.enteredOn) issues.push({ path: 'returnBy', message: 'Cannot be before the date of entry', code: 'order' });
  return issues;
}

export async function listEntries(q?: string): Promise<ObjectEntry[]> {
  const rows = await db().query<EntryRow>(
    `${ENTRY_SELECT} ${q ? "WHERE entry_number ILIKE '%' || $1 || '%' OR depositor ILIKE '%' || $1 || '%'" : ''} ORDER BY entered_on DESC, entry_number DESC LIMIT 500`,
    { bind: q ? [q.replace(/[%_\\]/g, (c) => `\\${c}`)] : [], type: QueryTypes.SELECT },
  );
  return Promise.all(rows.map((r) => presentEntry(r)));
}

export async function getEntry(id: string): Promise<ObjectEntry> {
  return presentEntry(await entryRow(id));
}

export async function createEntry(input: EntryInput, actor: Actor, requestId: string | null): Promise<ObjectEntry> {
  const issues = entryIssues(input);
  if (issues.length) throw validationFailed(issues);
  return db().transaction(async (t) => {
    await db().query('SELECT pg_advisory_xact_lock($1)', { bind: [NUMBER_LOCK], transaction: t });
    const year = Number(input.enteredOn.slice(0, 4));
    const [{ n }] = await db().query<{ n: number }>(
      `SELECT coalesce(max(substring(entry_number from '\\.(\\d+)$')::int), 0) + 1 AS n FROM object_entries WHERE entry_number LIKE $1`,
      { bind: [`E${year}.%`], type: QueryTypes.SELECT, transaction: t },
    );
    const [{ id }] = await db().query<{ id: string }>(
      `INSERT INTO object_entries (entry_number, entered_on, depositor, depositor_contact, reason, object_count, objects_description, return_by, notes, received_by, received_by_name)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11) RETURNING id`,
      {
        bind: [entryNumber(year, n), input.enteredOn, input.depositor, input.depositorContact ?? null, input.reason, input.objectCount, input.objectsDescription,
          input.returnBy ?? null, input.notes ?? null, actor.id, actor.name],
        type: QueryTypes.SELECT, transaction: t,
      },
    );
    const after = await presentEntry(await entryRow(id, t), t);
    await recordAudit({ actor, action: 'object_entry.created', entityType: ENTRY, entityId: id, after: entrySnapshot(after), requestId }, t);
    return after;
  });
}

function entrySnapshot(e: ObjectEntry) {
  const { acquisitions: _a, version: _v, createdAt: _c, updatedAt: _u, ...rest } = e;
  return rest as Record<string, unknown>;
}

const ENTRY_COLUMNS: Record<string, string> = {
  enteredOn: 'entered_on', depositor: 'depositor', depositorContact: 'depositor_contact', reason: 'reason', objectCount: 'object_count',
  objectsDescription: 'objects_description', returnBy: 'return_by', notes: 'notes',
};

export async function updateEntry(id: string, u: Partial<EntryInput> & { version: number }, actor: Actor, requestId: string | null): Promise<ObjectEntry> {
  return db().transaction(async (t) => {
    const row = await entryRow(id, t, true);
    const before = await presentEntry(row, t);
    if (row.version !== u.version) throw await staleEdit(ENTRY, id, before, t);
    if (u.enteredOn && u.enteredOn.slice(0, 4) !== row.entered_on.slice(0, 4)) {
      throw validationFailed([{ path: 'enteredOn', message: `The entry number ${row.entry_number} is of ${row.entered_on.slice(0, 4)}; keep the date in that year`, code: 'year' }]);
    }
    const issues = entryIssues({ enteredOn: u.enteredOn ?? row.entered_on, returnBy: u.returnBy !== undefined ? u.returnBy : row.return_by });
    if (issues.length) throw validationFailed(issues);
    const { sets, bind } = setsOf(u, ENTRY_COLUMNS, id);
    await db().query(`UPDATE object_entries SET ${[...sets, 'version = version + 1', 'updated_at = now()'].join(', ')} WHERE id = $1`, { bind, transaction: t });
    const after = await presentEntry(await entryRow(id, t), t);
    const [b, a] = [entrySnapshot(before), entrySnapshot(after)];
    if (changedFields(b, a).length) await recordAudit({ actor, action: 'object_entry.updated', entityType: ENTRY, entityId: id, before: b, after: a, requestId }, t);
    return after;
  });
}

function setsOf(u: Record<string, unknown>, columns: Record<string, string>, id: string) {
  const sets: string[] = [];
  const bind: unknown[] = [id];
  for (const [k, col] of Object.entries(columns)) {
    if (u[k] === undefined) continue;
    bind.push(u[k] ?? null);
    sets.push(`${col} = $${bind.length}`);
  }
  return { sets, bind };
}

// ── Acquisitions ──

type AcqRow = {
  id: string; entry_id: string | null; entry_number: string | null; source: string; method: Acquisition['method']; approved_on: string | null; acquired_on: string;
  title_document: string | null; funds: string | null; notes: string | null; created_by_name: string; version: number; created_at: Date; updated_at: Date;
};
const ACQ_SELECT = `SELECT a.id, a.entry_id, e.entry_number, a.source, a.method, to_char(a.approved_on, 'YYYY-MM-DD') AS approved_on,
  to_char(a.acquired_on, 'YYYY-MM-DD') AS acquired_on, a.title_document, a.funds, a.notes, a.created_by_name, a.version, a.created_at, a.updated_at
  FROM acquisitions a LEFT JOIN object_entries e ON e.id = a.entry_id`;

async function presentAcquisition(r: AcqRow, t?: Transaction): Promise<Acquisition> {
  const prints = await db().query<{ id: string; accession_number: string; title: string; status: string }>(
    `SELECT p.id, p.accession_number, p.title, p.status FROM acquisition_prints ap JOIN prints p ON p.id = ap.print_id WHERE ap.acquisition_id = $1 ORDER BY p.accession_sort`,
    { bind: [r.id], type: QueryTypes.SELECT, transaction: t },
  );
  return {
    id: r.id, entryId: r.entry_id, entryNumber: r.entry_number, source: r.source, method: r.method, approvedOn: r.approved_on, acquiredOn: r.acquired_on,
    titleDocument: r.title_document, funds: r.funds, notes: r.notes,
    prints: prints.map((p) => ({ id: p.id, accessionNumber: p.accession_number, title: p.title, status: p.status })),
    createdBy: r.created_by_name, version: r.version, createdAt: iso(r.created_at), updatedAt: iso(r.updated_at),
  };
}

async function acqRow(id: string, t?: Transaction, lock = false): Promise<AcqRow> {
  const [r] = await db().query<AcqRow>(`${ACQ_SELECT} WHERE a.id = $1${lock ? ' FOR UPDATE OF a' : ''}`, { bind: [id], type: QueryTypes.SELECT, transaction: t });
  if (!r) throw notFound('The acquisition');
  return r;
}

function acqSnapshot(a: Acquisition) {
  const { version: _v, createdAt: _c, updatedAt: _u, prints, ...rest } = a;
  return { ...rest, prints: prints.map((p) => p.accessionNumber) } as Record<string, unknown>;
}

async function acqIssues(v: { entryId?: string | null; approvedOn?: string | null; acquiredOn?: string }, t: Transaction): Promise<FieldIssue[]> {
  const issues: FieldIssue[] = [];
  if (v.acquiredOn && v.acquiredOn > today()) issues.push({ path: 'acquiredOn', message: 'Cannot be in the future', code: 'future' });
  if (v.approvedOn && v.acquiredOn && v.approvedOn > v.acquiredOn) issues.push({ path: 'approvedOn', message: 'The approval comes before title passes', code: 'order' });
  if (v.entryId) {
    const [e] = await db().query<{ entered_on: string }>(`SELECT to_char(entered_on, 'YYYY-MM-DD') AS entered_on FROM object_entries WHERE id = $1`, { bind: [v.entryId], type: QueryTypes.SELECT, transaction: t });
    if (!e) issues.push({ path: 'entryId', message: 'No such object entry', code: 'not_found' });
    else if (v.acquiredOn && v.acquiredOn < e.entered_on) issues.push({ path: 'acquiredOn', message: `Cannot be before the object entry (${e.entered_on})`, code: 'order' });
  }
  return issues;
}

export async function listAcquisitions(): Promise<Acquisition[]> {
  const rows = await db().query<AcqRow>(`${ACQ_SELECT} ORDER BY a.acquired_on DESC, a.created_at DESC LIMIT 500`, { type: QueryTypes.SELECT });
  return Promise.all(rows.map((r) => presentAcquisition(r)));
}

export async function getAcquisition(id: string): Promise<Acquisition> {
  return presentAcquisition(await acqRow(id));
}

export async function acquisitionOfPrint(printId: string): Promise<Acquisition | null> {
  const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM prints WHERE id = $1', { bind: [printId], type: QueryTypes.SELECT });
  if (!n) throw notFound('The print');
  const [link] = await db().query<{ acquisition_id: string }>('SELECT acquisition_id FROM acquisition_prints WHERE print_id = $1', { bind: [printId], type: QueryTypes.SELECT });
  return link ? getAcquisition(link.acquisition_id) : null;
}

export async function createAcquisition(input: AcquisitionInput, actor: Actor, requestId: string | null): Promise<Acquisition> {
  return db().transaction(async (t) => {
    const issues = await acqIssues(input, t);
    if (issues.length) throw validationFailed(issues);
    const [{ id }] = await db().query<{ id: string }>(
      `INSERT INTO acquisitions (entry_id, source, method, approved_on, acquired_on, title_document, funds, notes, created_by, created_by_name)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10) RETURNING id`,
      {
        bind: [input.entryId ?? null, input.source, input.method, input.approvedOn ?? null, input.acquiredOn, input.titleDocument ?? null, input.funds ?? null, input.notes ?? null, actor.id, actor.name],
        type: QueryTypes.SELECT, transaction: t,
      },
    );
    const after = await presentAcquisition(await acqRow(id, t), t);
    await recordAudit({ actor, action: 'acquisition.created', entityType: ACQ, entityId: id, after: acqSnapshot(after), requestId }, t);
    return after;
  });
}

const ACQ_COLUMNS: Record<string, string> = {
  entryId: 'entry_id', source: 'source', method: 'method', approvedOn: 'approved_on', acquiredOn: 'acquired_on', titleDocument: 'title_document', funds: 'funds', notes: 'notes',
};

export async function updateAcquisition(id: string, u: Partial<AcquisitionInput> & { version: number }, actor: Actor, requestId: string | null): Promise<Acquisition> {
  return db().transaction(async (t) => {
    const row = await acqRow(id, t, true);
    const before = await presentAcquisition(row, t);
    if (row.version !== u.version) throw await staleEdit(ACQ, id, before, t);
    const issues = await acqIssues({
      entryId: u.entryId !== undefined ? u.entryId : row.entry_id, approvedOn: u.approvedOn !== undefined ? u.approvedOn : row.approved_on, acquiredOn: u.acquiredOn ?? row.acquired_on,
    }, t);
    if (issues.length) throw validationFailed(issues);
    const { sets, bind } = setsOf(u, ACQ_COLUMNS, id);
    await db().query(`UPDATE acquisitions SET ${[...sets, 'version = version + 1', 'updated_at = now()'].join(', ')} WHERE id = $1`, { bind, transaction: t });
    const after = await presentAcquisition(await acqRow(id, t), t);
    const [b, a] = [acqSnapshot(before), acqSnapshot(after)];
    if (changedFields(b, a).length) await recordAudit({ actor, action: 'acquisition.updated', entityType: ACQ, entityId: id, before: b, after: a, requestId }, t);
    return after;
  });
}

/** Accessioning: links prints to the acquisition (each print to one acquisition only), or takes links off. */
export async function setAcquisitionPrints(id: string, body: { add: string[]; remove: string[]; version: number }, actor: Actor, requestId: string | null): Promise<Acquisition> {
  return db().transaction(async (t) => {
    const row = await acqRow(id, t, true);
    const before = await presentAcquisition(row, t);
    if (row.version !== body.version) throw await staleEdit(ACQ, id, before, t);
    const add = [...new Set(body.add)];
    const remove = [...new Set(body.remove)];
    const found = new Set((await db().query<{ id: string }>('SELECT id FROM prints WHERE id = ANY($1::uuid[])', { bind: [add], type: QueryTypes.SELECT, transaction: t })).map((r) => r.id));
    const issues: FieldIssue[] = [];
    body.add.forEach((p, i) => { if (!found.has(p)) issues.push({ path: `add.${i}`, message: 'No such print', code: 'not_found' }); });
    const elsewhere = await db().query<{ print_id: string; accession_number: string }>(
      `SELECT ap.print_id, p.accession_number FROM acquisition_prints ap JOIN prints p ON p.id = ap.print_id WHERE ap.print_id = ANY($1::uuid[]) AND ap.acquisition_id <> $2`,
      { bind: [add, id], type: QueryTypes.SELECT, transaction: t },
    );
    for (const e of elsewhere) issues.push({ path: `add.${body.add.indexOf(e.print_id)}`, message: `${e.accession_number} is already accessioned by another acquisition`, code: 'taken' });
    if (issues.length) throw validationFailed(issues);
    await assertPrintsEditable([...add, ...remove], t);
    if (remove.length) await db().query('DELETE FROM acquisition_prints WHERE acquisition_id = $1 AND print_id = ANY($2::uuid[])', { bind: [id, remove], transaction: t });
    if (add.length) await db().query('INSERT INTO acquisition_prints (acquisition_id, print_id) SELECT $1, unnest($2::uuid[]) ON CONFLICT DO NOTHING', { bind: [id, add], transaction: t });
    await db().query('UPDATE acquisitions SET version = version + 1, updated_at = now() WHERE id = $1', { bind: [id], transaction: t });
    const after = await presentAcquisition(await acqRow(id, t), t);
    if (changedFields(acqSnapshot(before), acqSnapshot(after)).length) {
      await recordAudit({ actor, action: 'acquisition.prints_set', entityType: ACQ, entityId: id, before: { prints: before.prints.map((p) => p.accessionNumber) }, after: { prints: after.prints.map((p) => p.accessionNumber) }, requestId }, t);
      for (const p of after.prints.filter((p) => !before.prints.some((b) => b.id === p.id))) {
        await recordAudit({ actor, action: 'print.accessioned', entityType: 'print', entityId: p.id, after: { acquisitionId: id, source: row.source, method: row.method, acquiredOn: row.acquired_on }, requestId }, t);
      }
    }
    return after;
  });
}
