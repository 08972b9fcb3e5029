import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { User, UserListQuery } from '@toneledger/common/schemas/users';
import { requestPage } from '@/lib/api-client';
import { userKeys } from '@/features/users/api/keys';

export function getUsers(query: UserListQuery, signal?: AbortSignal) {
  return requestPage<User>('/api/users', { query, signal });
}

export function usersQueryOptions(query: UserListQuery) {
  return queryOptions({
    queryKey: userKeys.list(query),
    queryFn: ({ signal }) => getUsers(query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useUsers(query: UserListQuery) {
  return useQuery(usersQueryOptions(query));
}
