import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { printsApi } from '@toneledger/common/api/prints';
import { callData } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';

export function createPrint(input: BodyIn<typeof printsApi.create>) {
  return callData(printsApi.create, { body: input });
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
