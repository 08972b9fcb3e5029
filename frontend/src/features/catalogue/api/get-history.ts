import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HistoryEvent } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { printKeys } from '@/features/catalogue/api/keys';

export function getHistory(printId: string, signal?: AbortSignal): Promise<HistoryEvent[]> {
  return requestData<HistoryEvent[]>(`/api/prints/${encodeURIComponent(printId)}/history`, { signal });
}

export function historyQueryOptions(printId: string) {
  return queryOptions({
    queryKey: printKeys.history(printId),
    queryFn: ({ signal }) => getHistory(printId, signal),
  });
}

export function useHistory(printId: string, enabled: boolean) {
  return useQuery({ ...historyQueryOptions(printId), enabled });
}
