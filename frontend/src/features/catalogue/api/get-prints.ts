import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { PrintListItem, PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { requestPage } from '@/lib/api-client';
import { printKeys } from '@/features/catalogue/api/keys';

export function getPrints(query: PrintListQuery, signal?: AbortSignal) {
  return requestPage<PrintListItem>('/api/prints', { query, signal });
}

export function printsQueryOptions(query: PrintListQuery) {
  return queryOptions({
    queryKey: printKeys.list(query),
    queryFn: ({ signal }) => getPrints(query, signal),
    placeholderData: keepPreviousData,
  });
}

export function usePrints(query: PrintListQuery) {
  return useQuery(printsQueryOptions(query));
}
