import { QueryTypes, type Transaction } from 'sequelize';
import { BULK_APPLY_MAX, type BulkAction, type BulkPreview, type BulkResult, type PrintSelection } from '@toneledger/common/schemas/bulk';
import { db } from '../db';
import { conflict, validationFailed } from '../errors';
import { AuditEventModel, Movement } from '../models';
import type { Actor } from './print.service';
import { markScheduleStale } from './schedule-stale';
import { assertPrintsEditable } from './print-lock';
import { fingerprintOf, resolveSelection, tooManyError, type SelectedPrint } from './bulk-selection';
import { planExhibition, planMove, planRehouse, planRound, planStatus, presentPreview, type Plan, type PlannedRow } from './bulk-plan';

/**
 * Bulk actions on the catalogue list's selection. The preview resolves the selection and plans the
 * action (bulk-plan.ts) without writing; the apply does the same inside one transaction with the
 * selected prints locked, recomputes the preview's fingerprint (the action, its target's version and
 * every print's id and version) and refuses with 409 and a fresh preview when it differs. Then it
 * writes the planned changes and one audit entry per changed print. Deaccessioned prints are never
 * changed: the plan lists them as refused.
 */

type Body<A> = A & { selection: PrintSelection };
type Planner<A> = (rows: SelectedPrint[], body: A, t?: Transaction) => Promise<Plan>;

/** The action's own fields, without the selection and the fingerprint, as the fingerprint hashes them. */
function paramsOf(body: Record<string, unknown>) {
  const { selection: _s, fingerprint: _f, ...rest } = body;
  return rest;
}

async function previewWith<A extends object>(action: BulkAction, planner: Planner<A>, body: Body<A>, actor: Actor, t?: Transaction): Promise<BulkPreview> {
  const sel = await resolveSelection(body.selection, actor.role, t, !!t);
  const plan = await planner(sel.rows, body, t);
  const fingerprint = fingerprintOf(action, paramsOf(body as Record<string, unknown>), plan.target.version, sel.rows);
  return presentPreview(action, plan, sel.total, sel.tooMany, BULK_APPLY_MAX, fingerprint);
}

async function applyWith<A extends object>(
  action: BulkAction, planner: Planner<A>, body: Body<A> & { fingerprint: string }, actor: Actor, requestId: string | null,
  write: (changes: PlannedRow[], plan: Plan, t: Transaction) => Promise<void>,
): Promise<BulkResult> {
  return db().transaction(async (t) => {
    const sel = await resolveSelection(body.selection, actor.role, t, true);
    if (sel.tooMany) throw tooManyError(sel.total);
    const plan = await planner(sel.rows, body, t);
    const fingerprint = fingerprintOf(action, paramsOf(body as Record<string, unknown>), plan.target.version, sel.rows);
    if (fingerprint !== body.fingerprint) {
      throw conflict('The selection changed since the preview (a print was edited, added or taken out, or the target changed). Look at the new preview, then apply it.', {
        preview: presentPreview(action, plan, sel.total, sel.tooMany, BULK_APPLY_MAX, fingerprint),
      });
    }
    const changes = plan.rows.filter((r) => r.outcome === 'change');
    // The plan leaves deaccessioned prints out; the guard is asked again before anything is written.
    await assertPrintsEditable(idsOf(changes), t);
    if (changes.length) await write(changes, plan, t);
    const count = (o: PlannedRow['outcome']) => plan.rows.filter((r) => r.outcome === o).length;
    await AuditEventModel.bulkCreate(
      changes.map((r) => ({ actorId: actor.id, actorName: actor.name, entityType: 'print', entityId: r.print.id, requestId, ...auditOf(action, r, plan, body) })),
      { transaction: t },
    );
    return { action, changed: changes.length, unchanged: count('unchanged'), refused: count('refused'), auditEntries: changes.length };
  });
}

/** Each changed print's audit entry, shaped as the single-print write of the same kind shapes it. */
function auditOf(action: BulkAction, r: PlannedRow, plan: Plan, body: Record<string, unknown>): { action: string; before: unknown; after: unknown } {
  const reason = (body.reason as string | null | undefined) ?? null;
  switch (action) {
    case 'move': return { action: 'print.moved', before: { location: r.before }, after: { location: r.after, reason } };
    case 'rehouse': return { action: 'print.rehoused', before: { enclosure: r.before }, after: { enclosure: r.after, ...(reason ? { reason } : {}) } };
    case 'status': return { action: 'print.updated', before: { status: r.print.status }, after: { status: plan.target.id } };
    case 'round': return { action: 'print.added_to_round', before: null, after: { roundId: plan.target.id, round: plan.target.label } };
    case 'exhibition': return { action: 'print.added_to_exhibition', before: null, after: { exhibitionId: plan.target.id, exhibition: plan.target.label } };
  }
}

const idsOf = (rows: PlannedRow[]) => rows.map((r) => r.print.id);
const bumpSql = 'version = version + 1, updated_at = now()';

// ── The actions ──

type MoveBody = Body<{ toLocationId: string; reason: string; movedAt?: string }>;
export const previewMove = (body: MoveBody, actor: Actor) => previewWith('move', planMove, body, actor);
export function applyMove(body: MoveBody & { fingerprint: string }, actor: Actor, requestId: string | null) {
  const movedAt = body.movedAt ? new Date(body.movedAt) : new Date();
  if (movedAt.getTime() > Date.now() + 60_000) {
    throw validationFailed([{ path: 'movedAt', message: 'A movement cannot be in the future', code: 'future' }]);
  }
  return applyWith('move', planMove, body, actor, requestId, async (changes, plan, t) => {
    await Movement.bulkCreate(
      changes.map((r) => ({ printId: r.print.id, fromLocationId: r.print.location_id, toLocationId: plan.target.id, movedAt, movedBy: actor.id, movedByName: actor.name, reason: body.reason })),
      { transaction: t },
    );
    await db().query(`UPDATE prints SET location_id = $1, ${bumpSql} WHERE id = ANY($2::uuid[])`, { bind: [plan.target.id, idsOf(changes)], transaction: t });
    await markScheduleStale(t, { printIds: idsOf(changes) });
  });
}

type RehouseBody = Body<{ enclosureId: string; reason?: string | null }>;
export const previewRehouse = (body: RehouseBody, actor: Actor) => previewWith('rehouse', planRehouse, body, actor);
export function applyRehouse(body: RehouseBody & { fingerprint: string }, actor: Actor, requestId: string | null) {
  return applyWith('rehouse', planRehouse, body, actor, requestId, async (changes, plan, t) => {
    // The warnings as print.service's storeWarnings would store them: the enclosure rules, then the light warning kept.
    const rows = changes.map((r) => ({ id: r.print.id, codes: r.codesAfter ?? [] }));
    await db().query(
      `UPDATE prints p SET enclosure_id = $1, warning_codes = x.codes, version = p.version + 1, updated_at = now()
         FROM jsonb_to_recordset($2::jsonb) AS x(id uuid, codes text[]) WHERE p.id = x.id`,
      { bind: [plan.target.id, JSON.stringify(rows)], transaction: t },
    );
    await markScheduleStale(t, { printIds: idsOf(changes) });
  });
}

type StatusBody = Body<{ status: string }>;
export const previewStatus = (body: StatusBody, actor: Actor) => previewWith('status', planStatus, body, actor);
export function applyStatus(body: StatusBody & { fingerprint: string }, actor: Actor, requestId: string | null) {
  return applyWith('status', planStatus, body, actor, requestId, async (changes, plan, t) => {
    await db().query(`UPDATE prints SET status = $1, ${bumpSql} WHERE id = ANY($2::uuid[])`, { bind: [plan.target.id, idsOf(changes)], transaction: t });
  });
}

type RoundBody = Body<{ roundId: string }>;
export const previewRound = (body: RoundBody, actor: Actor) => previewWith('round', planRound, body, actor);
export function applyRound(body: RoundBody & { fingerprint: string }, actor: Actor, requestId: string | null) {
  return applyWith('round', planRound, body, actor, requestId, async (changes, plan, t) => {
    await db().query('SELECT id FROM inspection_rounds WHERE id = $1 FOR UPDATE', { bind: [plan.target.id], transaction: t, type: QueryTypes.SELECT });
    const [{ next }] = await db().query<{ next: number }>('SELECT coalesce(max(position), 0) + 1 AS next FROM inspection_round_items WHERE round_id = $1', {
      bind: [plan.target.id], type: QueryTypes.SELECT, transaction: t,
    });
    await db().query(
      `INSERT INTO inspection_round_items (round_id, print_id, position)
         SELECT $1, x.id, $3 + x.n - 1 FROM unnest($2::uuid[]) WITH ORDINALITY AS x(id, n) ON CONFLICT DO NOTHING`,
      { bind: [plan.target.id, idsOf(changes), next], transaction: t },
    );
    // Every change to a round is a new version (the calendar feed sends it as the event's SEQUENCE).
    await db().query('UPDATE inspection_rounds SET version = version + 1, updated_at = now() WHERE id = $1', { bind: [plan.target.id], transaction: t });
    await AuditEventModel.create(
      { actorId: actor.id, actorName: actor.name, action: 'inspection_round.prints_added', entityType: 'inspection_round', entityId: plan.target.id, before: null, after: { printIds: idsOf(changes) }, requestId, ip: null },
      { transaction: t },
    );
  });
}

type ExhibitionBody = Body<{ exhibitionId: string }>;
export const previewExhibition = (body: ExhibitionBody, actor: Actor) => previewWith('exhibition', planExhibition, body, actor);
export function applyExhibition(body: ExhibitionBody & { fingerprint: string }, actor: Actor, requestId: string | null) {
  return applyWith('exhibition', planExhibition, body, actor, requestId, async (changes, plan, t) => {
    await db().query('SELECT id FROM exhibitions WHERE id = $1 FOR UPDATE', { bind: [plan.target.id], transaction: t, type: QueryTypes.SELECT });
    await db().query('INSERT INTO exhibition_objects (exhibition_id, print_id) SELECT $1, unnest($2::uuid[]) ON CONFLICT DO NOTHING', {
      bind: [plan.target.id, idsOf(changes)], transaction: t,
    });
    await db().query('UPDATE exhibitions SET version = version + 1, updated_at = now() WHERE id = $1', { bind: [plan.target.id], transaction: t });
    await AuditEventModel.create(
      { actorId: actor.id, actorName: actor.name, action: 'exhibition.objects_added', entityType: 'exhibition', entityId: plan.target.id, before: null, after: { printIds: idsOf(changes) }, requestId, ip: null },
      { transaction: t },
    );
  });
}
