import type { ConditionReport } from '@toneledger/common/schemas/condition';

const LOAN_CONTEXTS = new Set<ConditionReport['context']>(['outgoing_loan', 'returning_loan']);

export function isLoanContext(context: ConditionReport['context']): boolean {
  return LOAN_CONTEXTS.has(context);
}

function Party({ role, name }: { role: string; name?: string }) {
  return (
    <div className="flex flex-col gap-5 break-inside-avoid" role="group" aria-label={`${role} signature`}>
      <p className="font-semibold">{role}</p>
      <p className="border-b border-ink-700 pb-0.5">Name: {name ?? ''}</p>
      <p className="border-b border-ink-700 pb-0.5">Signature:</p>
      <p className="border-b border-ink-700 pb-0.5">Date:</p>
    </div>
  );
}

/** Lines to sign on paper: lender and borrower for a loan (named from the report's loan when it has one), the examiner otherwise. */
export function SignatureBlock({ report }: { report: ConditionReport }) {
  return (
    <section aria-label="Signatures" className="mt-6 grid gap-8 text-sm sm:grid-cols-2 print:grid-cols-2">
      {isLoanContext(report.context) || report.loan ? (
        <>
          <Party role="Lender" name={report.loan?.lender} />
          <Party role="Borrower" name={report.loan?.borrower} />
        </>
      ) : (
        <Party role="Examiner" name={report.examinerName} />
      )}
    </section>
  );
}
