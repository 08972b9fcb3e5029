import { queryOptions, useQuery } from '@tanstack/react-query';
import { conditionTermsApi } from '@toneledger/common/api/condition';
import { callData } from '@/lib/api-client';
import { termKeys } from '@/features/condition/api/keys';

export function conditionTermsQueryOptions(query: { all?: boolean } = {}) {
  return queryOptions({
    queryKey: termKeys.list(query),
    queryFn: ({ signal }) => callData(conditionTermsApi.list, { query: { all: query.all ? 'true' : undefined }, signal }),
    staleTime: 5 * 60_000,
  });
}

/** The vocabulary including inactive terms, so older observations still show their term by name. */
export function useConditionTerms() {
  return useQuery(conditionTermsQueryOptions({ all: true }));
}
