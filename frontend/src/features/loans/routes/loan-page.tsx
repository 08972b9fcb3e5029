import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { loansApi } from '@toneledger/common/api/loans';
import { can } from '@toneledger/common/domain/roles';
import { LOAN_DIRECTION_LABELS, LOAN_STATUS_LABELS, type LoanDetail } from '@toneledger/common/schemas/loans';
import { Button, buttonClasses } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PrintArea } from '@/components/ui/print-area';
import { urlOf } from '@/lib/api-client';
import { useMe } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useLoan } from '@/features/loans/api/get-loans';
import { AddPrints } from '@/features/loans/components/add-prints';
import { BorrowedPrintForm } from '@/features/loans/components/borrowed-print-form';
import { LoanDetails } from '@/features/loans/components/loan-details';
import { LoanObjects, objectsEditable } from '@/features/loans/components/loan-objects';
import { Blockers, StatusActions, StatusHistory } from '@/features/loans/components/loan-status';

/** The browser's print dialog; a seam so tests can see it was asked for. */
export const printer = {
  print(): void {
    window.print();
  },
};

function LoanView({ loan }: { loan: LoanDetail }) {
  const me = useMe();
  const [adding, setAdding] = useState<'prints' | 'borrowed' | null>(null);
  const mayWrite = can(me.role, 'loans.write');
  const canAdd = mayWrite && objectsEditable(loan);
  return (
    <article className="flex flex-col gap-5">
      <nav aria-label="Breadcrumb" className="text-sm print:hidden">
        <Link to="/loans">Loans</Link> <span aria-hidden="true">›</span> <span className="mono">{loan.reference}</span>
      </nav>
      <div className="flex flex-wrap items-end justify-between gap-3 border-b border-paper-300 pb-4">
        <div className="min-w-0">
          <h1 className="text-2xl sm:text-[1.75rem]">
            {LOAN_DIRECTION_LABELS[loan.direction]} <span className="mono">{loan.reference}</span>
          </h1>
          <p className="mt-1 text-sm text-ink-700">
            {loan.direction === 'out' ? 'To' : 'From'} {loan.otherInstitution} · {LOAN_STATUS_LABELS[loan.status]} · {loan.objectCount}{' '}
            {loan.objectCount === 1 ? 'print' : 'prints'}
          </p>
        </div>
        <div className="flex flex-wrap gap-2 print:hidden">
          {mayWrite ? (
            <Link to={`/loans/${loan.id}/edit`} className={buttonClasses()}>
              Edit
            </Link>
          ) : null}
          <a href={urlOf(loansApi.checklistCsv, { params: { id: loan.id } })} className={buttonClasses()} download>
            Checklist (CSV)
          </a>
          <Button onClick={() => printer.print()}>Print</Button>
        </div>
      </div>

      <Blockers loan={loan} />
      <StatusActions loan={loan} role={me.role} />

      <PrintArea className="flex flex-col gap-5">
        <LoanDetails loan={loan} />
        <LoanObjects loan={loan} role={me.role} />
        {canAdd ? (
          <div className="flex flex-col gap-2 print:hidden">
            {adding === null ? (
              <div className="flex flex-wrap gap-2">
                <Button onClick={() => setAdding('prints')}>Add prints</Button>
                {loan.direction === 'in' ? <Button onClick={() => setAdding('borrowed')}>Record a borrowed print</Button> : null}
              </div>
            ) : adding === 'prints' ? (
              <AddPrints loan={loan} role={me.role} onDone={() => setAdding(null)} />
            ) : (
              <BorrowedPrintForm loan={loan} onDone={() => setAdding(null)} />
            )}
          </div>
        ) : null}
        <StatusHistory loan={loan} />
      </PrintArea>
    </article>
  );
}

/** One loan: its fields, conditions, objects with their reports, status history and next steps. */
export function LoanPage() {
  const { id = '' } = useParams();
  const loan = useLoan(id);
  useDocumentTitle(loan.data ? `Loan ${loan.data.reference}` : 'Loan');
  if (loan.isPending) return <Loading label="Loading the loan…" />;
  if (loan.isError) return <ErrorNotice error={loan.error} title="The loan could not be loaded." />;
  return <LoanView loan={loan.data} />;
}
