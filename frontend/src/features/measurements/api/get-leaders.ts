import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import type { leaderSchema } from '@toneledger/common/schemas/measurements';
import { requestPage } from '@/lib/api-client';
import { measurementKeys, type LeadersQuery } from '@/features/measurements/api/keys';

export type Leader = z.infer<typeof leaderSchema>;

/** Spots across the collection whose measured change or rate is highest. */
export function getLeaders(query: LeadersQuery, signal?: AbortSignal) {
  return requestPage<Leader>('/api/measurements/leaders', { query, signal });
}

export function leadersQueryOptions(query: LeadersQuery) {
  return queryOptions({
    queryKey: measurementKeys.list(query),
    queryFn: ({ signal }) => getLeaders(query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useLeaders(query: LeadersQuery) {
  return useQuery(leadersQueryOptions(query));
}
