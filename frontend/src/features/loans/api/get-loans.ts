import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { loansApi } from '@toneledger/common/api/loans';
import { call, callData } from '@/lib/api-client';
import { loanKeys, type LoanListQuery } from '@/features/loans/api/keys';

export function loansQueryOptions(query: LoanListQuery) {
  return queryOptions({
    queryKey: loanKeys.list(query),
    queryFn: ({ signal }) => call(loansApi.list, { query, signal }),
    placeholderData: keepPreviousData,
  });
}

export function useLoans(query: LoanListQuery) {
  return useQuery(loansQueryOptions(query));
}

/** One loan with its objects, status history and what stands in the way of its next step. */
export function loanQueryOptions(id: string) {
  return queryOptions({
    queryKey: loanKeys.detail(id),
    queryFn: ({ signal }) => callData(loansApi.get, { params: { id }, signal }),
  });
}

export function useLoan(id: string) {
  return useQuery(loanQueryOptions(id));
}
