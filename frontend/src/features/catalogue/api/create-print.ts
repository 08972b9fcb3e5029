import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Print, PrintInput } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { printKeys } from '@/features/catalogue/api/keys';

export function createPrint(input: PrintInput): Promise<Print> {
  return requestData<Print>('/api/prints', { method: 'POST', body: input });
}

export function useCreatePrint() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createPrint,
    onSuccess: async (print) => {
      queryClient.setQueryData(printKeys.detail(print.id), print);
      await queryClient.invalidateQueries({ queryKey: printKeys.lists() });
    },
  });
}
