import type { Transaction } from 'sequelize';
import { db } from '../db';
import { Maker, Movement, Print, ProcessStep } from '../models';
import { presentPrint } from '../presenters/catalogue.presenter';
import { recordAudit, type AuditActor } from './audit.service';
import type { Plan, PlannedRow } from './import-check.service';
import { loadPrint, snapshot, stepRow, storeWarnings } from './print.service';
import { recomputeCategories } from './light-settings.service';
import { changedFields } from './versioning';
import { assertPrintsEditable } from './print-lock';

/**
 * Writing a checked plan inside the caller's transaction (all rows or none): new makers, new prints
 * in batches (with their steps, first placement and audit rows), then each update as the print's
 * own screens write it — fields (`print.updated`), process history (`print.steps_replaced`) and
 * place (a movement and `print.moved`), one version step per print, warnings and toner classes
 * recomputed.
 */

export interface CommitContext {
  importId: string;
  fileName: string;
  actor: AuditActor;
  requestId: string | null;
  progress: (done: number) => Promise<void>;
}

const BATCH = 1000;

async function createMakers(plan: Plan, ctx: CommitContext, t: Transaction): Promise<Map<string, string>> {
  const ids = new Map<string, string>();
  for (const name of plan.newMakers) {
    const m = await Maker.create({ name, lifeDates: null, notes: null }, { transaction: t });
    ids.set(name.toLowerCase(), m.id);
    await recordAudit({ actor: ctx.actor, action: 'maker.created', entityType: 'maker', entityId: m.id, after: { name, via: `import ${ctx.importId}` }, requestId: ctx.requestId }, t);
  }
  return ids;
}

const withMaker = (r: PlannedRow, makers: Map<string, string>) =>
  r.newMaker && 'makerId' in r.values ? { ...r.values, makerId: makers.get(r.newMaker.toLowerCase()) ?? null } : r.values;

async function createPrints(rows: PlannedRow[], makers: Map<string, string>, ctx: CommitContext, t: Transaction) {
  const qi = db().getQueryInterface();
  for (let i = 0; i < rows.length; i += BATCH) {
    const batch = rows.slice(i, i + BATCH);
    const inserted = await Print.bulkCreate(
      batch.map((r) => ({ ...withMaker(r, makers), locationId: r.locationId }) as never),
      { transaction: t, returning: true },
    );
    const steps = inserted.flatMap((p, k) => (batch[k].steps ?? []).map((s, n) => stepRow(p.id, n + 1, s)));
    if (steps.length) await ProcessStep.bulkCreate(steps, { transaction: t });
    // The light category is computed from the process and toning (light-settings.service.ts).
    await recomputeCategories(t, inserted.map((p) => p.id));
    const moves = inserted.flatMap((p, k) =>
      batch[k].locationId
        ? [{ print_id: p.id, to_location_id: batch[k].locationId, moved_by: ctx.actor.id, moved_by_name: ctx.actor.name, reason: `Placed by CSV import ${ctx.fileName}` }]
        : [],
    );
    if (moves.length) await qi.bulkInsert('movements', moves, { transaction: t });
    await qi.bulkInsert(
      'audit_events',
      inserted.map((p, k) => ({
        actor_id: ctx.actor.id, actor_name: ctx.actor.name, action: 'print.imported', entity_type: 'print', entity_id: p.id,
        after: JSON.stringify({ ...withMaker(batch[k], makers), maker: batch[k].values.makerName ?? null, steps: batch[k].steps?.length ?? 0, importId: ctx.importId }),
        request_id: ctx.requestId,
      })),
      { transaction: t },
    );
    await ctx.progress(i + batch.length);
  }
}

async function updatePrint(r: PlannedRow, makers: Map<string, string>, ctx: CommitContext, t: Transaction) {
  const { id, version } = r.existing!;
  const audit = { actor: ctx.actor, entityType: 'print', entityId: id, requestId: ctx.requestId };
  const before = await loadPrint(id, t);
  const values = withMaker(r, makers);
  await Print.update({ ...values, version: version + 1 } as never, { where: { id }, transaction: t });
  if (Object.keys(values).length) {
    const [b, a] = [snapshot(before), snapshot(await loadPrint(id, t))];
    if (changedFields(b, a).length) await recordAudit({ ...audit, action: 'print.updated', before: b, after: a }, t);
  }
  if (r.steps) {
    const stepsBefore = presentPrint(before, 'admin').steps;
    await ProcessStep.destroy({ where: { printId: id }, transaction: t });
    await ProcessStep.bulkCreate(r.steps.map((s, i) => stepRow(id, i + 1, s)), { transaction: t });
    const stepsAfter = presentPrint(await loadPrint(id, t), 'admin').steps;
    await recordAudit({ ...audit, action: 'print.steps_replaced', before: { steps: stepsBefore }, after: { steps: stepsAfter } }, t);
  }
  if (r.locationId) {
    const reason = `Moved by CSV import ${ctx.fileName}`;
    await Movement.create({ printId: id, fromLocationId: before.locationId, toLocationId: r.locationId, movedBy: ctx.actor.id, movedByName: ctx.actor.name, reason }, { transaction: t });
    await Print.update({ locationId: r.locationId }, { where: { id }, transaction: t });
    const to = (await loadPrint(id, t)).location?.pathLabel ?? null;
    await recordAudit({ ...audit, action: 'print.moved', before: { location: before.location?.pathLabel ?? null }, after: { location: to, reason } }, t);
  }
  await storeWarnings(await loadPrint(id, t), t);
}

/** Writes the plan; answers how many prints it created and updated. */
export async function writePlan(plan: Plan, ctx: CommitContext, t: Transaction): Promise<{ created: number; updated: number }> {
  const makers = await createMakers(plan, ctx, t);
  const creates = plan.rows.filter((r) => r.action === 'create');
  const updates = plan.rows.filter((r) => r.action === 'update');
  await assertPrintsEditable(updates.map((r) => r.existing!.id), t);
  await createPrints(creates, makers, ctx, t);
  for (let i = 0; i < updates.length; i++) {
    await updatePrint(updates[i], makers, ctx, t);
    if ((i + 1) % 100 === 0) await ctx.progress(creates.length + i + 1);
  }
  await ctx.progress(creates.length + updates.length);
  return { created: creates.length, updated: updates.length };
}
