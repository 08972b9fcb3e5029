import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { ReportLoan } from '@toneledger/common/schemas/condition';
import { formatDay } from '@/features/condition/utils/format';

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[9rem_1fr] gap-3 border-b border-paper-200 py-1 last:border-b-0">
      <dt className="text-xs font-semibold tracking-wide text-ink-700 uppercase">{term}</dt>
      <dd className="text-sm">{children}</dd>
    </div>
  );
}

/** The loan a report was made for, as the printed loan condition report gives it: parties, venue, dates, the conditions asked for. */
export function LoanBlock({ loan, conditions }: { loan: ReportLoan; conditions: string[] }) {
  return (
    <section aria-label="Loan" className="break-inside-avoid">
      <h2 className="mb-1 text-lg">Loan</h2>
      <dl className="rounded border border-paper-200 px-3 py-1">
        <Row term="Loan">
          <Link to={`/loans/${loan.id}`} className="mono print:no-underline">
            {loan.reference}
          </Link>
        </Row>
        <Row term="Lender">{loan.lender}</Row>
        <Row term="Borrower">{loan.borrower}</Row>
        <Row term="Venue">{loan.venue ?? '—'}</Row>
        <Row term="Dates">
          Dispatch {formatDay(loan.dispatchOn)} · opening {formatDay(loan.opensOn)} · closing {formatDay(loan.closesOn)} · return {formatDay(loan.returnOn)}
        </Row>
        <Row term="Conditions asked for">
          {conditions.length === 0 ? (
            'None recorded'
          ) : (
            <ul className="list-disc pl-5">
              {conditions.map((c) => (
                <li key={c}>{c}</li>
              ))}
            </ul>
          )}
        </Row>
      </dl>
    </section>
  );
}
