import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { remindersApi } from '@toneledger/common/api/inspections';
import { call, callData } from '@/lib/api-client';
import { reminderKeys, type DigestListQuery } from '@/features/reminders/api/keys';

export type RemindersInput = BodyIn<typeof remindersApi.put>;

export function remindersQueryOptions() {
  return queryOptions({ queryKey: reminderKeys.mine(), queryFn: ({ signal }) => callData(remindersApi.get, { signal }) });
}

export function useReminders() {
  return useQuery(remindersQueryOptions());
}

export function useSaveReminders() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: RemindersInput) => callData(remindersApi.put, { body }),
    onSuccess: (data) => queryClient.setQueryData(reminderKeys.mine(), data),
  });
}

/** Makes a new feed address (the old one stops working); the answer is the only time it is shown. */
export function useRotateFeed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => callData(remindersApi.rotateFeed),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: reminderKeys.mine() }),
  });
}

export function useRevokeFeed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async () => {
      await call(remindersApi.revokeFeed);
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: reminderKeys.mine() }),
  });
}

export function digestsQueryOptions(query: DigestListQuery) {
  return queryOptions({
    queryKey: reminderKeys.digestList(query),
    queryFn: ({ signal }) => call(remindersApi.digests, { query, signal }),
    placeholderData: keepPreviousData,
  });
}

export function useDigests(query: DigestListQuery) {
  return useQuery(digestsQueryOptions(query));
}
