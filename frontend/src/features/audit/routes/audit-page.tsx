import { auditApi } from '@toneledger/common/api/users';
import { auditListQuerySchema } from '@toneledger/common/schemas/audit';
import { exportsApi } from '@toneledger/common/api/exports';
import { recordKindLabel, recordLabel } from '@toneledger/common/fields/audit-records';
import { ExportLinks } from '@/components/ui/export-links';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
import { urlOf } from '@/lib/api-client';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useAuditEvents } from '@/features/audit/api/get-audit-events';
import { AuditFilters } from '@/features/audit/components/audit-filters';
import { AuditTable } from '@/features/audit/components/audit-table';

export function AuditPage() {
  useDocumentTitle('Audit trail');
  const [query, setQuery] = useSearchQuery(auditListQuerySchema);
  const events = useAuditEvents(query);
  const { page: _page, pageSize: _size, ...filters } = query;
  // The chosen record by its name, from the events listed (each is about it); its kind alone before they come.
  const chosen = query.entityId ? events.data?.data.find((e) => e.entityId === query.entityId && e.entityType === (query.entityType ?? e.entityType)) : undefined;
  const recordName = chosen ? recordLabel(chosen.record) : recordKindLabel(query.entityType ?? 'record');

  return (
    <section>
      <PageHeader
        title="Audit trail"
        description="Every sign-in, sign-out and change: who did what and when, and each field before and after. Pick a person, an action or a range of days, or select one in the table to see only its events."
      />
      <AuditFilters query={query} onChange={setQuery} recordName={recordName} />
      <div className="mb-3">
        <ExportLinks what="the audit trail as filtered" csv={urlOf(auditApi.exportCsv, { query: filters })} dictionary={urlOf(exportsApi.dictionaryCsv, { params: { name: 'audit' } })} />
      </div>
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
