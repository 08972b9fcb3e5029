import { queryOptions, useQuery } from '@tanstack/react-query';
import { reportsApi } from '@toneledger/common/api/condition';
import { callData } from '@/lib/api-client';
import { reportKeys } from '@/features/condition/api/keys';

/** A print's condition reports, newest examination first. */
export function reportsQueryOptions(printId: string) {
  return queryOptions({
    queryKey: reportKeys.list(printId),
    queryFn: ({ signal }) => callData(reportsApi.list, { params: { id: printId }, signal }),
  });
}

export function useReports(printId: string, enabled = true) {
  return useQuery({ ...reportsQueryOptions(printId), enabled });
}
