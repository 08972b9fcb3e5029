import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEvent, AuditListQuery } from '@toneledger/common/schemas/audit';
import { requestPage } from '@/lib/api-client';
import { auditKeys } from '@/features/audit/api/keys';

export function getAuditEvents(query: AuditListQuery, signal?: AbortSignal) {
  return requestPage<AuditEvent>('/api/audit', { query, signal });
}

export function auditEventsQueryOptions(query: AuditListQuery) {
  return queryOptions({
    queryKey: auditKeys.list(query),
    queryFn: ({ signal }) => getAuditEvents(query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useAuditEvents(query: AuditListQuery) {
  return useQuery(auditEventsQueryOptions(query));
}
