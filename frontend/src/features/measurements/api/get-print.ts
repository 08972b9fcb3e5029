import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Print } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { printKeys } from '@/features/measurements/api/keys';

export function getPrint(id: string, signal?: AbortSignal): Promise<Print> {
  return requestData<Print>(`/api/prints/${encodeURIComponent(id)}`, { signal });
}

export function printQueryOptions(id: string) {
  return queryOptions({
    queryKey: printKeys.detail(id),
    queryFn: ({ signal }) => getPrint(id, signal),
  });
}

export function usePrint(id: string) {
  return useQuery(printQueryOptions(id));
}
