import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { lightApi } from '@toneledger/common/api/light';
import { callData } from '@/lib/api-client';
import { lightKeys } from '@/features/light/api/keys';

export function printLightQueryOptions(printId: string) {
  return queryOptions({
    queryKey: lightKeys.detail(printId),
    queryFn: ({ signal }) => callData(lightApi.print, { params: { id: printId }, signal }),
  });
}

/** A print's light dose; `enabled: false` for a role that may not read it, so nothing is asked. */
export function usePrintLight(printId: string, enabled = true) {
  return useQuery({ ...printLightQueryOptions(printId), enabled });
}

/** Sets or clears a conservator's category; the answer is the print's light dose again. */
export function useOverrideCategory(printId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: BodyIn<typeof lightApi.override>) => callData(lightApi.override, { params: { id: printId }, body }),
    onSuccess: async (light) => {
      queryClient.setQueryData(lightKeys.detail(printId), light);
      await queryClient.invalidateQueries({ queryKey: lightKeys.overBudget() });
    },
  });
}

export function useOverBudget() {
  return useQuery({
    queryKey: lightKeys.overBudget(),
    queryFn: ({ signal }) => callData(lightApi.overBudget, { signal }),
  });
}
