import { Op, QueryTypes, type Transaction, type WhereOptions } from 'sequelize';
import { isPrussianBlue } from '@toneledger/common/domain/compatibility';
import { can, type Role } from '@toneledger/common/domain/roles';
import { WARNING_CODES } from '@toneledger/common/fields/print';
import type { PrintInput } from '@toneledger/common/schemas/catalogue';
import {
  LOAN_STATUS_LABELS, loanDateIssues, type LoanDetail, type LoanStatus, type borrowedPrintInputSchema, type loanInputSchema,
  type loanListQuerySchema, type loanObjectsInputSchema, type loanUpdateSchema,
} from '@toneledger/common/schemas/loans';
import type { z } from 'zod';
import { db } from '../db';
import { conflict, notFound, validationFailed } from '../errors';
import { Loan, LoanObject, LoanStatusChange } from '../models';
import { conditionColumns, presentLoan, presentStatusChange } from '../presenters/loan.presenter';
import { assertPrintEditable, assertPrintsEditable } from './print-lock';
import { recordAudit } from './audit.service';
import { blockersOf, displayApprovalsFor, overlappingLoans, REPORT_CONTEXT, signedReportsFor, spanOf } from './loan-rules';
import { insertPrint, type Actor } from './print.service';
import { markScheduleStale } from './schedule-stale';
import { changedFields, rethrowUnique, staleEdit } from './versioning';

/** Loans out and in: the record, its prints and their values, and the detail the loan page reads. Status changes: loan-status.service.ts. */

export const ENTITY = 'loan';
const DUPLICATE = 'Another loan already has this reference.';
/** Once the prints have left, what was agreed stays as it was. */
const LEFT = new Set<string>(['in_transit', 'on_loan', 'returned']);
const ENDED = new Set<string>(['returned', 'declined', 'cancelled']);

type LoanInput = z.infer<typeof loanInputSchema>;
type LoanUpdate = z.infer<typeof loanUpdateSchema>;

interface ObjectRow {
  print_id: string; accession_number: string; title: string; borrowed: boolean; insurance_value: string | null; currency: string | null;
  warning_codes: string[]; process: string; toner_classes: string[];
}

async function objectRows(loanId: string, t?: Transaction): Promise<ObjectRow[]> {
  return db().query<ObjectRow>(
    `SELECT o.print_id, p.accession_number, p.title, p.borrowed, o.insurance_value::text AS insurance_value, o.currency, p.warning_codes,
            p.process, p.toner_classes
       FROM loan_objects o JOIN prints p ON p.id = o.print_id WHERE o.loan_id = $1 ORDER BY o.position, p.accession_sort`,
    { bind: [loanId], type: QueryTypes.SELECT, transaction: t },
  );
}

/** The exhibition a loan is for, when the exhibitions table is there and has it. */
async function exhibitionOf(exhibitionId: string | null, t?: Transaction): Promise<{ id: string; title: string } | null> {
  if (!exhibitionId) return null;
  // Asked first, so a missing table never fails a query inside the caller's transaction.
  const [table] = await db().query<{ ok: boolean }>(`SELECT to_regclass('exhibitions') IS NOT NULL AS ok`, { type: QueryTypes.SELECT, transaction: t });
  if (!table.ok) return null;
  const [row] = await db().query<{ id: string; title: string }>('SELECT id, title FROM exhibitions WHERE id = $1', {
    bind: [exhibitionId], type: QueryTypes.SELECT, transaction: t,
  });
  return row ?? null;
}

async function checkExhibition(exhibitionId: string | null | undefined, t: Transaction) {
  if (exhibitionId && !(await exhibitionOf(exhibitionId, t))) throw validationFailed([{ path: 'exhibitionId', message: 'No such exhibition', code: 'not_found' }]);
}

function objectWarnings(loan: Loan, o: ObjectRow): { code: string; message: string }[] {
  const out = o.warning_codes.map((code) => ({ code, message: (WARNING_CODES.labels as Record<string, string>)[code] ?? code }));
  if (isPrussianBlue({ process: o.process as never, tonerClasses: o.toner_classes as never }) && !loan.noAlkalineBufferedMounts) {
    out.push({ code: 'buffered_mounts_not_excluded', message: 'Iron-blue image: the conditions do not rule out alkaline-buffered mounts' });
  }
  return out;
}

/** The loan page: the loan, its prints (values only for a role with `valuation.read`), its status history and what blocks its next step. */
export async function loanDetail(id: string, role: Role | null, t?: Transaction): Promise<LoanDetail> {
  const loan = await Loan.findByPk(id, { transaction: t });
  if (!loan) throw notFound('The loan');
  const [objects, history, reports, exhibition, display] = [
    await objectRows(id, t),
    await LoanStatusChange.findAll({ where: { loanId: id }, order: [['id', 'ASC']], transaction: t }),
    await signedReportsFor(id, t),
    await exhibitionOf(loan.exhibitionId, t),
    await displayApprovalsFor(loan, t),
  ];
  const values = can(role, 'valuation.read');
  const reportOf = (printId: string, end: 'departure' | 'back') => {
    const r = reports.get(printId)?.get(REPORT_CONTEXT[end][loan.direction]);
    return r ? { id: r.id, examinedOn: r.examinedOn, grade: r.grade } : null;
  };
  return {
    ...presentLoan(loan, objects.length, exhibition),
    objects: objects.map((o) => ({
      printId: o.print_id, accessionNumber: o.accession_number, printTitle: o.title, borrowed: o.borrowed,
      ...(values ? { insuranceValue: o.insurance_value === null ? null : Number(o.insurance_value), currency: o.currency } : {}),
      outgoingReport: reportOf(o.print_id, 'departure'), returningReport: reportOf(o.print_id, 'back'), warnings: objectWarnings(loan, o),
    })),
    statusHistory: history.map(presentStatusChange),
    blockers: blockersOf(loan, objects.map((o) => o.print_id), reports, display),
  };
}

/** What the audit trail keeps of a loan: the record and its prints with their values (the trail is read by administrators). */
async function snapshot(id: string, t: Transaction) {
  const { version: _v, createdAt: _c, updatedAt: _u, statusHistory: _h, blockers: _b, ...rest } = await loanDetail(id, 'admin', t);
  return { ...rest, objects: rest.objects.map(({ outgoingReport: _o, returningReport: _r, warnings: _w, ...o }) => o) } as Record<string, unknown>;
}

export async function listLoans(query: z.infer<typeof loanListQuerySchema>) {
  const where: WhereOptions<Loan>[] = [];
  if (query.direction) where.push({ direction: query.direction });
  if (query.status) where.push({ status: query.status });
  if (query.open === 'true') where.push({ status: { [Op.notIn]: [...ENDED] } });
  if (query.open === 'false') where.push({ status: { [Op.in]: [...ENDED] } });
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push({ [Op.or]: [{ reference: { [Op.iLike]: like } }, { otherInstitution: { [Op.iLike]: like } }, { venue: { [Op.iLike]: like } }] });
  }
  const { rows, count } = await Loan.findAndCountAll({
    where: { [Op.and]: where }, order: [['createdAt', 'DESC'], ['id', 'DESC']], limit: query.pageSize, offset: (query.page - 1) * query.pageSize,
  });
  const ids = rows.map((r) => r.id);
  const counts = new Map(
    (ids.length
      ? await db().query<{ loan_id: string; n: number }>('SELECT loan_id, count(*)::int AS n FROM loan_objects WHERE loan_id = ANY($1::uuid[]) GROUP BY loan_id', {
          bind: [ids], type: QueryTypes.SELECT,
        })
      : []
    ).map((r) => [r.loan_id, r.n]),
  );
  const data = [];
  for (const l of rows) data.push(presentLoan(l, counts.get(l.id) ?? 0, await exhibitionOf(l.exhibitionId)));
  return { data, total: count };
}

function loanColumns(input: Partial<LoanInput>): Partial<Loan> {
  const out: Record<string, unknown> = {};
  for (const key of [
    'direction', 'reference', 'otherInstitution', 'contactName', 'contactEmail', 'purpose', 'exhibitionId', 'venue', 'dispatchOn', 'opensOn',
    'closesOn', 'returnOn', 'courier', 'creditLine', 'notes',
  ] as const) {
    if (input[key] !== undefined) out[key] = input[key];
  }
  return { ...(out as Partial<Loan>), ...conditionColumns(input.conditions) };
}

/** The loan's conditions after an edit: the temperature and RH ranges are checked on the whole, not only on the keys sent. */
function rangeIssues(l: Pick<Loan, 'temperatureMinC' | 'temperatureMaxC' | 'rhMinPercent' | 'rhMaxPercent'>) {
  const issues = [];
  if (l.temperatureMinC != null && l.temperatureMaxC != null && l.temperatureMaxC < l.temperatureMinC) {
    issues.push({ path: 'conditions.temperatureMaxC', message: 'The highest temperature is at least the lowest', code: 'order' });
  }
  if (l.rhMinPercent != null && l.rhMaxPercent != null && l.rhMaxPercent < l.rhMinPercent) {
    issues.push({ path: 'conditions.rhMaxPercent', message: 'The highest RH is at least the lowest', code: 'order' });
  }
  return issues;
}

export async function createLoan(input: LoanInput, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    await checkExhibition(input.exhibitionId, t);
    const proposedOn = input.proposedOn ?? new Date().toISOString().slice(0, 10);
    // The latest calendar day anywhere (UTC+14): a proposal cannot be dated after it.
    if (proposedOn > new Date(Date.now() + 14 * 3_600_000).toISOString().slice(0, 10)) {
      throw validationFailed([{ path: 'proposedOn', message: 'The proposal has to have happened: the date cannot be in the future', code: 'future' }]);
    }
    let loan: Loan;
    try {
      loan = await Loan.create({ ...loanColumns(input), status: 'proposed' } as never, { transaction: t });
    } catch (err) {
      rethrowUnique(err, 'reference', DUPLICATE);
    }
    await LoanStatusChange.create(
      { loanId: loan.id, fromStatus: null, toStatus: 'proposed', onDate: proposedOn, note: null, byId: actor.id, byName: actor.name },
      { transaction: t },
    );
    await recordAudit({ actor, action: 'loan.created', entityType: ENTITY, entityId: loan.id, after: await snapshot(loan.id, t), requestId }, t);
    return loanDetail(loan.id, actor.role, t);
  });
}

/** Locks the loan at the version the person loaded (409 with the loan as it is now otherwise). */
export async function lockLoan(id: string, version: number, actor: Actor, t: Transaction): Promise<Loan> {
  const loan = await Loan.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
  if (!loan) throw notFound('The loan');
  if (loan.version !== version) throw await staleEdit(ENTITY, id, await loanDetail(id, actor.role, t), t);
  return loan;
}

const FIXED_ONCE_LEFT = ['dispatchOn', 'opensOn', 'closesOn', 'returnOn', 'conditions'] as const;

export async function updateLoan(id: string, update: LoanUpdate, actor: Actor, requestId: string | null) {
  const { version, ...changes } = update;
  return db().transaction(async (t) => {
    const loan = await lockLoan(id, version, actor, t);
    if (LEFT.has(loan.status) || ENDED.has(loan.status)) {
      const fixed = FIXED_ONCE_LEFT.filter((k) => changes[k] !== undefined);
      if (fixed.length) {
        throw conflict(`The dates and conditions of a loan are fixed once it is ${LOAN_STATUS_LABELS[loan.status as LoanStatus].toLowerCase()}.`,
          fixed.map((k) => ({ path: k, message: 'Fixed once the loan is in transit', code: 'fixed' })));
      }
    }
    await checkExhibition(changes.exhibitionId, t);
    const before = await snapshot(id, t);
    const next = { ...loan.get({ plain: true }), ...loanColumns(changes) } as Loan;
    const issues = [...loanDateIssues(next), ...rangeIssues(next)].map((i) => ({ code: 'order', ...i }));
    if (issues.length) throw validationFailed(issues);
    const datesChanged = (['dispatchOn', 'opensOn', 'closesOn', 'returnOn'] as const).some((k) => changes[k] !== undefined && changes[k] !== loan[k]);
    if (datesChanged && !ENDED.has(loan.status)) {
      const printIds = (await LoanObject.findAll({ where: { loanId: id }, attributes: ['printId'], transaction: t })).map((o) => o.printId);
      await refuseOverlaps(printIds, id, spanOf(next), t, (printId) => {
        const changed = (['dispatchOn', 'opensOn', 'closesOn', 'returnOn'] as const).filter((k) => changes[k] !== undefined);
        return changed.map((path) => ({ path, printId }));
      });
    }
    try {
      await Loan.update({ ...loanColumns(changes), version: loan.version + 1 } as never, { where: { id }, transaction: t });
    } catch (err) {
      rethrowUnique(err, 'reference', DUPLICATE);
    }
    const after = await snapshot(id, t);
    // A loan's dates fix its prints' checks before dispatch (inspection schedule).
    await markScheduleStale(t, { printIds: (await LoanObject.findAll({ where: { loanId: id }, attributes: ['printId'], transaction: t })).map((o) => o.printId) });
    if (changedFields(before, after).length) await recordAudit({ actor, action: 'loan.updated', entityType: ENTITY, entityId: id, before, after, requestId }, t);
    return loanDetail(id, actor.role, t);
  });
}

/** 409 when any of the prints is on another live loan at the same time, each print and the field to change named. */
async function refuseOverlaps(
  printIds: string[], loanId: string, span: [string | null, string | null], t: Transaction, pathsOf: (printId: string) => { path: string; printId: string }[],
) {
  const clashes = await overlappingLoans(printIds, loanId, span, t);
  if (!clashes.length) return;
  const printIdsClashing = [...new Set(clashes.map((c) => c.printId))];
  const refs = [...new Set(clashes.map((c) => c.reference))];
  throw conflict(
    `${printIdsClashing.length === 1 ? 'A print is' : `${printIdsClashing.length} prints are`} on another loan at the same time (${refs.join(', ')}).`,
    clashes.flatMap((c) => pathsOf(c.printId).map(({ path, printId }) => ({
      path, printId, message: `On loan ${c.reference} at the same time`, code: 'overlap',
    }))),
  );
}

function refuseIfLeft(loan: Loan) {
  if (LEFT.has(loan.status) || ENDED.has(loan.status)) {
    throw conflict(`Prints can be added to or taken off a loan only before it is in transit; this loan is ${LOAN_STATUS_LABELS[loan.status as LoanStatus].toLowerCase()}.`);
  }
}

/** Adds prints to the loan or changes their values; prints already on it and not named stay. */
export async function setLoanObjects(id: string, body: z.infer<typeof loanObjectsInputSchema>, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    const loan = await lockLoan(id, body.version, actor, t);
    refuseIfLeft(loan);
    const printIds = body.objects.map((o) => o.printId);
    const seen = new Map<string, number>();
    const issues: { path: string; message: string; code: string }[] = [];
    body.objects.forEach((o, i) => {
      if (seen.has(o.printId)) issues.push({ path: `objects.${i}.printId`, message: 'This print is listed twice', code: 'duplicate' });
      seen.set(o.printId, i);
    });
    const found = new Set(
      (await db().query<{ id: string }>('SELECT id FROM prints WHERE id = ANY($1::uuid[])', { bind: [printIds], type: QueryTypes.SELECT, transaction: t })).map((r) => r.id),
    );
    body.objects.forEach((o, i) => {
      if (!found.has(o.printId)) issues.push({ path: `objects.${i}.printId`, message: 'No such print', code: 'not_found' });
    });
    if (issues.length) throw validationFailed(issues);
    await assertPrintsEditable(printIds, t);
    await refuseOverlaps(printIds, id, spanOf(loan), t, (printId) => [{ path: `objects.${seen.get(printId)}.printId`, printId }]);
    const before = await snapshot(id, t);
    const existing = new Map((await LoanObject.findAll({ where: { loanId: id }, transaction: t })).map((o) => [o.printId, o]));
    let position = Math.max(0, ...[...existing.values()].map((o) => o.position));
    for (const o of body.objects) {
      const current = existing.get(o.printId);
      const values: Partial<LoanObject> = {};
      if (o.insuranceValue !== undefined) values.insuranceValue = o.insuranceValue;
      if (o.currency !== undefined) values.currency = o.currency;
      if (current) await LoanObject.update(values, { where: { loanId: id, printId: o.printId }, transaction: t });
      else {
        position += 1;
        await LoanObject.create(
          { loanId: id, printId: o.printId, position, insuranceValue: values.insuranceValue ?? null, currency: values.currency ?? null, homeLocationId: null },
          { transaction: t },
        );
      }
    }
    await Loan.update({ version: loan.version + 1 }, { where: { id }, transaction: t });
    await markScheduleStale(t, { printIds });
    const after = await snapshot(id, t);
    if (changedFields(before, after).length) await recordAudit({ actor, action: 'loan.objects_set', entityType: ENTITY, entityId: id, before, after, requestId }, t);
    return loanDetail(id, actor.role, t);
  });
}

export async function removeLoanObject(id: string, printId: string, version: number, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    const loan = await lockLoan(id, version, actor, t);
    refuseIfLeft(loan);
    await assertPrintEditable(printId, t);
    const before = await snapshot(id, t);
    const n = await LoanObject.destroy({ where: { loanId: id, printId }, transaction: t });
    if (!n) throw notFound('The print on this loan');
    await markScheduleStale(t, { printIds: [printId] });
    await Loan.update({ version: loan.version + 1 }, { where: { id }, transaction: t });
    await recordAudit({ actor, action: 'loan.object_removed', entityType: ENTITY, entityId: id, before, after: await snapshot(id, t), requestId }, t);
    return loanDetail(id, actor.role, t);
  });
}

/**
 * A print lent to the collection: a print record of its own, marked borrowed, with the lender's
 * number (not checked against the institution's accession pattern), put on this loan in.
 */
export async function addBorrowedPrint(id: string, body: z.infer<typeof borrowedPrintInputSchema>, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    const loan = await lockLoan(id, body.version, actor, t);
    if (loan.direction !== 'in') throw conflict('Only a loan in holds borrowed prints; add the collection\'s own prints to a loan out.');
    refuseIfLeft(loan);
    const before = await snapshot(id, t);
    const print = await insertPrint({ ...(body.print as PrintInput), accessionNumber: body.print.accessionNumber.trim() }, actor, requestId, t, { borrowed: true });
    const position = ((await LoanObject.max<number, LoanObject>('position', { where: { loanId: id }, transaction: t })) ?? 0) + 1;
    await LoanObject.create({ loanId: id, printId: print.id, position, insuranceValue: null, currency: null, homeLocationId: null }, { transaction: t });
    await Loan.update({ version: loan.version + 1 }, { where: { id }, transaction: t });
    await recordAudit({ actor, action: 'loan.borrowed_added', entityType: ENTITY, entityId: id, before, after: await snapshot(id, t), requestId }, t);
    return print;
  });
}
