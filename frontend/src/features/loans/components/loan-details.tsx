import type { ReactNode } from 'react';
import { LOAN_DIRECTION_LABELS, LOAN_PURPOSE_LABELS, LOAN_STATUS_LABELS, type LoanDetail } from '@toneledger/common/schemas/loans';
import { formatDay } from '@/lib/format';
import { describeConditions } from '@/lib/loan-conditions';

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[10rem_1fr] gap-3 border-b border-paper-200 py-1 last:border-b-0">
      <dt className="text-xs font-semibold tracking-wide text-ink-700 uppercase">{term}</dt>
      <dd className="text-sm">{children}</dd>
    </div>
  );
}

const none = <span className="text-ink-600">—</span>;

/** Every field of a loan, and the conditions asked for in plain words. */
export function LoanDetails({ loan }: { loan: LoanDetail }) {
  const conditions = describeConditions(loan.conditions);
  return (
    <div className="grid gap-4 lg:grid-cols-2 print:grid-cols-2">
      <dl aria-label="Loan" className="rounded border border-paper-300 bg-white px-3 py-1">
        <Row term="Direction">{LOAN_DIRECTION_LABELS[loan.direction]}</Row>
        <Row term="Status">
          <strong>{LOAN_STATUS_LABELS[loan.status]}</strong>
        </Row>
        <Row term={loan.direction === 'out' ? 'Borrower' : 'Lender'}>{loan.otherInstitution}</Row>
        <Row term="Contact">
          {loan.contactName ?? none}
          {loan.contactEmail ? (
            <>
              {' '}
              · <a href={`mailto:${loan.contactEmail}`}>{loan.contactEmail}</a>
            </>
          ) : null}
        </Row>
        <Row term="Purpose">
          {LOAN_PURPOSE_LABELS[loan.purpose]}
          {loan.exhibition ? `: ${loan.exhibition.title}` : ''}
        </Row>
        <Row term="Venue">{loan.venue ?? none}</Row>
        <Row term="Courier">{loan.courier ?? none}</Row>
        <Row term="Credit line">{loan.creditLine ?? none}</Row>
        <Row term="Notes">{loan.notes ? <span className="whitespace-pre-line">{loan.notes}</span> : none}</Row>
      </dl>
      <div className="flex flex-col gap-4">
        <dl aria-label="Dates" className="rounded border border-paper-300 bg-white px-3 py-1">
          <Row term="Dispatch">{formatDay(loan.dispatchOn)}</Row>
          <Row term="Opening">{formatDay(loan.opensOn)}</Row>
          <Row term="Closing">{formatDay(loan.closesOn)}</Row>
          <Row term="Return">{formatDay(loan.returnOn)}</Row>
        </dl>
        <section aria-label="Conditions asked for" className="rounded border border-paper-300 bg-white px-3 py-2">
          <h2 className="mb-1 text-base">Conditions asked for</h2>
          {conditions.length === 0 ? (
            <p className="text-sm text-ink-700">None recorded.</p>
          ) : (
            <ul className="list-disc pl-5 text-sm">
              {conditions.map((c) => (
                <li key={c} className="whitespace-pre-line">
                  {c}
                </li>
              ))}
            </ul>
          )}
        </section>
      </div>
    </div>
  );
}
