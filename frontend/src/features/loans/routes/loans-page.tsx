import { Link } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { loanListQuerySchema } from '@toneledger/common/schemas/loans';
import { buttonClasses } from '@/components/ui/button';
import { exportsApi } from '@toneledger/common/api/exports';
import { ExportLinks } from '@/components/ui/export-links';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
import { useMe } from '@/lib/auth';
import { urlOf } from '@/lib/api-client';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useLoans } from '@/features/loans/api/get-loans';
import { LoansFilters } from '@/features/loans/components/loans-filters';
import { LoansTable } from '@/features/loans/components/loans-table';

/** Every loan out and in, latest first, filtered in the URL. */
export function LoansPage() {
  useDocumentTitle('Loans');
  const me = useMe();
  const [query, setQuery] = useSearchQuery(loanListQuerySchema);
  const loans = useLoans(query);
  const { page: _page, pageSize: _size, ...filters } = query;

  return (
    <section>
      <PageHeader
        title="Loans"
        description="Loans out and in, each with its other institution, dates, the conditions asked for and the prints it carries. A loan moves from proposed to returned in order, each change dated."
        actions={
          can(me.role, 'loans.write') ? (
            <Link to="/loans/new" className={buttonClasses('primary')}>
              New loan
            </Link>
          ) : null
        }
      />
      <LoansFilters query={query} onChange={setQuery} />
      <div className="mb-3">
        <ExportLinks
          what="loans as listed"
          csv={urlOf(exportsApi.loansCsv, { query: filters })}
          json={urlOf(exportsApi.loansJson, { query: filters })}
          dictionary={urlOf(exportsApi.dictionaryCsv, { params: { name: 'loans' } })}
        />
      </div>
      <PagedList list={loans} query={query} setQuery={setQuery} errorTitle="The loans could not be loaded." loadingLabel="Loading loans…">
        {(page, busy) => <LoansTable loans={page.data} query={query} total={page.pagination.total} busy={busy} />}
      </PagedList>
    </section>
  );
}
