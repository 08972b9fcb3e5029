import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { auditApi } from '@toneledger/common/api/users';
import type { AuditListQuery } from '@toneledger/common/schemas/audit';
import { call } from '@/lib/api-client';
import { auditKeys } from '@/features/audit/api/keys';

export function auditEventsQueryOptions(query: AuditListQuery) {
  return queryOptions({
    queryKey: auditKeys.list(query),
    queryFn: ({ signal }) => call(auditApi.list, { query, signal }),
    placeholderData: keepPreviousData,
  });
}

export function useAuditEvents(query: AuditListQuery) {
  return useQuery(auditEventsQueryOptions(query));
}
