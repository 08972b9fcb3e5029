import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ConditionReport } from '@toneledger/common/schemas/condition';
import { requestData } from '@/lib/api-client';
import { reportKeys } from '@/features/condition/api/keys';

/** A print's condition reports, newest examination first. */
export function getReports(printId: string, signal?: AbortSignal): Promise<ConditionReport[]> {
  return requestData<ConditionReport[]>(`/api/prints/${encodeURIComponent(printId)}/condition-reports`, { signal });
}

export function reportsQueryOptions(printId: string) {
  return queryOptions({
    queryKey: reportKeys.list(printId),
    queryFn: ({ signal }) => getReports(printId, signal),
  });
}

export function useReports(printId: string, enabled = true) {
  return useQuery({ ...reportsQueryOptions(printId), enabled });
}
