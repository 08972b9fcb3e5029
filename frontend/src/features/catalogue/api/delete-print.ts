import { useMutation, useQueryClient } from '@tanstack/react-query';
import { requestData } from '@/lib/api-client';
import { printKeys } from '@/features/catalogue/api/keys';

export function deletePrint(id: string, version: number): Promise<{ id: string }> {
  return requestData<{ id: string }>(`/api/prints/${encodeURIComponent(id)}`, { method: 'DELETE', query: { version } });
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
