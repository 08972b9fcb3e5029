import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { lightSettingsApi } from '@toneledger/common/api/light';
import { callData } from '@/lib/api-client';
import { lightKeys, lightSettingsKeys } from '@/features/light/api/keys';

export function useLightSettings() {
  return useQuery({
    queryKey: lightSettingsKeys.all,
    queryFn: ({ signal }) => callData(lightSettingsApi.get, { signal }),
    staleTime: 5 * 60_000,
  });
}

/** New budgets or rules change every print's dose figures, so all light queries are asked for again. */
export function useUpdateLightSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: BodyIn<typeof lightSettingsApi.put>) => callData(lightSettingsApi.put, { body }),
    onSuccess: async (settings) => {
      queryClient.setQueryData(lightSettingsKeys.all, settings);
      await queryClient.invalidateQueries({ queryKey: lightKeys.all });
    },
  });
}
