import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Print, ProcessStepInput } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { printKeys } from '@/features/catalogue/api/keys';

export interface StepsReplace {
  version: number;
  steps: ProcessStepInput[];
}

/** Replaces the whole ordered list of process steps of one print. */
export function replaceSteps(printId: string, body: StepsReplace): Promise<Print> {
  return requestData<Print>(`/api/prints/${encodeURIComponent(printId)}/steps`, { method: 'PUT', body });
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
