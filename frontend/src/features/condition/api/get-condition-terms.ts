import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ConditionTerm } from '@toneledger/common/schemas/condition';
import { requestData } from '@/lib/api-client';
import { termKeys } from '@/features/condition/api/keys';

export function getConditionTerms(query: { all?: boolean }, signal?: AbortSignal): Promise<ConditionTerm[]> {
  return requestData<ConditionTerm[]>('/api/condition-terms', { query: { all: query.all ? 'true' : undefined }, signal });
}

export function conditionTermsQueryOptions(query: { all?: boolean } = {}) {
  return queryOptions({
    queryKey: termKeys.list(query),
    queryFn: ({ signal }) => getConditionTerms(query, signal),
    staleTime: 5 * 60_000,
  });
}

/** The vocabulary including inactive terms, so older observations still show their term by name. */
export function useConditionTerms() {
  return useQuery(conditionTermsQueryOptions({ all: true }));
}
