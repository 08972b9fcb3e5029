import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { usersApi } from '@toneledger/common/api/users';
import type { UserListQuery } from '@toneledger/common/schemas/users';
import { call } from '@/lib/api-client';
import { userKeys } from '@/features/users/api/keys';

export function usersQueryOptions(query: UserListQuery) {
  return queryOptions({
    queryKey: userKeys.list(query),
    queryFn: ({ signal }) => call(usersApi.list, { query, signal }),
    placeholderData: keepPreviousData,
  });
}

export function useUsers(query: UserListQuery) {
  return useQuery(usersQueryOptions(query));
}
