import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { CONDITION_CONTEXTS } from '@toneledger/common/schemas/condition';
import { id as idSchema } from '@toneledger/common/schemas/primitives';
import { Loading } from '@/components/ui/loading';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useImages } from '@/lib/images-api';
import { usePrint } from '@/lib/prints-api';
import { useGradeDefinitions } from '@/features/condition/api/get-condition-settings';
import { useConditionTerms } from '@/features/condition/api/get-condition-terms';
import { ReportForm } from '@/features/condition/components/report-form';
import { NotLoaded } from '@/features/condition/routes/print-not-loaded';

type Prefill = { context?: (typeof CONDITION_CONTEXTS)[number]; loanId?: string };

/** What the address asks for: `?context=outgoing_loan&loanId=…` from a loan's page; anything unknown is ignored. */
function prefillOf(params: URLSearchParams): Prefill {
  const context = params.get('context');
  const loanId = idSchema.safeParse(params.get('loanId'));
  return {
    ...((CONDITION_CONTEXTS as readonly string[]).includes(context ?? '') ? { context: context as Prefill['context'] } : {}),
    ...(loanId.success ? { loanId: loanId.data } : {}),
  };
}

/** A new condition report of one print, written by the signed-in conservator (for a loan when opened from one). */
export function ReportNewPage() {
  const { id = '' } = useParams();
  const [params] = useSearchParams();
  const prefill = prefillOf(params);
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
      {prefill.loanId ? (
        <div className="mb-4">
          <Notice tone="info">
            <p>
              This report is made for <Link to={`/loans/${prefill.loanId}`}>a loan</Link>; once signed it counts for the loan&rsquo;s next step.
            </p>
          </Notice>
        </div>
      ) : null}
      <ReportForm
        mode="create"
        printId={id}
        prefill={prefill}
        images={usable}
        terms={terms.data ?? []}
        definitions={definitions}
        onCreated={(report) => navigate(`/condition/reports/${report.id}`, { replace: true })}
        onCancel={() => navigate(`/condition/prints/${id}`)}
      />
    </section>
  );
}
