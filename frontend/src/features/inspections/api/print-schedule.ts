import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { scheduleApi } from '@toneledger/common/api/inspections';
import type { ScheduleRecompute } from '@toneledger/common/schemas/inspections';
import { callData } from '@/lib/api-client';

/** Query keys of one print's next inspection and of the full recompute (under the feature's 'inspections' root). */
export const printScheduleKeys = {
  all: ['inspections', 'print-schedule'] as const,
  detail: (printId: string) => [...printScheduleKeys.all, printId] as const,
  recompute: () => ['inspections', 'recompute'] as const,
};

export const RECOMPUTE_POLL_MS = 2_000;

export function printScheduleQueryOptions(printId: string) {
  return queryOptions({
    queryKey: printScheduleKeys.detail(printId),
    queryFn: ({ signal }) => callData(scheduleApi.print, { params: { id: printId }, signal }),
  });
}

/** A print's next inspection; `enabled: false` for a role that may not read it, so nothing is asked. */
export function usePrintSchedule(printId: string, enabled = true) {
  return useQuery({ ...printScheduleQueryOptions(printId), enabled });
}

/** Sets or clears a conservator's own date; the answer is the print's schedule again. */
export function useOverrideSchedule(printId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: BodyIn<typeof scheduleApi.override>) => callData(scheduleApi.override, { params: { id: printId }, body }),
    onSuccess: async (schedule) => {
      queryClient.setQueryData(printScheduleKeys.detail(printId), schedule);
      // The work list and rounds show the date too.
      await queryClient.invalidateQueries({ queryKey: ['inspections'], predicate: (q) => q.queryKey[1] !== 'print-schedule' });
    },
  });
}

/** Progress of the last full recompute, asked again every 2 s while it runs. */
export function useScheduleRecompute(enabled = true) {
  return useQuery({
    queryKey: printScheduleKeys.recompute(),
    queryFn: ({ signal }) => callData(scheduleApi.recomputeStatus, { signal }),
    enabled,
    refetchInterval: (query) => ((query.state.data as ScheduleRecompute | null | undefined)?.status === 'running' ? RECOMPUTE_POLL_MS : false),
  });
}

export function useStartScheduleRecompute() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => callData(scheduleApi.recompute),
    onSuccess: (progress) => queryClient.setQueryData(printScheduleKeys.recompute(), progress),
    onSettled: () => queryClient.invalidateQueries({ queryKey: printScheduleKeys.recompute() }),
  });
}
