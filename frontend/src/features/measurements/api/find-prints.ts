import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { PrintListItem } from '@toneledger/common/schemas/catalogue';
import { requestPage } from '@/lib/api-client';
import { printKeys, type PrintSearchQuery } from '@/features/measurements/api/keys';

/** Finds prints by accession number or words (the catalogue's own full-text search). */
export function findPrints(query: PrintSearchQuery, signal?: AbortSignal) {
  return requestPage<PrintListItem>('/api/prints', { query: { ...query }, signal });
}

export function findPrintsQueryOptions(query: PrintSearchQuery) {
  return queryOptions({
    queryKey: printKeys.list(query),
    queryFn: ({ signal }) => findPrints(query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useFindPrints(query: PrintSearchQuery) {
  return useQuery({ ...findPrintsQueryOptions(query), enabled: query.q.trim() !== '' });
}
