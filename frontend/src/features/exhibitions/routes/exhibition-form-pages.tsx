import { Link, useNavigate, useParams } from 'react-router-dom';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useExhibition } from '@/lib/exhibitions-api';
import { useDocumentTitle } from '@/lib/use-document-title';
import { DeleteExhibition } from '@/features/exhibitions/components/delete-exhibition';
import { ExhibitionForm } from '@/features/exhibitions/components/exhibition-form';

export function ExhibitionCreatePage() {
  useDocumentTitle('New exhibition');
  const navigate = useNavigate();
  return (
    <section>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to="/exhibitions">Exhibitions</Link>
      </nav>
      <PageHeader title="New exhibition" description="A touring show has several venues, in order. Add its prints once it is saved." />
      <ExhibitionForm exhibition={null} onSaved={(e) => navigate(`/exhibitions/${e.id}`, { replace: true })} onCancel={() => navigate('/exhibitions')} />
    </section>
  );
}

export function ExhibitionEditPage() {
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const exhibition = useExhibition(id);
  useDocumentTitle(exhibition.data ? `Edit ${exhibition.data.title}` : 'Edit exhibition');
  if (exhibition.isPending) return <Loading label="Loading the exhibition…" />;
  if (exhibition.isError) return <ErrorNotice error={exhibition.error} title="The exhibition could not be loaded." />;
  return (
    <section>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to="/exhibitions">Exhibitions</Link> <span aria-hidden="true">›</span> <Link to={`/exhibitions/${id}`}>{exhibition.data.title}</Link>
      </nav>
      <PageHeader title={`Edit ${exhibition.data.title}`} />
      <ExhibitionForm exhibition={exhibition.data} onSaved={(e) => navigate(`/exhibitions/${e.id}`)} onCancel={() => navigate(`/exhibitions/${id}`)} />
      <DeleteExhibition exhibition={exhibition.data} onDeleted={() => navigate('/exhibitions', { replace: true })} />
    </section>
  );
}
