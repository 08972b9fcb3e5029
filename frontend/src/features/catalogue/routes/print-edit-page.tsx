import { useNavigate, useParams } from 'react-router-dom';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { usePrint } from '@/lib/prints-api';
import { PrintForm } from '@/features/catalogue/components/print-form';
import { PrintLoadError } from '@/features/catalogue/components/print-load-error';

export function PrintEditPage() {
  const { id = '' } = useParams();
  const print = usePrint(id);
  const navigate = useNavigate();
  useDocumentTitle(print.data ? `Edit ${print.data.accessionNumber}` : 'Edit print');
  if (print.isPending) return <Loading label="Loading the print…" />;
  if (print.isError) return <PrintLoadError error={print.error} />;
  return (
    <section>
      <PageHeader
        title={`Edit ${print.data.accessionNumber}`}
        description={`${print.data.title} · version ${print.data.version}. Only the fields you change are saved; if someone else saves in the meantime, you will see what they changed before anything is overwritten.`}
      />
      {/* Keyed by id only: a background refetch of the same print must not reset what has been typed. */}
      <PrintForm
        key={print.data.id}
        mode="edit"
        print={print.data}
        cancelTo={`/catalogue/prints/${print.data.id}`}
        onSaved={(saved) => navigate(`/catalogue/prints/${saved.id}`)}
      />
    </section>
  );
}
