import { queryOptions, useQuery } from '@tanstack/react-query';
import { printsApi } from '@toneledger/common/api/prints';
import { callData } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';

export function historyQueryOptions(printId: string) {
  return queryOptions({
    queryKey: printKeys.history(printId),
    queryFn: ({ signal }) => callData(printsApi.history, { params: { id: printId }, signal }),
  });
}

export function useHistory(printId: string, enabled: boolean) {
  return useQuery({ ...historyQueryOptions(printId), enabled });
}
