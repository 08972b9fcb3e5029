import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { printsApi } from '@toneledger/common/api/prints';
import { callData } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';

export type StepsReplace = BodyIn<typeof printsApi.replaceSteps>;

/** Replaces the whole ordered list of process steps of one print. */
export function replaceSteps(printId: string, body: StepsReplace) {
  return callData(printsApi.replaceSteps, { params: { id: printId }, body });
}

export function useReplaceSteps() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ printId, body }: { printId: string; body: StepsReplace }) => replaceSteps(printId, body),
    onSuccess: async (print) => {
      queryClient.setQueryData(printKeys.detail(print.id), print);
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: printKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: printKeys.history(print.id) }),
      ]);
    },
  });
}
