import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Movement } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { printKeys } from '@/features/catalogue/api/keys';

export function getMovements(printId: string, signal?: AbortSignal): Promise<Movement[]> {
  return requestData<Movement[]>(`/api/prints/${encodeURIComponent(printId)}/movements`, { signal });
}

export function movementsQueryOptions(printId: string) {
  return queryOptions({
    queryKey: printKeys.movements(printId),
    queryFn: ({ signal }) => getMovements(printId, signal),
  });
}

/** Not fetched at all for roles that may not see locations. */
export function useMovements(printId: string, enabled: boolean) {
  return useQuery({ ...movementsQueryOptions(printId), enabled });
}
