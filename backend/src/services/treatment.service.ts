import { QueryTypes, type Transaction } from 'sequelize';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import type { Treatment, TreatmentApproval, TreatmentInput, TreatmentSummary, TreatmentUpdate } from '@toneledger/common/schemas/treatments';
import { db } from '../db';
import { conflict, forbidden, notFound, validationFailed } from '../errors';
import { addendaOf, writeAddendum } from './addenda';
import { recordAudit } from './audit.service';
import { assertPrintEditable } from './print-lock';
import type { Actor } from './print.service';
import { changedFields, staleEdit } from './versioning';

/**
 * Treatments, the conservator's record: proposed → approved → done → signed, each move its own
 * audited action. Signed is locked like a condition report: the same trigger function
 * (`signed_record_locked`) refuses a change at the database, and corrections are addenda in the
 * same append-only table (`addenda.ts`). Approval puts a print that is in store into treatment;
 * marking the work done brings it back to store when no other approved treatment holds it.
 */
const ENTITY = 'treatment';
const LOCKED = 'This treatment is signed and locked; add an addendum to correct or add to it.';
const NOT_AUTHOR = 'Only the conservator who proposed this treatment may change or sign it.';

type Row = {
  id: string; print_id: string; status: Treatment['status']; conservator_id: string | null; conservator_name: string;
  proposed_on: string; condition_found: string; aims: string; options_considered: string | null; chosen_method: string;
  approved_by_name: string | null; approved_on: string | null; approval_note: string | null; started_on: string | null; completed_on: string | null;
  hours_spent: string | null; summary: string | null; steps: Treatment['steps']; materials: Treatment['materials']; after_report_id: string | null;
  signed_at: Date | null; version: number; created_at: Date; updated_at: Date;
  accession_number: string; title: string; after_examined_on: string | null;
};

const SELECT = `SELECT t.id, t.print_id, t.status, t.conservator_id, t.conservator_name, to_char(t.proposed_on, 'YYYY-MM-DD') AS proposed_on,
    t.condition_found, t.aims, t.options_considered, t.chosen_method, t.approved_by_name, to_char(t.approved_on, 'YYYY-MM-DD') AS approved_on,
    t.approval_note, to_char(t.started_on, 'YYYY-MM-DD') AS started_on, to_char(t.completed_on, 'YYYY-MM-DD') AS completed_on, t.hours_spent::text,
    t.summary, t.steps, t.materials, t.after_report_id, t.signed_at, t.version, t.created_at, t.updated_at,
    p.accession_number, p.title, to_char(r.examined_on, 'YYYY-MM-DD') AS after_examined_on
  FROM treatments t JOIN prints p ON p.id = t.print_id LEFT JOIN condition_reports r ON r.id = t.after_report_id`;

const iso = (d: Date) => new Date(d).toISOString();

async function loadRow(id: string, t?: Transaction, lock = false): Promise<Row> {
  const [row] = await db().query<Row>(`${SELECT} WHERE t.id = $1${lock ? ' FOR UPDATE OF t' : ''}`, { bind: [id], type: QueryTypes.SELECT, transaction: t });
  if (!row) throw notFound('The treatment');
  return row;
}

async function present(row: Row, t?: Transaction): Promise<Treatment> {
  const images = await db().query<{ image_id: string; stage: Treatment['images'][number]['stage']; view_type: string; captured_on: string | null; has_thumb: boolean }>(
    `SELECT ti.image_id, ti.stage, i.view_type, to_char(i.captured_on, 'YYYY-MM-DD') AS captured_on, (i.derivatives = 'ready' AND i.purged_at IS NULL) AS has_thumb
       FROM treatment_images ti JOIN images i ON i.id = ti.image_id WHERE ti.treatment_id = $1 ORDER BY ti.position`,
    { bind: [row.id], type: QueryTypes.SELECT, transaction: t },
  );
  return {
    id: row.id, printId: row.print_id, accessionNumber: row.accession_number, printTitle: row.title, status: row.status,
    proposedOn: row.proposed_on, proposedBy: row.conservator_name, conditionFound: row.condition_found, aims: row.aims,
    optionsConsidered: row.options_considered, chosenMethod: row.chosen_method,
    approvedByName: row.approved_by_name, approvedOn: row.approved_on, approvalNote: row.approval_note,
    startedOn: row.started_on, completedOn: row.completed_on, hoursSpent: row.hours_spent === null ? null : Number(row.hours_spent), summary: row.summary,
    steps: row.steps.map((s) => ({ on: s.on, description: s.description, minutes: s.minutes ?? null })),
    materials: row.materials.map((m) => ({ kind: m.kind, name: m.name, batchOrProduct: m.batchOrProduct ?? null, notes: m.notes ?? null })),
    images: images.map((i) => ({ imageId: i.image_id, stage: i.stage, viewType: i.view_type, capturedOn: i.captured_on, thumbUrl: i.has_thumb ? `/api/images/${i.image_id}/file/thumb` : null })),
    afterReportId: row.after_report_id, afterReportExaminedOn: row.after_examined_on,
    conservatorId: row.conservator_id, conservator: row.conservator_name,
    signedAt: row.signed_at ? iso(row.signed_at) : null, signedBy: row.signed_at ? row.conservator_name : null,
    addenda: await addendaOf({ treatmentId: row.id }, t),
    version: row.version, createdAt: iso(row.created_at), updatedAt: iso(row.updated_at),
  };
}

/** What the audit trail keeps of a treatment. */
function snapshot(x: Treatment) {
  const { addenda: _a, createdAt: _c, updatedAt: _u, version: _v, accessionNumber: _n, printTitle: _p, afterReportExaminedOn: _e, ...rest } = x;
  return { ...rest, images: x.images.map((i) => ({ imageId: i.imageId, stage: i.stage })) } as Record<string, unknown>;
}

function toSummary(row: Row): TreatmentSummary {
  return {
    id: row.id, printId: row.print_id, accessionNumber: row.accession_number, printTitle: row.title, status: row.status, proposedOn: row.proposed_on,
    chosenMethod: row.chosen_method, approvedOn: row.approved_on, completedOn: row.completed_on, conservator: row.conservator_name,
    signedAt: row.signed_at ? iso(row.signed_at) : null,
  };
}

export async function listTreatments(status?: Treatment['status']): Promise<TreatmentSummary[]> {
  const rows = await db().query<Row>(`${SELECT} ${status ? 'WHERE t.status = $1' : ''} ORDER BY t.proposed_on DESC, t.created_at DESC LIMIT 500`, {
    bind: status ? [status] : [], type: QueryTypes.SELECT,
  });
  return rows.map(toSummary);
}

export async function printTreatments(printId: string): Promise<TreatmentSummary[]> {
  const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM prints WHERE id = $1', { bind: [printId], type: QueryTypes.SELECT });
  if (!n) throw notFound('The print');
  const rows = await db().query<Row>(`${SELECT} WHERE t.print_id = $1 ORDER BY t.proposed_on DESC, t.created_at DESC`, { bind: [printId], type: QueryTypes.SELECT });
  return rows.map(toSummary);
}

export async function getTreatment(id: string): Promise<Treatment> {
  return present(await loadRow(id));
}

const today = () => new Date().toISOString().slice(0, 10);

export async function proposeTreatment(printId: string, input: TreatmentInput, actor: Actor, requestId: string | null): Promise<Treatment> {
  return db().transaction(async (t) => {
    await assertPrintEditable(printId, t);
    if (input.proposedOn > today()) throw validationFailed([{ path: 'proposedOn', message: 'A proposal cannot be dated in the future', code: 'future' }]);
    const [{ id }] = await db().query<{ id: string }>(
      `INSERT INTO treatments (print_id, conservator_id, conservator_name, proposed_on, condition_found, aims, options_considered, chosen_method)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8) RETURNING id`,
      { bind: [printId, actor.id, actor.name, input.proposedOn, input.conditionFound, input.aims, input.optionsConsidered ?? null, input.chosenMethod], type: QueryTypes.SELECT, transaction: t },
    );
    const after = await present(await loadRow(id, t), t);
    await recordAudit({ actor, action: 'treatment.proposed', entityType: ENTITY, entityId: id, after: snapshot(after), requestId }, t);
    return after;
  });
}

/** Locks a treatment for a change by its conservator at the version they loaded; signed is refused first. */
async function lockOwn(id: string, version: number, actor: Actor, t: Transaction): Promise<Row> {
  const row = await loadRow(id, t, true);
  await assertPrintEditable(row.print_id, t);
  if (row.status === 'signed') throw conflict(LOCKED);
  if (row.conservator_id !== actor.id) throw forbidden(NOT_AUTHOR);
  if (row.version !== version) throw await staleEdit(ENTITY, id, await present(row, t), t);
  return row;
}

const PROPOSAL_KEYS = ['proposedOn', 'conditionFound', 'aims', 'optionsConsidered', 'chosenMethod'] as const;
const RECORD_KEYS = ['startedOn', 'completedOn', 'hoursSpent', 'summary', 'afterReportId', 'steps', 'materials', 'images'] as const;
const COLUMNS: Record<string, string> = {
  proposedOn: 'proposed_on', conditionFound: 'condition_found', aims: 'aims', optionsConsidered: 'options_considered', chosenMethod: 'chosen_method',
  startedOn: 'started_on', completedOn: 'completed_on', hoursSpent: 'hours_spent', summary: 'summary', afterReportId: 'after_report_id',
};

async function recordIssues(row: Row, u: TreatmentUpdate, t: Transaction): Promise<FieldIssue[]> {
  const issues: FieldIssue[] = [];
  const startedOn = u.startedOn !== undefined ? u.startedOn : row.started_on;
  const completedOn = u.completedOn !== undefined ? u.completedOn : row.completed_on;
  if (startedOn && row.approved_on && startedOn < row.approved_on) issues.push({ path: 'startedOn', message: `Work cannot start before the approval (${row.approved_on})`, code: 'before_approval' });
  if (startedOn && completedOn && completedOn < startedOn) issues.push({ path: 'completedOn', message: 'The work cannot end before it started', code: 'order' });
  if (completedOn && completedOn > today()) issues.push({ path: 'completedOn', message: 'Cannot be in the future', code: 'future' });
  u.steps?.forEach((s, i) => {
    if (s.on > today()) issues.push({ path: `steps.${i}.on`, message: 'Cannot be in the future', code: 'future' });
    else if (row.approved_on && s.on < row.approved_on) issues.push({ path: `steps.${i}.on`, message: `Before the approval (${row.approved_on})`, code: 'before_approval' });
  });
  if (u.images?.length) {
    const ids = u.images.map((i) => i.imageId);
    const found = new Set((await db().query<{ id: string }>('SELECT id FROM images WHERE id = ANY($1::uuid[]) AND print_id = $2 AND withdrawn_at IS NULL', {
      bind: [ids, row.print_id], type: QueryTypes.SELECT, transaction: t,
    })).map((r) => r.id));
    const seen = new Set<string>();
    u.images.forEach((img, i) => {
      if (!found.has(img.imageId)) issues.push({ path: `images.${i}.imageId`, message: 'Not a current image of this print', code: 'not_found' });
      else if (seen.has(img.imageId)) issues.push({ path: `images.${i}.imageId`, message: 'This image is listed twice', code: 'duplicate' });
      seen.add(img.imageId);
    });
  }
  if (u.afterReportId) {
    const [r] = await db().query<{ print_id: string; examined_on: string }>(`SELECT print_id, to_char(examined_on, 'YYYY-MM-DD') AS examined_on FROM condition_reports WHERE id = $1`, {
      bind: [u.afterReportId], type: QueryTypes.SELECT, transaction: t,
    });
    if (!r || r.print_id !== row.print_id) issues.push({ path: 'afterReportId', message: 'Not a condition report of this print', code: 'not_found' });
    else if (row.approved_on && r.examined_on < row.approved_on) issues.push({ path: 'afterReportId', message: 'This report was made before the treatment was approved', code: 'before_approval' });
  }
  return issues;
}

export async function updateTreatment(id: string, u: TreatmentUpdate, actor: Actor, requestId: string | null): Promise<Treatment> {
  return db().transaction(async (t) => {
    const row = await lockOwn(id, u.version, actor, t);
    const before = await present(row, t);
    const proposalGiven = PROPOSAL_KEYS.filter((k) => u[k] !== undefined && JSON.stringify(u[k]) !== JSON.stringify(before[k]));
    const recordGiven = RECORD_KEYS.filter((k) => u[k] !== undefined);
    if (row.status !== 'proposed' && proposalGiven.length) {
      throw conflict('The proposal was approved as it stands; record what changed in the treatment itself.', proposalGiven.map((k) => ({ path: k, message: 'Approved: no longer editable', code: 'approved' })));
    }
    if (row.status === 'proposed' && recordGiven.length) {
      throw conflict('The work is recorded once the treatment is approved.', recordGiven.map((k) => ({ path: k, message: 'Approve the treatment first', code: 'not_approved' })));
    }
    const issues = row.status === 'proposed' ? [] : await recordIssues(row, u, t);
    if (u.proposedOn && u.proposedOn > today()) issues.push({ path: 'proposedOn', message: 'A proposal cannot be dated in the future', code: 'future' });
    if (issues.length) throw validationFailed(issues);
    const sets: string[] = [];
    const bind: unknown[] = [id];
    for (const k of [...PROPOSAL_KEYS, 'startedOn', 'completedOn', 'hoursSpent', 'summary', 'afterReportId'] as const) {
      if (u[k] === undefined) continue;
      bind.push(u[k] ?? null);
      sets.push(`${COLUMNS[k]} = $${bind.length}`);
    }
    if (u.steps) { bind.push(JSON.stringify(u.steps.map((s) => ({ on: s.on, description: s.description, minutes: s.minutes ?? null })))); sets.push(`steps = $${bind.length}::jsonb`); }
    if (u.materials) { bind.push(JSON.stringify(u.materials.map((m) => ({ kind: m.kind, name: m.name, batchOrProduct: m.batchOrProduct ?? null, notes: m.notes ?? null })))); sets.push(`materials = $${bind.length}::jsonb`); }
    await db().query(`UPDATE treatments SET ${[...sets, 'version = version + 1', 'updated_at = now()'].join(', ')} WHERE id = $1`, { bind, transaction: t });
    if (u.images) {
      await db().query('DELETE FROM treatment_images WHERE treatment_id = $1', { bind: [id], transaction: t });
      for (const [i, img] of u.images.entries()) {
        await db().query('INSERT INTO treatment_images (treatment_id, image_id, stage, position) VALUES ($1, $2, $3, $4)', { bind: [id, img.imageId, img.stage, i + 1], transaction: t });
      }
    }
    const after = await present(await loadRow(id, t), t);
    const [b, a] = [snapshot(before), snapshot(after)];
    if (changedFields(b, a).length) await recordAudit({ actor, action: 'treatment.updated', entityType: ENTITY, entityId: id, before: b, after: a, requestId }, t);
    return after;
  });
}

/** Sets the print's status as a treatment moves it, with the print's own audit entry. */
async function setPrintStatus(printId: string, from: string, to: string, why: string, actor: Actor, requestId: string | null, t: Transaction) {
  const [p] = await db().query<{ status: string }>('SELECT status FROM prints WHERE id = $1 FOR UPDATE', { bind: [printId], type: QueryTypes.SELECT, transaction: t });
  if (p.status !== from) return;
  await db().query('UPDATE prints SET status = $2, version = version + 1, updated_at = now() WHERE id = $1', { bind: [printId, to], transaction: t });
  await recordAudit({ actor, action: 'print.updated', entityType: 'print', entityId: printId, before: { status: from }, after: { status: to, reason: why }, requestId }, t);
}

export async function approveTreatment(id: string, body: TreatmentApproval, actor: Actor, requestId: string | null): Promise<Treatment> {
  return db().transaction(async (t) => {
    const row = await lockOwn(id, body.version, actor, t);
    if (row.status !== 'proposed') throw conflict(`Only a proposed treatment can be approved; this one is ${row.status === 'approved' ? 'already approved' : 'done'}.`);
    if (body.approvedOn < row.proposed_on) throw validationFailed([{ path: 'approvedOn', message: `Cannot be before the proposal (${row.proposed_on})`, code: 'before_proposal' }]);
    if (body.approvedOn > today()) throw validationFailed([{ path: 'approvedOn', message: 'Cannot be in the future', code: 'future' }]);
    await db().query(
      `UPDATE treatments SET status = 'approved', approved_by_name = $2, approved_on = $3, approval_note = $4, version = version + 1, updated_at = now() WHERE id = $1`,
      { bind: [id, body.approvedByName, body.approvedOn, body.approvalNote ?? null], transaction: t },
    );
    await setPrintStatus(row.print_id, 'in_store', 'in_treatment', 'Treatment approved', actor, requestId, t);
    const after = await present(await loadRow(id, t), t);
    await recordAudit({
      actor, action: 'treatment.approved', entityType: ENTITY, entityId: id, before: { status: 'proposed' },
      after: { status: 'approved', printId: row.print_id, approvedByName: body.approvedByName, approvedOn: body.approvedOn, approvalNote: body.approvalNote ?? null }, requestId,
    }, t);
    return after;
  });
}

export async function completeTreatment(id: string, version: number, actor: Actor, requestId: string | null): Promise<Treatment> {
  return db().transaction(async (t) => {
    const row = await lockOwn(id, version, actor, t);
    if (row.status !== 'approved') throw conflict(row.status === 'proposed' ? 'Approve the treatment before marking it done.' : 'This treatment is already done.');
    const issues: FieldIssue[] = [];
    if (!row.started_on) issues.push({ path: 'startedOn', message: 'Give the day work started', code: 'required' });
    if (!row.completed_on) issues.push({ path: 'completedOn', message: 'Give the day work ended', code: 'required' });
    if (row.steps.length === 0) issues.push({ path: 'steps', message: 'Record at least one step of the work', code: 'required' });
    if (issues.length) throw validationFailed(issues, 'The record of the work is not complete.');
    await db().query(`UPDATE treatments SET status = 'done', version = version + 1, updated_at = now() WHERE id = $1`, { bind: [id], transaction: t });
    const [{ n }] = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM treatments WHERE print_id = $1 AND status = 'approved' AND id <> $2`, {
      bind: [row.print_id, id], type: QueryTypes.SELECT, transaction: t,
    });
    if (n === 0) await setPrintStatus(row.print_id, 'in_treatment', 'in_store', 'Treatment done', actor, requestId, t);
    const after = await present(await loadRow(id, t), t);
    await recordAudit({ actor, action: 'treatment.done', entityType: ENTITY, entityId: id, before: { status: 'approved' }, after: { status: 'done', printId: row.print_id, completedOn: row.completed_on }, requestId }, t);
    return after;
  });
}

export async function signTreatment(id: string, version: number, actor: Actor, requestId: string | null): Promise<Treatment> {
  return db().transaction(async (t) => {
    const row = await lockOwn(id, version, actor, t);
    if (row.status !== 'done') throw conflict('Only a treatment marked done can be signed.');
    await db().query(`UPDATE treatments SET status = 'signed', signed_at = now(), version = version + 1, updated_at = now() WHERE id = $1`, { bind: [id], transaction: t });
    const after = await present(await loadRow(id, t), t);
    await recordAudit({ actor, action: 'treatment.signed', entityType: ENTITY, entityId: id, before: { status: 'done' }, after: snapshot(after), requestId }, t);
    return after;
  });
}

/** Any conservator may add to a signed treatment; the treatment itself stays as signed. */
export async function addTreatmentAddendum(id: string, text: string, actor: Actor, requestId: string | null): Promise<Treatment> {
  return db().transaction(async (t) => {
    const row = await loadRow(id, t);
    await assertPrintEditable(row.print_id, t);
    if (row.status !== 'signed') throw conflict('This treatment is not signed yet; edit the record instead.');
    const addendum = await writeAddendum({ treatmentId: id }, text, actor, t);
    await recordAudit({ actor, action: 'treatment.addendum_added', entityType: ENTITY, entityId: id, after: { printId: row.print_id, addendum }, requestId }, t);
    return present(await loadRow(id, t), t);
  });
}
