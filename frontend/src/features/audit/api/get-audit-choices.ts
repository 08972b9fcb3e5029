import { queryOptions, useQuery } from '@tanstack/react-query';
import { auditApi } from '@toneledger/common/api/users';
import { callData } from '@/lib/api-client';
import { auditKeys } from '@/features/audit/api/keys';

/** The people and actions the audit screen's pickers offer. */
export function auditChoicesQueryOptions() {
  return queryOptions({ queryKey: auditKeys.choices(), queryFn: ({ signal }) => callData(auditApi.choices, { signal }), staleTime: 60_000 });
}

export function useAuditChoices() {
  return useQuery(auditChoicesQueryOptions());
}
