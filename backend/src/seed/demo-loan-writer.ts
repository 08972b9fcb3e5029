import { reportInputSchema } from '@toneledger/common/schemas/condition';
import { borrowedPrintInputSchema, loanInputSchema, loanObjectsInputSchema, loanStatusInputSchema, type LoanConditions, type LoanStatus } from '@toneledger/common/schemas/loans';
import { printInputSchema } from '@toneledger/common/schemas/catalogue';
import { approvalInputSchema } from '@toneledger/common/schemas/exhibitions';
import { ConditionReport, ExhibitionObject, Loan, LoanObject, Print } from '../models';
import { decideObject } from '../services/exhibition.service';
import { createReport, signReport } from '../services/condition.service';
import { addBorrowedPrint, createLoan, setLoanObjects } from '../services/loan.service';
import { changeLoanStatus } from '../services/loan-status.service';
import type { Actor as PrintActor } from '../services/print.service';
import { rngFor } from './demo-condition';

/**
 * The writer of the demo's loans (plans in demo-loans.ts): the loan (matched by reference), its
 * prints or borrowed prints, then each status step in order with the conservator's signed reports
 * the step needs, and before a loan out for an exhibition leaves, the conservator's approval of its
 * prints for display there, all through the loan, condition and exhibition services. A loan an
 * interrupted seed began is completed from where it stands.
 */

/** A demo person acting through the services (a signed-in user, so with an id). */
export type Actor = PrintActor & { id: string; name: string };


export interface LoanPlan {
  reference: string;
  direction: 'out' | 'in';
  otherInstitution: string;
  contactName: string;
  contactEmail: string;
  purpose: 'exhibition' | 'research';
  exhibition: string | null;
  venue: string | null;
  dispatchOn: string;
  opensOn: string;
  closesOn: string;
  returnOn: string;
  courier: string | null;
  conditions: LoanConditions;
  creditLine: string | null;
  notes: string | null;
  prints: string[];
  borrowed: { accessionNumber: string; title: string; dateMade: string }[];
  steps: { to: LoanStatus; on: string; note?: string }[];
  /** The day the conservator examines the prints for each report the steps need. */
  examined: Partial<Record<'outgoing_loan' | 'returning_loan' | 'incoming', string>>;
}

/** The report each step needs, by direction (loan-rules.ts holds the rule; the seed only meets it). */
const NEEDS: Record<'out' | 'in', Partial<Record<LoanStatus, 'outgoing_loan' | 'returning_loan' | 'incoming'>>> = {
  out: { in_transit: 'outgoing_loan', returned: 'returning_loan' },
  in: { on_loan: 'incoming', returned: 'outgoing_loan' },
};

async function loanVersion(id: string): Promise<number> {
  return (await Loan.findByPk(id, { attributes: ['version'] }))!.version;
}

/** Writes one planned loan (or completes it): the record, its prints, then each status step with the signed reports it needs. */
export async function writeLoan(plan: LoanPlan, exhibitionId: string | null, registrar: Actor, conservator: Actor, signal?: AbortSignal) {
  signal?.throwIfAborted();
  let loan = await Loan.findOne({ where: { reference: plan.reference }, attributes: ['id'] });
  const created = !loan;
  if (!loan) {
    const { prints: _p, borrowed: _b, steps: _s, examined: _e, exhibition: _x, ...fields } = plan;
    // Proposed three weeks before its first step (never after today), as a loan entered after the fact would be.
    const first = plan.steps[0]?.on;
    const today = new Date().toISOString().slice(0, 10);
    const before = first ? new Date(Date.parse(`${first}T00:00:00Z`) - 21 * 86_400_000).toISOString().slice(0, 10) : today;
    const proposedOn = before < today ? before : today;
    const made = await createLoan(loanInputSchema.parse({ ...fields, exhibitionId, proposedOn }), registrar, 'seed');
    loan = { id: made.id } as Loan;
  }
  const id = loan.id;
  const on = await LoanObject.findAll({ where: { loanId: id }, attributes: ['printId'] });
  const onIds = new Set(on.map((o) => o.printId));
  const r = rngFor(plan.reference, 'loan');
  const missing = plan.prints.filter((p) => !onIds.has(p));
  if (missing.length) {
    signal?.throwIfAborted();
    await setLoanObjects(
      id,
      loanObjectsInputSchema.parse({ objects: missing.map((printId) => ({ printId, insuranceValue: r.int(8, 90) * 100, currency: 'GBP' })), version: await loanVersion(id) }),
      registrar,
      'seed',
    );
  }
  const printIds = [...plan.prints];
  if (plan.borrowed.length) {
    const have = new Map((await Print.findAll({ where: { id: [...onIds] }, attributes: ['id', 'accessionNumber'] })).map((p) => [p.accessionNumber, p.id]));
    for (const b of plan.borrowed) {
      let printId = have.get(b.accessionNumber);
      if (!printId) {
        signal?.throwIfAborted();
        const print = printInputSchema.omit({ locationId: true }).parse({
          accessionNumber: b.accessionNumber, title: b.title, dateMade: b.dateMade, process: 'gelatin_silver_developing_out', support: 'fibre_baryta', status: 'in_store',
          creditLine: plan.creditLine,
        });
        printId = (await addBorrowedPrint(id, borrowedPrintInputSchema.parse({ print, version: await loanVersion(id) }), registrar, 'seed')).id;
      }
      printIds.push(printId);
    }
  }
  let reports = 0;
  const current = (await Loan.findByPk(id, { attributes: ['status'] }))!.status as LoanStatus;
  const order: LoanStatus[] = ['proposed', ...plan.steps.map((s) => s.to)];
  for (const step of plan.steps.slice(order.indexOf(current))) {
    const context = NEEDS[plan.direction][step.to];
    if (context) reports += await signedReports(id, plan, printIds, context, conservator, signal);
    if (plan.direction === 'out' && step.to === 'in_transit' && exhibitionId) await approvedForDisplay(exhibitionId, printIds, conservator, signal);
    signal?.throwIfAborted();
    await changeLoanStatus(id, loanStatusInputSchema.parse({ to: step.to, on: step.on, note: step.note ?? null, version: await loanVersion(id) }), registrar, 'seed');
  }
  return { created, reports, printIds };
}

/**
 * The conservator approves for display the loan's prints still waiting on the exhibition's object
 * list (loan-rules.ts holds the rule: a loan out for an exhibition leaves only with them approved).
 * A print the plan left off the list, or refused, stays so and the dispatch fails loudly.
 */
async function approvedForDisplay(exhibitionId: string, printIds: string[], conservator: Actor, signal?: AbortSignal) {
  const waiting = await ExhibitionObject.findAll({ where: { exhibitionId, printId: printIds, approval: 'pending' }, attributes: ['printId'], order: [['printId', 'ASC']] });
  for (const o of waiting) {
    signal?.throwIfAborted();
    await decideObject(exhibitionId, o.printId, approvalInputSchema.parse({ decision: 'approved' }), conservator, 'seed');
  }
}

const SUMMARIES: Record<'outgoing_loan' | 'returning_loan' | 'incoming', (p: LoanPlan) => string> = {
  outgoing_loan: (p) => `Examined before packing for loan ${p.reference} to ${p.otherInstitution}. No change since the last examination; fit to travel.`,
  returning_loan: (p) => `Examined on return from ${p.otherInstitution} after 24 hours' acclimatisation in the crate. Condition as it left; no new damage.`,
  incoming: (p) => `Examined on arrival from ${p.otherInstitution}, with the lender's registrar. Agrees with the lender's outgoing report.`,
};

/** The conservator's signed report of each print for this loan and step, made when missing and signed when left as a draft. */
async function signedReports(
  loanId: string, plan: LoanPlan, printIds: string[], context: 'outgoing_loan' | 'returning_loan' | 'incoming', conservator: Actor, signal?: AbortSignal,
): Promise<number> {
  let made = 0;
  for (const printId of printIds) {
    let report: { id: string; version: number; status: string } | null = await ConditionReport.findOne({ where: { loanId, printId, context }, attributes: ['id', 'version', 'status'] });
    if (!report) {
      signal?.throwIfAborted();
      report = await createReport(
        printId,
        reportInputSchema.parse({
          examinedOn: plan.examined[context], context, grade: 'good', summary: SUMMARIES[context](plan),
          recommendations: context === 'outgoing_loan' ? 'Pack face up in a sink mat inside the crate; the courier checks it on arrival and before return.' : null,
          loanId,
        }),
        conservator,
        'seed',
      );
      made += 1;
    }
    if (report.status !== 'signed') {
      signal?.throwIfAborted();
      await signReport(report.id, report.version, conservator, 'seed');
    }
  }
  return made;
}
