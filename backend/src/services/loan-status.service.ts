import type { Transaction } from 'sequelize';
import { LOAN_NEXT, LOAN_STATUS_LABELS, type LoanStatus, type loanStatusInputSchema } from '@toneledger/common/schemas/loans';
import type { z } from 'zod';
import { db } from '../db';
import { conflict, validationFailed } from '../errors';
import { Loan, LoanObject, LoanStatusChange, Location, Print } from '../models';
import { recordAudit } from './audit.service';
import { blockersFor, displayApprovalsFor, signedReportsFor } from './loan-rules';
import { ENTITY, loanDetail, lockLoan } from './loan.service';
import { moveForLoan, type Actor } from './print.service';
import { markScheduleStale } from './schedule-stale';

/** The top-level place a print lent out is recorded at, one child per borrowing institution. */
export const AWAY_ON_LOAN = 'Away on loan';

/** Steps that record something that has happened, so their day cannot be in the future. */
const HAPPENED = new Set<LoanStatus>(['in_transit', 'on_loan', 'returned']);

/** The latest date it is anywhere on Earth now (UTC+14), so a registrar far east of the server is never refused today. */
function latestToday(): string {
  return new Date(Date.now() + 14 * 3_600_000).toISOString().slice(0, 10);
}

const label = (s: string) => LOAN_STATUS_LABELS[s as LoanStatus].toLowerCase();

/** Finds or makes "Away on loan › <institution>" (kind other), where a print lent out is recorded while away. */
async function awayLocation(institution: string, actor: Actor, requestId: string | null, t: Transaction): Promise<Location> {
  const make = async (name: string, parent: Location | null) => {
    const found = await Location.findOne({ where: { name, parentId: parent?.id ?? null }, transaction: t, order: [['createdAt', 'ASC']] });
    if (found) return found;
    const made = await Location.create(
      { name, kind: 'other', parentId: parent?.id ?? null, code: null, notes: 'Made by a loan out', pathLabel: parent ? `${parent.pathLabel} › ${name}` : name },
      { transaction: t },
    );
    await recordAudit({ actor, action: 'location.created', entityType: 'location', entityId: made.id, after: { name, pathLabel: made.pathLabel }, requestId }, t);
    return made;
  };
  return make(institution, await make(AWAY_ON_LOAN, null));
}

/**
 * Moves a loan to its next state, dated. The order is LOAN_NEXT's; each step needs what
 * `blockersFor` asks (prints on the loan, signed reports made for it, and for a loan out for an
 * exhibition each print approved for display there). A loan out takes its prints
 * with it: at in transit each print goes on loan and is moved to the borrower's place, at returned
 * it comes back to where it was and is in store again, each as a recorded movement.
 */
export async function changeLoanStatus(id: string, body: z.infer<typeof loanStatusInputSchema>, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    const loan = await lockLoan(id, body.version, actor, t);
    const from = loan.status as LoanStatus;
    const allowed = LOAN_NEXT[from];
    if (!allowed.includes(body.to)) {
      throw conflict(
        allowed.length
          ? `A loan that is ${label(from)} can go to ${allowed.map(label).join(', ')} next, not ${label(body.to)}.`
          : `A loan that is ${label(from)} is finished; its status no longer changes.`,
        { from, allowed },
      );
    }
    const on = body.on ?? new Date().toISOString().slice(0, 10);
    if (HAPPENED.has(body.to) && on > latestToday()) throw validationFailed([{ path: 'on', message: 'This step has to have happened: the date cannot be in the future', code: 'future' }]);
    // Not checked against the previous change's day: a loan recorded after the fact has its proposal dated the day it was entered.

    const objects = await LoanObject.findAll({ where: { loanId: id }, order: [['position', 'ASC']], transaction: t });
    const blockers = blockersFor(loan, body.to, objects.map((o) => o.printId), await signedReportsFor(id, t), await displayApprovalsFor(loan, t));
    if (blockers.length) {
      // Every reason at once, so the registrar sees all that is left to do; the prints in the loan's order.
      const named = new Set(blockers.flatMap((b) => b.printIds));
      throw conflict(blockers.map((b) => b.message).join(' '), { to: body.to, printIds: objects.map((o) => o.printId).filter((p) => named.has(p)) });
    }

    // The prints move on the day the step happened: now when that is today, else at noon UTC of that day.
    const movedAt = on === new Date().toISOString().slice(0, 10) ? new Date() : new Date(`${on}T12:00:00Z`);
    if (loan.direction === 'out' && body.to === 'in_transit') await sendOut(loan, objects, movedAt, actor, requestId, t);
    if (loan.direction === 'out' && body.to === 'returned') await bringBack(loan, objects, movedAt, actor, requestId, t);

    await Loan.update({ status: body.to, version: loan.version + 1 }, { where: { id }, transaction: t });
    // A loan that will still leave fixes a check before dispatch; one that left, ended or was cancelled no longer does.
    await markScheduleStale(t, { printIds: objects.map((o) => o.printId) });
    await LoanStatusChange.create({ loanId: id, fromStatus: from, toStatus: body.to, onDate: on, note: body.note ?? null, byId: actor.id, byName: actor.name }, { transaction: t });
    await recordAudit(
      { actor, action: 'loan.status_changed', entityType: ENTITY, entityId: id, before: { status: from }, after: { status: body.to, on, note: body.note ?? null }, requestId },
      t,
    );
    return loanDetail(id, actor.role, t);
  });
}

async function sendOut(loan: Loan, objects: LoanObject[], movedAt: Date, actor: Actor, requestId: string | null, t: Transaction) {
  const away = await awayLocation(loan.otherInstitution, actor, requestId, t);
  for (const o of objects) {
    const print = await Print.findByPk(o.printId, { attributes: ['id', 'locationId'], transaction: t });
    await LoanObject.update({ homeLocationId: print?.locationId ?? null }, { where: { loanId: o.loanId, printId: o.printId }, transaction: t });
    await moveForLoan(o.printId, away.id, 'on_loan', `Sent on loan ${loan.reference} to ${loan.otherInstitution}`, movedAt, actor, requestId, t);
  }
}

async function bringBack(loan: Loan, objects: LoanObject[], movedAt: Date, actor: Actor, requestId: string | null, t: Transaction) {
  for (const o of objects) {
    const reason = `Back from loan ${loan.reference} (${loan.otherInstitution})`;
    if (o.homeLocationId) await moveForLoan(o.printId, o.homeLocationId, 'in_store', reason, movedAt, actor, requestId, t);
    else {
      // A print that had no place before it left keeps the borrower's place until someone moves it; it is in store again.
      const print = await Print.findByPk(o.printId, { transaction: t });
      if (print?.locationId) await moveForLoan(o.printId, print.locationId, 'in_store', reason, movedAt, actor, requestId, t);
    }
  }
}
