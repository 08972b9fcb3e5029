import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { DataOf } from '@toneledger/common/api/endpoint';
import { measurementsApi } from '@toneledger/common/api/measurements';
import { call } from '@/lib/api-client';
import { measurementKeys, type LeadersQuery } from '@/features/measurements/api/keys';

export type Leader = DataOf<typeof measurementsApi.leaders>[number];

/** Spots across the collection whose measured change or rate is highest. */
export function leadersQueryOptions(query: LeadersQuery) {
  return queryOptions({
    queryKey: measurementKeys.list(query),
    queryFn: ({ signal }) => call(measurementsApi.leaders, { query, signal }),
    placeholderData: keepPreviousData,
  });
}

export function useLeaders(query: LeadersQuery) {
  return useQuery(leadersQueryOptions(query));
}
