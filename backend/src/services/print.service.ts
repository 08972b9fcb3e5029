import { QueryTypes, type Transaction } from 'sequelize';
import { checkAccession } from '@toneledger/common/domain/accession';
import type { Role } from '@toneledger/common/domain/roles';
import { mayRead } from '@toneledger/common/fields/field';
import { printField } from '@toneledger/common/fields/print';
import type { PrintInput, PrintUpdate, ProcessStepInput, HistoryEvent } from '@toneledger/common/schemas/catalogue';
import { deletionRefusal } from './print-deletion';
import { db } from '../db';
import { AuditEventModel, BathRecipe, EnclosureType, Location, Maker, Movement, Paper, Print, ProcessStep } from '../models';
import { conflict, notFound, validationFailed } from '../errors';
import { recordAudit, type AuditActor } from './audit.service';
import { getCatalogueSettings, warnUncheckedPattern } from './settings.service';
import { changedFields, rethrowUnique, staleEdit } from './versioning';
import { accessionSortKey, deriveDate, tonerClassesOf, warningsOf } from './print-derive';
import { storeLightDerived } from './light.service';
import { markScheduleStale } from './schedule-stale';
import { assertPrintEditable } from './print-lock';
import { paperLabel, presentMovement, presentPrint, type LoadedPrint } from '../presenters/catalogue.presenter';

/** Who acts, as every write service takes it: for the audit trail, and the role that decides what the answer shows. */
export type Actor = AuditActor & { role: Role };

/** One print as the given role may see it. */
export async function getPrint(id: string, role: Role | null) {
  return presentPrint(await loadPrint(id), role);
}

const INCLUDE = [
  { model: Maker, as: 'maker' },
  { model: Paper, as: 'paper' },
  { model: Location, as: 'location' },
  { model: EnclosureType, as: 'enclosure' },
  { model: ProcessStep, as: 'steps', include: [{ model: BathRecipe, as: 'recipe' }] },
];

export async function loadPrint(id: string, transaction?: Transaction): Promise<LoadedPrint> {
  const p = (await Print.findByPk(id, { include: INCLUDE, transaction })) as LoadedPrint | null;
  if (!p) throw notFound('The print');
  return p;
}

/** What the audit trail keeps of a print: every field a person entered, as the API shows it. */
export function snapshot(p: LoadedPrint) {
  const { warnings: _w, steps: _s, createdAt: _c, updatedAt: _u, tonerClasses: _t, version: _v, ...rest } = presentPrint(p, 'admin');
  return rest as Record<string, unknown>;
}

async function checkReferences(values: Partial<PrintInput>, t: Transaction) {
  const issues: { path: string; message: string; code: string }[] = [];
  const check = async (path: keyof PrintInput, model: { count(o: object): Promise<number> }, what: string) => {
    const id = values[path] as string | null | undefined;
    if (id && (await model.count({ where: { id }, transaction: t })) === 0) issues.push({ path, message: `No such ${what}`, code: 'not_found' });
  };
  await check('makerId', Maker, 'maker');
  await check('paperId', Paper, 'paper');
  await check('enclosureId', EnclosureType, 'enclosure type');
  await check('locationId', Location, 'location');
  if (issues.length) throw validationFailed(issues);
}

async function checkAccessionNumber(value: string) {
  const { accessionPattern } = await getCatalogueSettings();
  const result = checkAccession(accessionPattern, value);
  if (!result.ok) throw validationFailed([{ path: 'accessionNumber', message: result.message, code: 'pattern' }]);
  warnUncheckedPattern(accessionPattern, result.unchecked);
  return result.normalised;
}

const DUPLICATE = 'Another print already has this accession number.';

/** Denormalised names and computed columns, from the references and steps. */
async function derived(values: Partial<PrintInput>, t: Transaction) {
  const out: Record<string, unknown> = {};
  if (values.makerId !== undefined) out.makerName = values.makerId ? (await Maker.findByPk(values.makerId, { transaction: t }))?.name ?? null : null;
  if (values.paperId !== undefined) {
    const paper = values.paperId ? await Paper.findByPk(values.paperId, { transaction: t }) : null;
    out.paperLabel = paper ? paperLabel(paper) : null;
  }
  if (values.dateMade !== undefined) Object.assign(out, deriveDate(values.dateMade));
  if (values.accessionNumber !== undefined) out.accessionSort = accessionSortKey(values.accessionNumber);
  return out;
}

export async function storeWarnings(p: LoadedPrint, t: Transaction) {
  const steps = p.steps ?? [];
  const enclosure = p.enclosure ?? null;
  const codes = warningsOf(p.process, steps, enclosure).map((w) => w.code);
  const toners = tonerClassesOf(steps);
  await Print.update({ warningCodes: codes, tonerClasses: toners }, { where: { id: p.id }, transaction: t, silent: true });
  // Process, toning and enclosure are inputs of the inspection schedule.
  await markScheduleStale(t, { printIds: [p.id] });
  // The effective light category follows the process and toning; the light warning is kept among the codes.
  await storeLightDerived(p.id, t);
}

/**
 * `options.placedAt` dates the first placement; only the demo seed gives it (an invented print
 * accessioned long ago was placed then). The API never passes it: a print created today is placed now.
 */
export async function createPrint(input: PrintInput, actor: Actor, requestId: string | null, options: { placedAt?: Date } = {}) {
  const accessionNumber = await checkAccessionNumber(input.accessionNumber);
  return db().transaction((t) => insertPrint({ ...input, accessionNumber }, actor, requestId, t, { placedAt: options.placedAt }));
}

/**
 * Writes a new print inside the caller's transaction: derived columns, first placement, warnings and
 * the `print.created` audit row. The accession number is taken as given (`createPrint` checks it
 * against the pattern first; a borrowed print keeps its lender's number unchecked).
 */
export async function insertPrint(input: PrintInput, actor: Actor, requestId: string | null, t: Transaction, options: { borrowed?: boolean; placedAt?: Date } = {}) {
  const accessionNumber = input.accessionNumber;
  await checkReferences(input, t);
  const { locationId, ...fields } = input;
  const values = { ...fields, accessionNumber, ...(await derived({ ...input, accessionNumber }, t)), borrowed: options.borrowed ?? false };
  let print: Print;
  try {
    print = await Print.create({ ...(values as Record<string, unknown>), locationId: locationId ?? null } as never, { transaction: t });
  } catch (err) {
    rethrowUnique(err, 'accessionNumber', DUPLICATE);
  }
  if (locationId) {
    await Movement.create({ printId: print.id, fromLocationId: null, toLocationId: locationId, ...(options.placedAt ? { movedAt: options.placedAt } : {}), movedBy: actor.id, movedByName: actor.name, reason: 'First placement at cataloguing' }, { transaction: t });
  }
  const loaded = await loadPrint(print.id, t);
  await storeWarnings(loaded, t);
  await recordAudit({ actor, action: 'print.created', entityType: 'print', entityId: print.id, after: snapshot(loaded), requestId }, t);
  return presentPrint(await loadPrint(print.id, t), actor.role);
}

async function lockForEdit(id: string, version: number, t: Transaction, role: Role): Promise<LoadedPrint> {
  const row = await Print.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
  if (!row) throw notFound('The print');
  await assertPrintEditable(row, t);
  const loaded = await loadPrint(id, t);
  if (row.version !== version) throw await staleEdit('print', id, presentPrint(loaded, role), t);
  return loaded;
}

export async function updatePrint(id: string, update: PrintUpdate, actor: Actor, requestId: string | null) {
  const { version, ...changes } = update;
  const accessionNumber = changes.accessionNumber !== undefined ? await checkAccessionNumber(changes.accessionNumber) : undefined;
  return db().transaction(async (t) => {
    const before = await lockForEdit(id, version, t, actor.role);
    if (changes.status !== undefined && changes.status !== before.status) await checkLoanStatus(id, before.status, changes.status, t);
    await checkReferences(changes, t);
    const values = { ...changes, ...(accessionNumber ? { accessionNumber } : {}), ...(await derived({ ...changes, ...(accessionNumber ? { accessionNumber } : {}) }, t)) };
    try {
      await Print.update({ ...(values as Record<string, unknown>), version: before.version + 1 } as never, { where: { id }, transaction: t });
    } catch (err) {
      rethrowUnique(err, 'accessionNumber', DUPLICATE);
    }
    const after = await loadPrint(id, t);
    await storeWarnings(after, t);
    const b = snapshot(before);
    const a = snapshot(after);
    if (changedFields(b, a).length) await recordAudit({ actor, action: 'print.updated', entityType: 'print', entityId: id, before: b, after: a, requestId }, t);
    return presentPrint(await loadPrint(id, t), actor.role);
  });
}

const SET_BY_DEACCESSION = 'Deaccessioned is set by completing the print\'s deaccession record, which keeps the reason, the approval and the method.';
const SET_BY_LOAN = 'On loan is set by the loan: a print goes on loan when its loan is dispatched and comes back when the loan is returned.';

/**
 * A print's status "on loan" follows its loan: it cannot be set by hand, nor cleared while the print
 * is on a loan out that has left (one marked on loan before loans were recorded can be cleared).
 */
async function checkLoanStatus(id: string, from: string, to: string, t: Transaction) {
  if (to === 'deaccessioned') throw validationFailed([{ path: 'status', message: SET_BY_DEACCESSION, code: 'set_by_deaccession' }]);
  if (to === 'on_loan') throw validationFailed([{ path: 'status', message: SET_BY_LOAN, code: 'set_by_loan' }]);
  if (from !== 'on_loan') return;
  const [away] = await db().query<{ n: number }>(
    `SELECT count(*)::int AS n FROM loan_objects o JOIN loans l ON l.id = o.loan_id
      WHERE o.print_id = $1 AND l.direction = 'out' AND l.status IN ('in_transit', 'on_loan')`,
    { bind: [id], type: QueryTypes.SELECT, transaction: t },
  );
  if (away.n > 0) throw validationFailed([{ path: 'status', message: SET_BY_LOAN, code: 'set_by_loan' }]);
}

/**
 * A movement made by a loan, inside the loan's transaction: the print goes to `toLocationId` with the
 * given status, the movement is recorded and the print's history shows it (`print.moved`).
 */
export async function moveForLoan(
  id: string, toLocationId: string, status: string, reason: string, movedAt: Date, actor: Actor, requestId: string | null, t: Transaction,
) {
  const row = await Print.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
  if (!row) throw notFound('The print');
  await assertPrintEditable(row, t);
  const before = await loadPrint(id, t);
  const to = await Location.findByPk(toLocationId, { transaction: t });
  if (!to) throw notFound('The location');
  if (before.locationId !== to.id) {
    await Movement.create({ printId: id, fromLocationId: before.locationId, toLocationId: to.id, movedAt, movedBy: actor.id, movedByName: actor.name, reason }, { transaction: t });
  }
  await Print.update({ locationId: to.id, status, version: before.version + 1 }, { where: { id }, transaction: t });
  await markScheduleStale(t, { printIds: [id] });
  await recordAudit(
    {
      actor, action: 'print.moved', entityType: 'print', entityId: id,
      before: { location: before.location?.pathLabel ?? null, status: before.status }, after: { location: to.pathLabel, status, reason }, requestId,
    },
    t,
  );
}

export async function deletePrint(id: string, version: number, actor: Actor, requestId: string | null) {
  await db().transaction(async (t) => {
    const before = await lockForEdit(id, version, t, actor.role);
    const refusal = await deletionRefusal(id, t);
    if (refusal) throw conflict(refusal);
    const movements = await Movement.findAll({ where: { printId: id }, include: [{ model: Location, as: 'from' }, { model: Location, as: 'to' }], transaction: t });
    // The whole record, steps and movements included, stays in the audit trail.
    await recordAudit(
      {
        actor, action: 'print.deleted', entityType: 'print', entityId: id,
        before: { ...snapshot(before), steps: presentPrint(before, 'admin').steps, movements: movements.map(presentMovement) },
        requestId,
      },
      t,
    );
    await Print.destroy({ where: { id }, transaction: t });
  });
}

export function stepRow(printId: string, position: number, s: ProcessStepInput) {
  return {
    printId, position, type: s.type, agent: s.agent ?? null, tonerClass: s.tonerClass ?? null, recipeId: s.recipeId ?? null,
    dilution: s.dilution ?? null, timeSeconds: s.timeSeconds ?? null, temperatureC: s.temperatureC ?? null, extent: s.extent ?? null,
    concentration: s.concentration ?? null, alkaline: s.alkaline ?? null, method: s.method ?? null, value: s.value ?? null,
    unit: s.unit ?? null, notes: s.notes ?? null,
  };
}

export async function replaceSteps(id: string, body: { version: number; steps: ProcessStepInput[] }, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    const before = await lockForEdit(id, body.version, t, actor.role);
    const recipeIds = [...new Set(body.steps.map((s) => s.recipeId).filter(Boolean))] as string[];
    if (recipeIds.length) {
      const found = new Set((await BathRecipe.findAll({ where: { id: recipeIds }, attributes: ['id'], transaction: t })).map((r) => r.id));
      const issues = body.steps.flatMap((s, i) => (s.recipeId && !found.has(s.recipeId) ? [{ path: `steps.${i}.recipeId`, message: 'No such recipe', code: 'not_found' }] : []));
      if (issues.length) throw validationFailed(issues);
    }
    await ProcessStep.destroy({ where: { printId: id }, transaction: t });
    await ProcessStep.bulkCreate(body.steps.map((s, i) => stepRow(id, i + 1, s)), { transaction: t });
    await Print.update({ version: before.version + 1 }, { where: { id }, transaction: t });
    const after = await loadPrint(id, t);
    await storeWarnings(after, t);
    await recordAudit(
      { actor, action: 'print.steps_replaced', entityType: 'print', entityId: id, before: { steps: presentPrint(before, 'admin').steps }, after: { steps: presentPrint(after, 'admin').steps }, requestId },
      t,
    );
    return presentPrint(await loadPrint(id, t), actor.role);
  });
}

export async function movePrint(
  id: string,
  body: { toLocationId: string; reason: string; movedAt?: string; version: number },
  actor: Actor,
  requestId: string | null,
) {
  return db().transaction(async (t) => {
    const before = await lockForEdit(id, body.version, t, actor.role);
    const to = await Location.findByPk(body.toLocationId, { transaction: t });
    if (!to) throw validationFailed([{ path: 'toLocationId', message: 'No such location', code: 'not_found' }]);
    if (before.locationId === to.id) throw validationFailed([{ path: 'toLocationId', message: 'The print is already there', code: 'same_place' }]);
    const movedAt = body.movedAt ? new Date(body.movedAt) : new Date();
    if (movedAt.getTime() > Date.now() + 60_000) throw validationFailed([{ path: 'movedAt', message: 'A movement cannot be in the future', code: 'future' }]);
    await Movement.create({ printId: id, fromLocationId: before.locationId, toLocationId: to.id, movedAt, movedBy: actor.id, movedByName: actor.name, reason: body.reason }, { transaction: t });
    await Print.update({ locationId: to.id, version: before.version + 1 }, { where: { id }, transaction: t });
    await markScheduleStale(t, { printIds: [id] });
    await recordAudit(
      { actor, action: 'print.moved', entityType: 'print', entityId: id, before: { location: before.location?.pathLabel ?? null }, after: { location: to.pathLabel, reason: body.reason }, requestId },
      t,
    );
    return presentPrint(await loadPrint(id, t), actor.role);
  });
}

export async function listMovements(id: string) {
  if ((await Print.count({ where: { id } })) === 0) throw notFound('The print');
  const rows = await Movement.findAll({
    where: { printId: id },
    include: [{ model: Location, as: 'from' }, { model: Location, as: 'to' }],
    order: [['movedAt', 'DESC']],
  });
  return rows.map(presentMovement);
}

const HISTORY_SUMMARY: Record<string, string> = {
  'print.created': 'Catalogued',
  'print.updated': 'Record edited',
  'print.steps_replaced': 'Process history edited',
  'print.moved': 'Moved',
  'print.imported': 'Imported from CSV',
  'print.rehoused': 'Rehoused',
  'print.added_to_round': 'Added to an inspection round',
  'print.added_to_exhibition': 'Added to an exhibition',
};

/** May the role read this key of a print's audit snapshot? Keys that are not fields of the table (steps) follow the record. */
function mayReadChange(role: Role | null, key: string): boolean {
  const field = printField(key);
  return !field || mayRead(role, field);
}

/**
 * The print's audit history as the role may read it: each change of a field the role may not read
 * (a valuation, for a conservator or researcher) is left out of the changes and of the summary, so
 * neither its value before nor after reaches the role.
 */
export async function printHistory(id: string, role: Role | null): Promise<HistoryEvent[]> {
  if ((await Print.count({ where: { id } })) === 0) throw notFound('The print');
  const events = await AuditEventModel.findAll({ where: { entityType: 'print', entityId: id }, order: [['id', 'DESC']] });
  return events.map((e) => {
    const all = e.action === 'print.created' || e.action === 'print.imported' ? [] : changedFields(e.before as Record<string, unknown>, e.after as Record<string, unknown>);
    const changes = all.filter((c) => mayReadChange(role, c.field));
    let summary = HISTORY_SUMMARY[e.action] ?? e.action;
    if (e.action === 'print.updated' && changes.length) summary = `Edited ${changes.map((c) => c.field).join(', ')}`;
    if (e.action === 'print.moved') summary = `Moved to ${(e.after as { location?: string })?.location ?? '?'}`;
    return { id: String(e.id), at: e.at.toISOString(), actorName: e.actorName, action: e.action, summary, changes };
  });
}

// ── The list: one SQL statement, built in print-list.service.ts (the benchmark runs the same text) ──

export { EXACT_COUNT_CAP, buildListSql, listPrints, presentListRow, toPrefixQuery, type ListSql } from './print-list.service';

/** Recomputes stored warnings for the prints matching a column value (after an enclosure type changes). */
export async function recomputeWarningsFor(column: 'enclosure_id', value: string, t: Transaction) {
  const prints = (await Print.findAll({
    where: { [column === 'enclosure_id' ? 'enclosureId' : column]: value },
    include: [{ model: EnclosureType, as: 'enclosure' }, { model: ProcessStep, as: 'steps' }],
    transaction: t,
  })) as LoadedPrint[];
  for (const p of prints) await storeWarnings(p, t);
  return prints.length;
}
