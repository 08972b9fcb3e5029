import { auditListQuerySchema } from '@toneledger/common/schemas/audit';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
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
      {events.isError ? <ErrorNotice error={events.error} title="The audit trail could not be loaded." /> : null}
      {events.isPending ? (
        <Loading label="Loading events…" />
      ) : events.data ? (
        <>
          <AuditTable
            events={events.data.data}
            query={query}
            total={events.data.pagination.total}
            busy={events.isPlaceholderData}
            onFilter={setQuery}
          />
          <Pagination
            page={query.page}
            pageSize={query.pageSize}
            total={events.data.pagination.total}
            onPageChange={(page) => setQuery({ page })}
            onPageSizeChange={(pageSize) => setQuery({ pageSize })}
          />
        </>
      ) : null}
    </section>
  );
}
