import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Print, PrintUpdate } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { printKeys } from '@/features/catalogue/api/keys';

export function updatePrint(id: string, update: PrintUpdate): Promise<Print> {
  return requestData<Print>(`/api/prints/${encodeURIComponent(id)}`, { method: 'PATCH', body: update });
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
