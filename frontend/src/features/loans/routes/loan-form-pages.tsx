import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useLoan } from '@/features/loans/api/get-loans';
import { LoanCreateForm, LoanEditForm } from '@/features/loans/components/loan-form';

/** A new loan, proposed by a registrar (`?direction=in` starts a loan in). */
export function LoanCreatePage() {
  useDocumentTitle('New loan');
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const direction = params.get('direction') === 'in' ? 'in' : 'out';
  return (
    <section>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to="/loans">Loans</Link>
      </nav>
      <PageHeader title="New loan" description="The loan starts as proposed; add its prints once it is saved." />
      <LoanCreateForm direction={direction} onSaved={(loan) => navigate(`/loans/${loan.id}`, { replace: true })} onCancel={() => navigate('/loans')} />
    </section>
  );
}

export function LoanEditPage() {
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const loan = useLoan(id);
  useDocumentTitle(loan.data ? `Edit loan ${loan.data.reference}` : 'Edit loan');
  if (loan.isPending) return <Loading label="Loading the loan…" />;
  if (loan.isError) return <ErrorNotice error={loan.error} title="The loan could not be loaded." />;
  return (
    <section>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to="/loans">Loans</Link> <span aria-hidden="true">›</span>{' '}
        <Link to={`/loans/${id}`} className="mono">
          {loan.data.reference}
        </Link>
      </nav>
      <PageHeader title={`Edit loan ${loan.data.reference}`} description="Dates and conditions are fixed once the loan is in transit." />
      <LoanEditForm loan={loan.data} onSaved={(saved) => navigate(`/loans/${saved.id}`)} onCancel={() => navigate(`/loans/${id}`)} />
    </section>
  );
}
