import { useNavigate, useParams } from 'react-router-dom';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { usePrint } from '@/lib/prints-api';
import { PrintLoadError } from '@/features/catalogue/components/print-load-error';
import { StepsEditor } from '@/features/catalogue/components/steps-editor';

/** A page of its own, so the print's page stays a calm record and the editor has room for its fields. */
export function PrintStepsPage() {
  const { id = '' } = useParams();
  const print = usePrint(id);
  const navigate = useNavigate();
  useDocumentTitle(print.data ? `Process history of ${print.data.accessionNumber}` : 'Process history');
  if (print.isPending) return <Loading label="Loading the print…" />;
  if (print.isError) return <PrintLoadError error={print.error} />;
  const back = `/catalogue/prints/${print.data.id}`;
  return (
    <section>
      <PageHeader
        title={`Process history of ${print.data.accessionNumber}`}
        description={
          <>
            {print.data.title}. The steps in the order they were done: development, stop, fixing, washing, clearing, each toning bath,
            after-baths, final wash and any residual-thiosulfate test. Saving replaces the whole list.
          </>
        }
      />
      <StepsEditor key={print.data.id} print={print.data} onSaved={() => navigate(back)} onCancel={() => navigate(back)} />
    </section>
  );
}
