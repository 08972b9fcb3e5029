import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ConditionReport } from '@toneledger/common/schemas/condition';
import { requestData } from '@/lib/api-client';
import { reportKeys } from '@/features/condition/api/keys';

export function getReport(id: string, signal?: AbortSignal): Promise<ConditionReport> {
  return requestData<ConditionReport>(`/api/condition-reports/${encodeURIComponent(id)}`, { signal });
}

export function reportQueryOptions(id: string) {
  return queryOptions({
    queryKey: reportKeys.detail(id),
    queryFn: ({ signal }) => getReport(id, signal),
  });
}

export function useReport(id: string) {
  return useQuery(reportQueryOptions(id));
}
