import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { printsApi } from '@toneledger/common/api/prints';
import { callData } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';

export function deletePrint(id: string, version: number) {
  return callData(printsApi.remove, { params: { id }, query: { version } });
}

/** Whether the print may be deleted now, asked before the command is offered (the delete applies the same rule). */
export function usePrintDeletion(id: string, version: number) {
  return useQuery({
    queryKey: [...printKeys.detail(id), 'deletion', version] as const,
    queryFn: ({ signal }) => callData(printsApi.deletion, { params: { id }, signal }),
  });
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
