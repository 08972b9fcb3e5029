import { Link, useNavigate, useParams } from 'react-router-dom';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useImages } from '@/lib/images-api';
import { usePrint } from '@/lib/prints-api';
import { useGradeDefinitions } from '@/features/condition/api/get-condition-settings';
import { useConditionTerms } from '@/features/condition/api/get-condition-terms';
import { ReportForm } from '@/features/condition/components/report-form';
import { NotLoaded } from '@/features/condition/routes/print-not-loaded';

/** A new condition report of one print, written by the signed-in conservator. */
export function ReportNewPage() {
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const print = usePrint(id);
  const images = useImages(id);
  const terms = useConditionTerms();
  const { definitions } = useGradeDefinitions();
  useDocumentTitle(print.data ? `New condition report · ${print.data.accessionNumber}` : 'New condition report');
  if (print.isPending || terms.isPending) return <Loading label="Loading…" />;
  if (print.isError) return <NotLoaded error={print.error} what="print" />;
  const usable = (images.data ?? []).filter((i) => !i.withdrawn && i.urls.screen);
  return (
    <section>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to="/condition">Condition</Link> <span aria-hidden="true">›</span>{' '}
        <Link to={`/condition/prints/${id}`} className="mono">
          {print.data.accessionNumber}
        </Link>
      </nav>
      <PageHeader
        title="New condition report"
        description={`${print.data.accessionNumber} · ${print.data.title}. Saved as a draft that only you can change; sign it when it is complete.`}
      />
      <ReportForm
        mode="create"
        printId={id}
        images={usable}
        terms={terms.data ?? []}
        definitions={definitions}
        onCreated={(report) => navigate(`/condition/reports/${report.id}`, { replace: true })}
        onCancel={() => navigate(`/condition/prints/${id}`)}
      />
    </section>
  );
}
