import { can } from '@toneledger/common/domain/roles';
import { leadersQuerySchema } from '@toneledger/common/schemas/measurements';
import { exportsApi } from '@toneledger/common/api/exports';
import { ExportLinks } from '@/components/ui/export-links';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
import { useMe } from '@/lib/auth';
import { urlOf } from '@/lib/api-client';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useLeaders } from '@/features/measurements/api/get-leaders';
import { LeadersFilters } from '@/features/measurements/components/leaders-filters';
import { LeadersTable } from '@/features/measurements/components/leaders-table';
import { PrintFinder } from '@/features/measurements/components/print-finder';
import { ThresholdSetting } from '@/features/measurements/components/threshold-setting';

/** The measurements area: open a print by accession number, or start from the spots changing most. */
export function LeadersPage() {
  useDocumentTitle('Measurements');
  const me = useMe();
  const [query, setQuery] = useSearchQuery(leadersQuerySchema);
  const leaders = useLeaders(query);

  return (
    <section>
      <PageHeader
        title="Measurements"
        description="Colour and density measured at registered spots on each print, the change against each spot's baseline, how fast it is changing and when it may become noticeable. The figures advise; decisions rest with the conservators."
      />
      <PrintFinder />
      <h2 className="mb-2 text-lg">Spots changing most</h2>
      <ThresholdSetting mayChange={can(me.role, 'settings.manage')} />
      <LeadersFilters query={query} onChange={setQuery} />
      <div className="mb-3">
        <ExportLinks
          what="the readings of the prints this filter names"
          csv={urlOf(exportsApi.readingsCsv, { query: { process: query.process, tonerClass: query.tonerClass } })}
          json={urlOf(exportsApi.readingsJson, { query: { process: query.process, tonerClass: query.tonerClass } })}
          dictionary={urlOf(exportsApi.dictionaryCsv, { params: { name: 'readings' } })}
        />
      </div>
      <PagedList list={leaders} query={query} setQuery={setQuery} errorTitle="The list could not be loaded." loadingLabel="Loading the spots…">
        {(page, busy) => (
          <LeadersTable
            leaders={page.data}
            query={query}
            total={page.pagination.total}
            busy={busy}
            onSortChange={(sort) => setQuery({ sort })}
          />
        )}
      </PagedList>
    </section>
  );
}
