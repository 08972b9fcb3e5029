import { useMemo } from 'react';
import { useNavigate } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { printListQuerySchema } from '@toneledger/common/schemas/catalogue';
import { Button, buttonClasses } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { useMe } from '@/lib/auth';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { usePrints } from '@/lib/prints-api';
import { printsCsvHref, stepsCsvHref } from '@/features/catalogue/api/exports';
import { ColumnChooser, useColumnVisibility } from '@/features/catalogue/components/column-chooser';
import { PrintsFilters } from '@/features/catalogue/components/prints-filters';
import { CHOOSABLE_COLUMNS, DEFAULT_HIDDEN_COLUMNS, PrintsTable } from '@/features/catalogue/components/prints-table';

export function PrintsPage() {
  useDocumentTitle('Prints');
  const me = useMe();
  const navigate = useNavigate();
  const mayWrite = can(me.role, 'catalogue.write');
  const showLocation = can(me.role, 'catalogue.read_restricted');
  const [urlQuery, setQuery] = useSearchQuery(printListQuerySchema);
  // A role that may not see locations cannot filter by them either.
  const query = useMemo(() => (showLocation || !urlQuery.locationId ? urlQuery : { ...urlQuery, locationId: undefined }), [urlQuery, showLocation]);
  const prints = usePrints(query);
  const [visibility, setVisibility] = useColumnVisibility(DEFAULT_HIDDEN_COLUMNS);
  const choosable = showLocation ? CHOOSABLE_COLUMNS : CHOOSABLE_COLUMNS.filter((c) => c.id !== 'location');

  return (
    <section>
      <PageHeader
        title="Prints"
        description="Every print in the collection. Search, filter and sort here; the address of this page keeps the search, so it can be bookmarked or shared."
        actions={
          <>
            <a href={printsCsvHref(query)} download className={buttonClasses('secondary', 'md', 'no-underline')}>
              Export CSV
            </a>
            <a
              href={stepsCsvHref(query)}
              download
              title="The process histories of these prints, one row per step: the steps file of an import"
              className={buttonClasses('secondary', 'md', 'no-underline')}
            >
              Export steps CSV
            </a>
            {mayWrite ? (
              <Button variant="primary" onClick={() => navigate('/catalogue/prints/new')}>
                New print
              </Button>
            ) : null}
          </>
        }
      />
      <PrintsFilters query={query} onChange={setQuery} showLocation={showLocation} />
      <div className="mb-2 flex justify-end">
        <ColumnChooser columns={choosable} visibility={visibility} onChange={setVisibility} />
      </div>
      {prints.isError ? <ErrorNotice error={prints.error} title="The prints could not be loaded." /> : null}
      {prints.isPending ? (
        <Loading label="Loading prints…" />
      ) : prints.data ? (
        <>
          <PrintsTable
            prints={prints.data.data}
            query={query}
            total={prints.data.pagination.total}
            busy={prints.isPlaceholderData}
            columnVisibility={visibility}
            showLocation={showLocation}
            onSortChange={(sort) => setQuery({ sort })}
          />
          <Pagination
            page={query.page}
            pageSize={query.pageSize}
            total={prints.data.pagination.total}
            estimated={prints.data.pagination.estimated ?? false}
            onPageChange={(page) => setQuery({ page })}
            onPageSizeChange={(pageSize) => setQuery({ pageSize })}
          />
        </>
      ) : null}
    </section>
  );
}
