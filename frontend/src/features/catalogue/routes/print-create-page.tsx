import { useNavigate } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { PrintForm } from '@/features/catalogue/components/print-form';

export function PrintCreatePage() {
  useDocumentTitle('New print');
  const navigate = useNavigate();
  return (
    <section>
      <PageHeader
        title="New print"
        description="Catalogue one print. Once it is saved, add its process history (development, toning, after-baths, washing tests) from the print's page."
      />
      <PrintForm mode="create" cancelTo="/catalogue" onSaved={(print) => navigate(`/catalogue/prints/${print.id}`)} />
    </section>
  );
}
