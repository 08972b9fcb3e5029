import { Link } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { exhibitionListQuerySchema } from '@toneledger/common/schemas/exhibitions';
import { buttonClasses } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
import { useMe } from '@/lib/auth';
import { useExhibitions } from '@/lib/exhibitions-api';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { ExhibitionsFilters } from '@/features/exhibitions/components/exhibitions-filters';
import { ExhibitionsTable } from '@/features/exhibitions/components/exhibitions-table';

/** Every exhibition, current, coming or past, filtered in the URL. */
export function ExhibitionsPage() {
  useDocumentTitle('Exhibitions');
  const me = useMe();
  const [query, setQuery] = useSearchQuery(exhibitionListQuerySchema);
  const exhibitions = useExhibitions(query);
  return (
    <section>
      <PageHeader
        title="Exhibitions"
        description="Shows with their venues and object lists; each print waits for a conservator's approval and has its display periods, from which its light dose is counted."
        actions={
          can(me.role, 'loans.write') ? (
            <Link to="/exhibitions/new" className={buttonClasses('primary')}>
              New exhibition
            </Link>
          ) : null
        }
      />
      <ExhibitionsFilters query={query} onChange={setQuery} />
      <PagedList list={exhibitions} query={query} setQuery={setQuery} errorTitle="The exhibitions could not be loaded." loadingLabel="Loading exhibitions…">
        {(page, busy) => <ExhibitionsTable exhibitions={page.data} query={query} total={page.pagination.total} busy={busy} />}
      </PagedList>
    </section>
  );
}
