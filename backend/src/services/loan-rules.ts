import { QueryTypes, type Transaction } from 'sequelize';
import type { LoanDetail, LoanStatus } from '@toneledger/common/schemas/loans';
import { LOAN_NEXT } from '@toneledger/common/schemas/loans';
import { db } from '../db';
import type { Loan } from '../models';

/**
 * The rules a loan holds, apart from the HTTP and the transaction around them:
 * which signed condition report each step needs, the approval for display a loan out for an
 * exhibition needs before it leaves, what stands in the way of the next step, and whether a print
 * is on another loan at the same time.
 */

type Direction = 'out' | 'in';

/**
 * The condition report each end of a loan needs, made for this loan and signed. A loan out: outgoing
 * as the print leaves, returning when it comes back. A loan in: incoming when it arrives, outgoing
 * when it is sent back to the lender.
 */
export const REPORT_CONTEXT: Record<'departure' | 'back', Record<Direction, string>> = {
  departure: { out: 'outgoing_loan', in: 'incoming' },
  back: { out: 'returning_loan', in: 'outgoing_loan' },
};

/** The step that needs each report: a loan out leaves at in_transit; a loan in arrives at on_loan. Both end at returned. */
export const STEP_NEEDS: Record<Direction, Partial<Record<LoanStatus, 'departure' | 'back'>>> = {
  out: { in_transit: 'departure', returned: 'back' },
  in: { on_loan: 'departure', returned: 'back' },
};

const CONTEXT_WORDS: Record<string, string> = { outgoing_loan: 'outgoing', incoming: 'incoming', returning_loan: 'returning' };

export interface SignedReport { id: string; printId: string; context: string; examinedOn: string; grade: string | null }

/** The latest signed report of each context per print, made for this loan. */
export async function signedReportsFor(loanId: string, t?: Transaction): Promise<Map<string, Map<string, SignedReport>>> {
  const rows = await db().query<{ id: string; print_id: string; context: string; examined_on: string; grade: string | null }>(
    `SELECT DISTINCT ON (print_id, context) id, print_id, context, examined_on::text AS examined_on, grade
       FROM condition_reports WHERE loan_id = $1 AND status = 'signed'
      ORDER BY print_id, context, examined_on DESC, signed_at DESC`,
    { bind: [loanId], type: QueryTypes.SELECT, transaction: t },
  );
  const out = new Map<string, Map<string, SignedReport>>();
  for (const r of rows) {
    const byContext = out.get(r.print_id) ?? new Map<string, SignedReport>();
    byContext.set(r.context, { id: r.id, printId: r.print_id, context: r.context, examinedOn: r.examined_on, grade: r.grade });
    out.set(r.print_id, byContext);
  }
  return out;
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * A loan out for an exhibition: the exhibition's title and, for each print on its object list, the
 * conservator's decision on showing it there. Null when the rule does not apply (a loan in, another
 * purpose, no exhibition named).
 */
export interface DisplayApprovals { title: string; approval: Map<string, 'pending' | 'approved' | 'refused'> }

export async function displayApprovalsFor(
  loan: Pick<Loan, 'direction' | 'purpose' | 'exhibitionId'>, t?: Transaction,
): Promise<DisplayApprovals | null> {
  if (loan.direction !== 'out' || loan.purpose !== 'exhibition' || !loan.exhibitionId) return null;
  // Asked first, so a missing table never fails a query inside the caller's transaction.
  const [table] = await db().query<{ ok: boolean }>(`SELECT to_regclass('exhibition_objects') IS NOT NULL AS ok`, { type: QueryTypes.SELECT, transaction: t });
  if (!table.ok) return null;
  const [exhibition] = await db().query<{ title: string }>('SELECT title FROM exhibitions WHERE id = $1', {
    bind: [loan.exhibitionId], type: QueryTypes.SELECT, transaction: t,
  });
  if (!exhibition) return null;
  const rows = await db().query<{ print_id: string; approval: 'pending' | 'approved' | 'refused' }>(
    'SELECT print_id, approval FROM exhibition_objects WHERE exhibition_id = $1',
    { bind: [loan.exhibitionId], type: QueryTypes.SELECT, transaction: t },
  );
  return { title: exhibition.title, approval: new Map(rows.map((r) => [r.print_id, r.approval])) };
}

type Blocker = LoanDetail['blockers'][number];

/**
 * What stands between a loan out for an exhibition and its dispatch: each print has to be on the
 * exhibition's object list and approved for display there by a conservator. Prints not on the list,
 * waiting for a decision and refused are named apart, as each asks something different.
 */
function displayBlockers(to: LoanStatus, printIds: string[], display: DisplayApprovals): Blocker[] {
  const of = (state: 'missing' | 'pending' | 'refused') => printIds.filter((id) => (display.approval.get(id) ?? 'missing') === state);
  const out: Blocker[] = [];
  const missing = of('missing');
  if (missing.length) out.push({ to, message: `${plural(missing.length, 'print is', 'prints are')} not on the object list of ${display.title}.`, printIds: missing });
  const pending = of('pending');
  if (pending.length) out.push({ to, message: `${plural(pending.length, 'print is', 'prints are')} not approved for display in ${display.title} by a conservator.`, printIds: pending });
  const refused = of('refused');
  if (refused.length) out.push({ to, message: `${plural(refused.length, 'print was', 'prints were')} refused for display in ${display.title} by a conservator.`, printIds: refused });
  return out;
}

/**
 * What is missing for the loan to move to `to`, in plain words with the prints concerned; none when
 * nothing is: prints before it is agreed, the signed reports each end needs, and for a loan out for
 * an exhibition (`display`, from displayApprovalsFor) the conservator's approval for display before it leaves.
 */
export function blockersFor(
  loan: Pick<Loan, 'direction'>, to: LoanStatus, printIds: string[], reports: Map<string, Map<string, SignedReport>>, display: DisplayApprovals | null,
): Blocker[] {
  if (to === 'agreed' && printIds.length === 0) return [{ to, message: 'The loan has no prints; add the prints before it is agreed.', printIds: [] }];
  const out: Blocker[] = [];
  const end = STEP_NEEDS[loan.direction][to];
  if (end) {
    const context = REPORT_CONTEXT[end][loan.direction];
    const missing = printIds.filter((id) => !reports.get(id)?.has(context));
    if (missing.length) {
      const has = missing.length === 1 ? 'has' : 'have';
      out.push({ to, message: `${plural(missing.length, 'print', 'prints')} ${has} no signed ${CONTEXT_WORDS[context]} condition report for this loan.`, printIds: missing });
    }
  }
  if (display && loan.direction === 'out' && to === 'in_transit') out.push(...displayBlockers(to, printIds, display));
  return out;
}

/** Every forward step open to the loan now, with what stands in its way. */
export function blockersOf(
  loan: Pick<Loan, 'direction' | 'status'>, printIds: string[], reports: Map<string, Map<string, SignedReport>>, display: DisplayApprovals | null,
): LoanDetail['blockers'] {
  return LOAN_NEXT[loan.status as LoanStatus]
    .filter((to) => to !== 'declined' && to !== 'cancelled')
    .flatMap((to) => blockersFor(loan, to, printIds, reports, display));
}

/** Loans that count when a print is asked for twice: those not declined, cancelled or returned. */
const LIVE = `l.status NOT IN ('declined', 'cancelled', 'returned')`;

export interface LoanSpan { dispatchOn: string | null; opensOn: string | null; closesOn: string | null; returnOn: string | null }

/** A loan's span: from dispatch (or opening) to return (or closing), both days included; a missing end is open. */
export function spanOf(l: LoanSpan): [string | null, string | null] {
  return [l.dispatchOn ?? l.opensOn, l.returnOn ?? l.closesOn];
}

/** The prints among `printIds` that are on another live loan whose span meets `span`, with that loan's reference. */
export async function overlappingLoans(
  printIds: string[], loanId: string, span: [string | null, string | null], t: Transaction,
): Promise<{ printId: string; reference: string }[]> {
  if (!printIds.length) return [];
  return db().query<{ printId: string; reference: string }>(
    `SELECT o.print_id AS "printId", l.reference FROM loan_objects o JOIN loans l ON l.id = o.loan_id
      WHERE o.print_id = ANY($1::uuid[]) AND l.id <> $2 AND ${LIVE}
        AND daterange(COALESCE(l.dispatch_on, l.opens_on), COALESCE(l.return_on, l.closes_on), '[]') && daterange($3::date, $4::date, '[]')
      ORDER BY l.reference`,
    { bind: [printIds, loanId, span[0], span[1]], type: QueryTypes.SELECT, transaction: t },
  );
}
