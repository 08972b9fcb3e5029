import { queryOptions, useQuery } from '@tanstack/react-query';
import { reportsApi } from '@toneledger/common/api/condition';
import { callData } from '@/lib/api-client';
import { reportKeys } from '@/features/condition/api/keys';

export function reportQueryOptions(id: string) {
  return queryOptions({
    queryKey: reportKeys.detail(id),
    queryFn: ({ signal }) => callData(reportsApi.get, { params: { id }, signal }),
  });
}

export function useReport(id: string) {
  return useQuery(reportQueryOptions(id));
}
