import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { printsApi } from '@toneledger/common/api/prints';
import { callData } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';

export type PrintUpdate = BodyIn<typeof printsApi.update>;

export function updatePrint(id: string, update: PrintUpdate) {
  return callData(printsApi.update, { params: { id }, body: update });
}

export function useUpdatePrint() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, update }: { id: string; update: PrintUpdate }) => updatePrint(id, update),
    onSuccess: async (print) => {
      queryClient.setQueryData(printKeys.detail(print.id), print);
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: printKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: printKeys.history(print.id) }),
      ]);
    },
  });
}
