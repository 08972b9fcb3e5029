import { QueryTypes, type Transaction } from 'sequelize';
import type { Deaccession, DeaccessionInput } from '@toneledger/common/schemas/deaccessions';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import { db } from '../db';
import { conflict, notFound, validationFailed } from '../errors';
import { markScheduleStale } from './schedule-stale';
import { recordAudit } from './audit.service';
import { assertPrintEditable } from './print-lock';
import type { Actor } from './print.service';
import { changedFields, rethrowUnique, staleEdit } from './versioning';

/**
 * Deaccession: proposed (reason, method) → approved (authority, date) → completed (date, final
 * record), or withdrawn. Completing sets the print's status to deaccessioned and its
 * `deaccessioned_on`: from then on the deaccession guard (`print-lock.ts`) refuses every edit of the
 * print and its records. A completed or withdrawn record is final (a trigger refuses changes).
 * A print out on loan or with a display period still to come cannot be completed.
 */
const ENTITY = 'deaccession';
const iso = (d: Date) => new Date(d).toISOString();
const today = () => new Date().toISOString().slice(0, 10);

type Row = {
  id: string; print_id: string; status: Deaccession['status']; proposed_on: string; proposed_by_name: string; reason: string; method: Deaccession['method'];
  recipient: string | null; authority: string | null; approved_on: string | null; completed_on: string | null; completed_by_name: string | null;
  final_note: string | null; withdrawn_why: string | null; version: number; created_at: Date; updated_at: Date; accession_number: string; title: string;
};
const SELECT = `SELECT d.id, d.print_id, d.status, to_char(d.proposed_on, 'YYYY-MM-DD') AS proposed_on, d.proposed_by_name, d.reason, d.method, d.recipient,
  d.authority, to_char(d.approved_on, 'YYYY-MM-DD') AS approved_on, to_char(d.completed_on, 'YYYY-MM-DD') AS completed_on, d.completed_by_name,
  d.final_note, d.withdrawn_why, d.version, d.created_at, d.updated_at, p.accession_number, p.title
  FROM deaccessions d JOIN prints p ON p.id = d.print_id`;

function present(r: Row): Deaccession {
  return {
    id: r.id, printId: r.print_id, accessionNumber: r.accession_number, printTitle: r.title, status: r.status, proposedOn: r.proposed_on, proposedBy: r.proposed_by_name,
    reason: r.reason, method: r.method, recipient: r.recipient, authority: r.authority, approvedOn: r.approved_on, completedOn: r.completed_on,
    completedBy: r.completed_by_name, finalNote: r.final_note, withdrawnWhy: r.withdrawn_why,
    version: r.version, createdAt: iso(r.created_at), updatedAt: iso(r.updated_at),
  };
}
function snapshot(d: Deaccession) {
  const { version: _v, createdAt: _c, updatedAt: _u, accessionNumber: _a, printTitle: _t, ...rest } = d;
  return rest as Record<string, unknown>;
}

async function loadRow(id: string, t?: Transaction, lock = false): Promise<Row> {
  const [r] = await db().query<Row>(`${SELECT} WHERE d.id = $1${lock ? ' FOR UPDATE OF d' : ''}`, { bind: [id], type: QueryTypes.SELECT, transaction: t });
  if (!r) throw notFound('The deaccession');
  return r;
}

export async function printDeaccessions(printId: string): Promise<Deaccession[]> {
  const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM prints WHERE id = $1', { bind: [printId], type: QueryTypes.SELECT });
  if (!n) throw notFound('The print');
  return (await db().query<Row>(`${SELECT} WHERE d.print_id = $1 ORDER BY d.created_at DESC`, { bind: [printId], type: QueryTypes.SELECT })).map(present);
}

function methodIssues(method: string, recipient: string | null | undefined): FieldIssue[] {
  if (method !== 'destruction' && !recipient) return [{ path: 'recipient', message: 'Name who receives the print', code: 'required' }];
  return [];
}

export async function proposeDeaccession(printId: string, input: DeaccessionInput, actor: Actor, requestId: string | null): Promise<Deaccession> {
  return db().transaction(async (t) => {
    await assertPrintEditable(printId, t);
    const issues = methodIssues(input.method, input.recipient);
    if (input.proposedOn > today()) issues.push({ path: 'proposedOn', message: 'Cannot be in the future', code: 'future' });
    if (issues.length) throw validationFailed(issues);
    let id: string;
    try {
      [{ id }] = await db().query<{ id: string }>(
        `INSERT INTO deaccessions (print_id, proposed_on, proposed_by, proposed_by_name, reason, method, recipient) VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING id`,
        { bind: [printId, input.proposedOn, actor.id, actor.name, input.reason, input.method, input.recipient ?? null], type: QueryTypes.SELECT, transaction: t },
      );
    } catch (err) {
      rethrowUnique(err, 'printId', 'This print already has an open deaccession proposal.');
    }
    const after = present(await loadRow(id, t));
    await recordAudit({ actor, action: 'deaccession.proposed', entityType: ENTITY, entityId: id, after: snapshot(after), requestId }, t);
    return after;
  });
}

async function lockOpen(id: string, version: number, t: Transaction): Promise<Row> {
  const row = await loadRow(id, t, true);
  if (row.status === 'completed') throw conflict(`This deaccession was completed on ${row.completed_on}; its record is final.`);
  if (row.status === 'withdrawn') throw conflict('This proposal was withdrawn; its record is final.');
  await assertPrintEditable(row.print_id, t);
  if (row.version !== version) throw await staleEdit(ENTITY, id, present(row), t);
  return row;
}

export async function updateDeaccession(id: string, u: Partial<DeaccessionInput> & { version: number }, actor: Actor, requestId: string | null): Promise<Deaccession> {
  return db().transaction(async (t) => {
    const row = await lockOpen(id, u.version, t);
    if (row.status !== 'proposed') throw conflict('The proposal was approved as it stands; withdraw it and propose again to change it.');
    const method = u.method ?? row.method;
    const recipient = u.recipient !== undefined ? u.recipient : row.recipient;
    const issues = methodIssues(method, recipient);
    if (u.proposedOn && u.proposedOn > today()) issues.push({ path: 'proposedOn', message: 'Cannot be in the future', code: 'future' });
    if (issues.length) throw validationFailed(issues);
    await db().query(
      `UPDATE deaccessions SET proposed_on = $2, reason = $3, method = $4, recipient = $5, version = version + 1, updated_at = now() WHERE id = $1`,
      { bind: [id, u.proposedOn ?? row.proposed_on, u.reason ?? row.reason, method, method === 'destruction' ? null : recipient], transaction: t },
    );
    const before = present(row);
    const after = present(await loadRow(id, t));
    if (changedFields(snapshot(before), snapshot(after)).length) await recordAudit({ actor, action: 'deaccession.updated', entityType: ENTITY, entityId: id, before: snapshot(before), after: snapshot(after), requestId }, t);
    return after;
  });
}

export async function approveDeaccession(id: string, body: { authority: string; approvedOn: string; version: number }, actor: Actor, requestId: string | null): Promise<Deaccession> {
  return db().transaction(async (t) => {
    const row = await lockOpen(id, body.version, t);
    if (row.status !== 'proposed') throw conflict('This deaccession is already approved.');
    if (body.approvedOn < row.proposed_on) throw validationFailed([{ path: 'approvedOn', message: `Cannot be before the proposal (${row.proposed_on})`, code: 'order' }]);
    if (body.approvedOn > today()) throw validationFailed([{ path: 'approvedOn', message: 'Cannot be in the future', code: 'future' }]);
    await db().query(`UPDATE deaccessions SET status = 'approved', authority = $2, approved_on = $3, version = version + 1, updated_at = now() WHERE id = $1`, {
      bind: [id, body.authority, body.approvedOn], transaction: t,
    });
    const after = present(await loadRow(id, t));
    await recordAudit({ actor, action: 'deaccession.approved', entityType: ENTITY, entityId: id, before: { status: 'proposed' }, after: { status: 'approved', printId: row.print_id, authority: body.authority, approvedOn: body.approvedOn }, requestId }, t);
    return after;
  });
}

export async function completeDeaccession(id: string, body: { completedOn: string; finalNote: string; version: number }, actor: Actor, requestId: string | null): Promise<Deaccession> {
  return db().transaction(async (t) => {
    const row = await lockOpen(id, body.version, t);
    if (row.status !== 'approved') throw conflict('Only an approved deaccession can be completed.');
    if (body.completedOn < row.approved_on!) throw validationFailed([{ path: 'completedOn', message: `Cannot be before the approval (${row.approved_on})`, code: 'order' }]);
    if (body.completedOn > today()) throw validationFailed([{ path: 'completedOn', message: 'Cannot be in the future', code: 'future' }]);
    const [p] = await db().query<{ status: string }>('SELECT status FROM prints WHERE id = $1 FOR UPDATE', { bind: [row.print_id], type: QueryTypes.SELECT, transaction: t });
    if (p.status === 'on_loan') throw conflict('The print is out on loan; complete the deaccession once it has come back.');
    const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM display_periods WHERE print_id = $1 AND ends_on >= $2', {
      bind: [row.print_id, body.completedOn], type: QueryTypes.SELECT, transaction: t,
    });
    if (n > 0) throw conflict(`The print has ${n} display period${n === 1 ? '' : 's'} ending on or after ${body.completedOn}; take it off those exhibitions first.`);
    await db().query(
      `UPDATE deaccessions SET status = 'completed', completed_on = $2, completed_by_name = $3, final_note = $4, version = version + 1, updated_at = now() WHERE id = $1`,
      { bind: [id, body.completedOn, actor.name, body.finalNote], transaction: t },
    );
    await db().query(`UPDATE prints SET status = 'deaccessioned', deaccessioned_on = $2, version = version + 1, updated_at = now() WHERE id = $1`, {
      bind: [row.print_id, body.completedOn], transaction: t,
    });
    await recordAudit({ actor, action: 'print.updated', entityType: 'print', entityId: row.print_id, before: { status: p.status }, after: { status: 'deaccessioned', reason: 'Deaccession completed' }, requestId }, t);
    // Its next-inspection date goes (a print that has left is not inspected): the schedule job drops it.
    await markScheduleStale(t, { printIds: [row.print_id] });
    const after = present(await loadRow(id, t));
    await recordAudit({ actor, action: 'deaccession.completed', entityType: ENTITY, entityId: id, before: { status: 'approved' }, after: snapshot(after), requestId }, t);
    return after;
  });
}

export async function withdrawDeaccession(id: string, body: { why: string; version: number }, actor: Actor, requestId: string | null): Promise<Deaccession> {
  return db().transaction(async (t) => {
    const row = await lockOpen(id, body.version, t);
    await db().query(`UPDATE deaccessions SET status = 'withdrawn', withdrawn_why = $2, version = version + 1, updated_at = now() WHERE id = $1`, { bind: [id, body.why], transaction: t });
    const after = present(await loadRow(id, t));
    await recordAudit({ actor, action: 'deaccession.withdrawn', entityType: ENTITY, entityId: id, before: { status: row.status }, after: { status: 'withdrawn', printId: row.print_id, why: body.why }, requestId }, t);
    return after;
  });
}
