import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { printsApi } from '@toneledger/common/api/prints';
import { callData, isApiError } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';

export type MovementInput = BodyIn<typeof printsApi.move>;

export function movePrint(printId: string, input: MovementInput) {
  return callData(printsApi.move, { params: { id: printId }, body: input });
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
