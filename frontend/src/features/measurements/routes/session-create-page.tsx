import { Link, useNavigate, useParams } from 'react-router-dom';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { isApiError } from '@/lib/api-client';
import { usePrint } from '@/lib/prints-api';
import { useDocumentTitle } from '@/lib/use-document-title';
import { usePrintMeasurements } from '@/features/measurements/api/get-print-measurements';
import { SessionForm } from '@/features/measurements/components/session-form';
import { identityLine } from '@/features/measurements/utils/format';

/** Records a measurement session at one print, then goes back to the print's measurements. */
export function SessionCreatePage() {
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const print = usePrint(id);
  const measurements = usePrintMeasurements(id);
  useDocumentTitle(print.data ? `New session · ${print.data.accessionNumber}` : 'New session');
  const back = `/measurements/prints/${id}`;

  const error = print.error ?? measurements.error;
  if (error) {
    const missing = isApiError(error) && error.code === 'not_found';
    return (
      <section className="max-w-2xl">
        <h1 className="text-2xl">{missing ? 'Print not found' : 'The print could not be loaded'}</h1>
        <div className="mt-3">{missing ? <p className="text-ink-700">There is no print with this address.</p> : <ErrorNotice error={error} />}</div>
        <p className="mt-4">
          <Link to="/measurements">Back to measurements</Link>
        </p>
      </section>
    );
  }
  if (!print.data || !measurements.data) return <Loading label="Loading the print…" />;

  return (
    <section>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to="/measurements">Measurements</Link> <span aria-hidden="true">›</span> <Link to={back} className="mono">{print.data.accessionNumber}</Link>{' '}
        <span aria-hidden="true">›</span> New session
      </nav>
      <PageHeader title="Record a session" description={`${print.data.accessionNumber} ${print.data.title} · ${identityLine(print.data)}`} />
      {measurements.data.spots.length === 0 ? (
        <p className="text-sm text-ink-700">
          This print has no measurement spots yet. <Link to={back}>Add a spot</Link> first.
        </p>
      ) : (
        <SessionForm printId={id} measurements={measurements.data} onSaved={() => navigate(back)} onCancel={() => navigate(back)} />
      )}
    </section>
  );
}
