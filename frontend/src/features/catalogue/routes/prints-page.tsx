import { useMemo } from 'react';
import { useNavigate } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { printListQuerySchema } from '@toneledger/common/schemas/catalogue';
import { Button, buttonClasses } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
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
      <PagedList list={prints} query={query} setQuery={setQuery} errorTitle="The prints could not be loaded." loadingLabel="Loading prints…">
        {(page, busy) => (
          <PrintsTable
            prints={page.data}
            query={query}
            total={page.pagination.total}
            busy={busy}
            columnVisibility={visibility}
            showLocation={showLocation}
            onSortChange={(sort) => setQuery({ sort })}
          />
        )}
      </PagedList>
    </section>
  );
}
