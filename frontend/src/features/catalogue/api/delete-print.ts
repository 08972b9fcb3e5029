import { useMutation, useQueryClient } from '@tanstack/react-query';
import { printsApi } from '@toneledger/common/api/prints';
import { callData } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';

export function deletePrint(id: string, version: number) {
  return callData(printsApi.remove, { params: { id }, query: { version } });
}

export function useDeletePrint() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => deletePrint(id, version),
    onSuccess: async ({ id }) => {
      queryClient.removeQueries({ queryKey: printKeys.detail(id) });
      await queryClient.invalidateQueries({ queryKey: printKeys.lists() });
    },
  });
}
