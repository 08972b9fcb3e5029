import { Link, useSearchParams } from 'react-router-dom';
import { TREATMENT_STATUS } from '@toneledger/common/schemas/procedure-vocab';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { usePrintTreatments, useTreatments } from '@/features/treatments/api/treatments';

/** Every treatment, newest proposal first. A treatment is proposed from a print's condition page. */
export function TreatmentsPage() {
  useDocumentTitle('Treatments');
  const [params] = useSearchParams();
  const printId = params.get('print');
  const all = useTreatments();
  const ofPrint = usePrintTreatments(printId ?? '', Boolean(printId));
  const q = printId ? ofPrint : all;
  return (
    <section>
      <PageHeader title="Treatments" description="Proposed, approved, done and signed treatments. Propose one from a print's condition page." />
      {printId ? <p className="mb-3 text-sm">Treatments of one print. <Link to="/condition/treatments">Show every treatment</Link>{' · '}<Link to={`/condition/prints/${printId}/treatments/new`}>Propose a treatment</Link></p> : null}
      {q.isPending ? <Loading label="Loading…" /> : q.isError ? <ErrorNotice error={q.error} /> : (
        <table className="w-full text-sm">
          <thead><tr className="text-left"><th>Print</th><th>Method</th><th>Proposed</th><th>Conservator</th><th>Stage</th></tr></thead>
          <tbody>
            {q.data.map((t) => (
              <tr key={t.id} className="border-t border-paper-300">
                <td><Link to={`/condition/treatments/${t.id}`} className="mono">{t.accessionNumber}</Link> {t.printTitle}</td>
                <td>{t.chosenMethod.slice(0, 80)}</td>
                <td>{t.proposedOn}</td>
                <td>{t.conservator}</td>
                <td>{TREATMENT_STATUS.labels[t.status]}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
