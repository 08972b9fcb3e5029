import { QueryTypes, type Transaction } from 'sequelize';
import { can, rolesWith, type Role } from '@toneledger/common/domain/roles';
import type { roundInputSchema, roundUpdateSchema } from '@toneledger/common/schemas/inspections';
import type { z } from 'zod';
import { db } from '../db';
import { conflict, notFound, validationFailed } from '../errors';
import { InspectionRound, InspectionRoundItem } from '../models';
import { recordAudit } from './audit.service';
import { assertPrintsEditable } from './print-lock';
import type { Actor } from './print.service';
import { roundDetail } from './round-detail.service';
import { staleEdit } from './versioning';

/** Planning and changing inspection rounds, and checking their prints off when a condition report is signed. */

export const ENTITY = 'inspection_round';

type RoundInput = z.infer<typeof roundInputSchema>;
type RoundUpdate = z.infer<typeof roundUpdateSchema>;

/** The people a round can be given to: everyone whose role plans checks (schedule.write). */
export async function listAssignees(): Promise<{ id: string; name: string }[]> {
  return db().query<{ id: string; name: string }>('SELECT id, name FROM users WHERE role = ANY($1::text[]) ORDER BY lower(name), id', {
    bind: [rolesWith('schedule.write')], type: QueryTypes.SELECT,
  });
}

async function checkAssignee(assigneeId: string, t: Transaction) {
  const [user] = await db().query<{ role: Role }>('SELECT role FROM users WHERE id = $1', { bind: [assigneeId], type: QueryTypes.SELECT, transaction: t });
  if (!user) throw validationFailed([{ path: 'assigneeId', message: 'No such person', code: 'not_found' }]);
  if (!can(user.role, 'schedule.write')) {
    throw validationFailed([{ path: 'assigneeId', message: 'This person cannot carry out checks; choose a conservator', code: 'not_allowed' }]);
  }
}

/** Refuses ids of prints that do not exist, naming each by its place in the list. */
async function checkPrints(field: string, ids: string[], t: Transaction) {
  if (!ids.length) return;
  const found = new Set(
    (await db().query<{ id: string }>('SELECT id FROM prints WHERE id = ANY($1::uuid[])', { bind: [ids], type: QueryTypes.SELECT, transaction: t })).map((r) => r.id),
  );
  const issues = ids.flatMap((id, i) => (found.has(id) ? [] : [{ path: `${field}.${i}`, message: 'No such print', code: 'not_found' }]));
  if (issues.length) throw validationFailed(issues, 'Some of the prints were not found.');
}

async function addItems(roundId: string, printIds: string[], t: Transaction) {
  const [{ next }] = await db().query<{ next: number }>('SELECT coalesce(max(position), 0) + 1 AS next FROM inspection_round_items WHERE round_id = $1', {
    bind: [roundId], type: QueryTypes.SELECT, transaction: t,
  });
  await db().query(
    `INSERT INTO inspection_round_items (round_id, print_id, position)
       SELECT $1, x.id, $3 + x.n - 1 FROM unnest($2::uuid[]) WITH ORDINALITY AS x(id, n) ON CONFLICT DO NOTHING`,
    { bind: [roundId, printIds, next], transaction: t },
  );
}

/** What the audit trail keeps of a round. */
function snapshot(d: Awaited<ReturnType<typeof roundDetail>>) {
  return { title: d.title, plannedOn: d.plannedOn, status: d.status, assigneeId: d.assignee.id, notes: d.notes, printIds: d.items.map((i) => i.printId) };
}

export async function createRound(input: RoundInput, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    await checkAssignee(input.assigneeId, t);
    const printIds = [...new Set(input.printIds)];
    await checkPrints('printIds', input.printIds, t);
    await assertPrintsEditable(input.printIds, t);
    const round = await InspectionRound.create(
      { title: input.title, plannedOn: input.plannedOn, assigneeId: input.assigneeId, notes: input.notes ?? null, createdBy: actor.id! },
      { transaction: t },
    );
    await addItems(round.id, printIds, t);
    const detail = await roundDetail(round.id, t);
    await recordAudit({ actor, action: 'inspection_round.created', entityType: ENTITY, entityId: round.id, after: snapshot(detail), requestId }, t);
    return detail;
  });
}

export async function updateRound(id: string, update: RoundUpdate, actor: Actor, requestId: string | null) {
  const { version, addPrintIds = [], removePrintIds = [], ...changes } = update;
  return db().transaction(async (t) => {
    const round = await InspectionRound.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
    if (!round) throw notFound('The round');
    if (round.version !== version) throw await staleEdit(ENTITY, id, await roundDetail(id, t), t);
    const before = await roundDetail(id, t);
    if (addPrintIds.length && (changes.status ?? round.status) !== 'planned') {
      throw conflict('Prints can be added only to a planned round.', [{ path: 'addPrintIds', message: 'This round is no longer planned', code: 'closed' }]);
    }
    if (changes.assigneeId !== undefined) await checkAssignee(changes.assigneeId, t);
    await checkPrints('addPrintIds', addPrintIds, t);
    await assertPrintsEditable(addPrintIds, t);
    const fields: Partial<InspectionRound> = {};
    for (const k of ['title', 'plannedOn', 'assigneeId', 'notes', 'status'] as const) {
      if (changes[k] !== undefined && changes[k] !== round[k]) (fields as Record<string, unknown>)[k] = changes[k];
    }
    if (removePrintIds.length) {
      await db().query('DELETE FROM inspection_round_items WHERE round_id = $1 AND print_id = ANY($2::uuid[])', { bind: [id, removePrintIds], transaction: t });
    }
    if (addPrintIds.length) await addItems(id, [...new Set(addPrintIds)], t);
    const left = await InspectionRoundItem.count({ where: { roundId: id }, transaction: t });
    if (left === 0) throw validationFailed([{ path: 'removePrintIds', message: 'A round keeps at least one print; cancel it instead', code: 'empty' }]);
    const interim = await roundDetail(id, t);
    const changed = JSON.stringify(snapshot(interim)) !== JSON.stringify(snapshot(before)) || Object.keys(fields).length > 0;
    if (!changed) return before;
    // Every change is a new version: the calendar feed sends it as the event's SEQUENCE.
    await round.update({ ...fields, version: round.version + 1 }, { transaction: t });
    const after = await roundDetail(id, t);
    await recordAudit({ actor, action: 'inspection_round.updated', entityType: ENTITY, entityId: id, before: snapshot(before), after: snapshot(after), requestId }, t);
    return after;
  });
}

/**
 * A condition report signed for a print checks that print off in every open round it is in (and
 * not yet checked), with the report and its examination date. Runs in the signing transaction.
 */
export async function checkOffRounds(report: { id: string; printId: string; examinedOn: string }, t: Transaction): Promise<void> {
  await db().query(
    `UPDATE inspection_round_items i SET checked_on = $3, condition_report_id = $1
       FROM inspection_rounds r WHERE r.id = i.round_id AND r.status = 'planned' AND i.print_id = $2 AND i.checked_on IS NULL`,
    { bind: [report.id, report.printId, report.examinedOn], transaction: t },
  );
}
