import { Link, useNavigate, useParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import type { ConditionReport } from '@toneledger/common/schemas/condition';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { Notice } from '@/components/ui/notice';
import { PrintArea } from '@/components/ui/print-area';
import { useMe } from '@/lib/auth';
import { PrintFooter } from '@/lib/print-footer';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useImages } from '@/lib/images-api';
import { usePrint } from '@/lib/prints-api';
import { useCatalogueSettings } from '@/lib/settings-api';
import { useGradeDefinitions } from '@/features/condition/api/get-condition-settings';
import { useConditionTerms } from '@/features/condition/api/get-condition-terms';
import { useReport } from '@/features/condition/api/get-report';
import { AddendumForm } from '@/features/condition/components/addendum-form';
import { ReportDocument } from '@/features/condition/components/report-document';
import { ReportForm } from '@/features/condition/components/report-form';
import { formatDay } from '@/features/condition/utils/format';
import { NotLoaded } from '@/features/condition/routes/print-not-loaded';

/** The browser's print dialog; a seam so tests can see it was asked for. */
export const printer = {
  print(): void {
    window.print();
  },
};

function ReportView({ report }: { report: ConditionReport }) {
  const me = useMe();
  const navigate = useNavigate();
  const print = usePrint(report.printId);
  const images = useImages(report.printId);
  const terms = useConditionTerms();
  const { definitions } = useGradeDefinitions();
  const settings = useCatalogueSettings();
  const mayWrite = can(me.role, 'condition.write');
  const isAuthor = report.examinerId === me.id;
  const editable = report.status === 'draft' && isAuthor && mayWrite;
  const usable = (images.data ?? []).filter((i) => !i.withdrawn && i.urls.screen);

  const document = (
    <ReportDocument
      report={report}
      print={print.data}
      images={images.data ?? []}
      terms={terms.data ?? []}
      definitions={definitions}
      institutionName={settings.data?.institutionName}
    />
  );

  return (
    <article>
      <PrintFooter accessionNumber={report.accessionNumber} />
      <nav aria-label="Breadcrumb" className="mb-2 text-sm print:hidden">
        <Link to="/condition">Condition</Link> <span aria-hidden="true">›</span>{' '}
        <Link to={`/condition/prints/${report.printId}`} className="mono">
          {report.accessionNumber}
        </Link>{' '}
        <span aria-hidden="true">›</span> Report of {formatDay(report.examinedOn)}
      </nav>
      <div className="mb-5 flex flex-wrap items-end justify-between gap-3 border-b border-paper-300 pb-4 print:hidden">
        <div className="min-w-0">
          <h1 className="text-2xl sm:text-[1.75rem]">{report.status === 'signed' ? 'Condition report' : 'Draft condition report'}</h1>
          <p className="mt-1 text-sm text-ink-700">
            <span className="mono">{report.accessionNumber}</span> {report.printTitle} · examined {formatDay(report.examinedOn)} by {report.examinerName}
          </p>
        </div>
        <Button onClick={() => printer.print()}>Print report</Button>
      </div>

      {editable ? (
        terms.isPending ? (
          <Loading label="Loading the vocabulary…" />
        ) : (
          <>
            <div className="print:hidden">
              <ReportForm
                key={report.id}
                mode="edit"
                report={report}
                images={usable}
                terms={terms.data ?? []}
                definitions={definitions}
                onDiscarded={(r) => navigate(`/condition/prints/${r.printId}`, { replace: true })}
              />
            </div>
            <div className="hidden print:block">
              <PrintArea>{document}</PrintArea>
            </div>
          </>
        )
      ) : (
        <div className="flex flex-col gap-5">
          {report.status === 'draft' ? (
            <div className="print:hidden">
              <Notice tone="info">
                <p>
                  This is a draft by {report.examinerName}. Only its author can change or sign it, so it is shown here read-only.
                </p>
              </Notice>
            </div>
          ) : null}
          <PrintArea>{document}</PrintArea>
          {report.status === 'signed' && mayWrite ? <AddendumForm reportId={report.id} /> : null}
        </div>
      )}
    </article>
  );
}

/** One condition report: the author's draft to edit and sign, or the report to read, print and add to. */
export function ReportPage() {
  const { id = '' } = useParams();
  const report = useReport(id);
  useDocumentTitle(report.data ? `Condition report ${report.data.accessionNumber} ${report.data.examinedOn}` : 'Condition report');
  if (report.isPending) return <Loading label="Loading the report…" />;
  if (report.isError) return <NotLoaded error={report.error} what="report" />;
  return <ReportView report={report.data} />;
}
