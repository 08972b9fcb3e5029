import { auditListQuerySchema } from '@toneledger/common/schemas/audit';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useAuditEvents } from '@/features/audit/api/get-audit-events';
import { AuditFilters } from '@/features/audit/components/audit-filters';
import { AuditTable } from '@/features/audit/components/audit-table';

export function AuditPage() {
  useDocumentTitle('Audit trail');
  const [query, setQuery] = useSearchQuery(auditListQuerySchema);
  const events = useAuditEvents(query);

  return (
    <section>
      <PageHeader
        title="Audit trail"
        description="Every sign-in, sign-out and change: who, when, and the record before and after. Select a person, action or record in the table to see only its events."
      />
      <AuditFilters query={query} onChange={setQuery} />
      <PagedList list={events} query={query} setQuery={setQuery} errorTitle="The audit trail could not be loaded." loadingLabel="Loading events…">
        {(page, busy) => (
          <AuditTable
            events={page.data}
            query={query}
            total={page.pagination.total}
            busy={busy}
            onFilter={setQuery}
          />
        )}
      </PagedList>
    </section>
  );
}
