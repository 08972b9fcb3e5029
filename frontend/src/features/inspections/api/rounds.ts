import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { roundsApi, scheduleApi } from '@toneledger/common/api/inspections';
import type { roundListQuerySchema, worklistQuerySchema } from '@toneledger/common/schemas/inspections';
import { call, callData } from '@/lib/api-client';

export type WorklistQuery = z.output<typeof worklistQuerySchema>;
export type RoundListQuery = z.output<typeof roundListQuerySchema>;

/** Query keys of the work list and the rounds. */
export const worklistKeys = {
  all: ['inspections'] as const,
  list: (query: WorklistQuery) => [...worklistKeys.all, 'worklist', query] as const,
  rounds: () => [...worklistKeys.all, 'rounds'] as const,
  roundList: (query: RoundListQuery) => [...worklistKeys.rounds(), 'list', query] as const,
  round: (id: string) => [...worklistKeys.rounds(), 'detail', id] as const,
  assignees: () => [...worklistKeys.all, 'assignees'] as const,
};

export function useWorklist(query: WorklistQuery) {
  return useQuery({
    queryKey: worklistKeys.list(query),
    queryFn: ({ signal }) => call(scheduleApi.worklist, { query, signal }),
    placeholderData: keepPreviousData,
  });
}

export function useRounds(query: RoundListQuery) {
  return useQuery({
    queryKey: worklistKeys.roundList(query),
    queryFn: ({ signal }) => call(roundsApi.list, { query, signal }),
    placeholderData: keepPreviousData,
  });
}

export function roundQueryOptions(id: string) {
  return queryOptions({ queryKey: worklistKeys.round(id), queryFn: ({ signal }) => callData(roundsApi.get, { params: { id }, signal }) });
}

export function useRound(id: string) {
  return useQuery(roundQueryOptions(id));
}

/** The people a round can be given to. */
export function useAssignees() {
  return useQuery({ queryKey: worklistKeys.assignees(), queryFn: ({ signal }) => callData(roundsApi.assignees, { signal }), staleTime: 60_000 });
}

/** Plans a round; the work list shows its prints in it afterwards. */
export function useCreateRound() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: BodyIn<typeof roundsApi.create>) => callData(roundsApi.create, { body }),
    onSuccess: async (round) => {
      queryClient.setQueryData(worklistKeys.round(round.id), round);
      await queryClient.invalidateQueries({ queryKey: worklistKeys.all });
    },
  });
}

export function useUpdateRound(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: BodyIn<typeof roundsApi.update>) => callData(roundsApi.update, { params: { id }, body }),
    onSuccess: async (round) => {
      queryClient.setQueryData(worklistKeys.round(id), round);
      await queryClient.invalidateQueries({ queryKey: worklistKeys.all });
    },
  });
}
