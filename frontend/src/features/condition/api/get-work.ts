import { queryOptions, useQuery } from '@tanstack/react-query';
import { reportsApi } from '@toneledger/common/api/condition';
import { callData } from '@/lib/api-client';
import { reportKeys } from '@/features/condition/api/keys';

/** The signed-in person's drafts and recent reports, for the condition area's opening page. */
export function conditionWorkQueryOptions() {
  return queryOptions({
    queryKey: [...reportKeys.lists(), 'work'] as const,
    queryFn: ({ signal }) => callData(reportsApi.work, { signal }),
  });
}

export const useConditionWork = () => useQuery(conditionWorkQueryOptions());
