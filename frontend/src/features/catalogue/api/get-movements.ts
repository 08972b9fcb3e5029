import { queryOptions, useQuery } from '@tanstack/react-query';
import { printsApi } from '@toneledger/common/api/prints';
import { callData } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';

export function movementsQueryOptions(printId: string) {
  return queryOptions({
    queryKey: printKeys.movements(printId),
    queryFn: ({ signal }) => callData(printsApi.movements, { params: { id: printId }, signal }),
  });
}

/** Not fetched at all for roles that may not see locations. */
export function useMovements(printId: string, enabled: boolean) {
  return useQuery({ ...movementsQueryOptions(printId), enabled });
}
