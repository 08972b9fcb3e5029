import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Print } from '@toneledger/common/schemas/catalogue';
import { isApiError, requestData } from '@/lib/api-client';
import { printKeys } from '@/features/catalogue/api/keys';

export interface MovementInput {
  toLocationId: string;
  reason: string;
  movedAt?: string;
  version: number;
}

export function movePrint(printId: string, input: MovementInput): Promise<Print> {
  return requestData<Print>(`/api/prints/${encodeURIComponent(printId)}/movements`, { method: 'POST', body: input });
}

export function useMovePrint() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ printId, input }: { printId: string; input: MovementInput }) => movePrint(printId, input),
    onSuccess: async (print) => {
      queryClient.setQueryData(printKeys.detail(print.id), print);
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: printKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: printKeys.movements(print.id) }),
        queryClient.invalidateQueries({ queryKey: printKeys.history(print.id) }),
      ]);
    },
    // Someone saved the print in between: load the current record, so a retry carries its version.
    onError: async (error, { printId }) => {
      if (isApiError(error) && error.code === 'conflict') await queryClient.invalidateQueries({ queryKey: printKeys.detail(printId) });
    },
  });
}
