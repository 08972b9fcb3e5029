import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { lightApi, lightSettingsApi } from '@toneledger/common/api/light';
import type { LightRecompute } from '@toneledger/common/schemas/light';
import { callData } from '@/lib/api-client';
import { lightKeys, lightSettingsKeys } from '@/features/light/api/keys';

export function useLightSettings() {
  return useQuery({
    queryKey: lightSettingsKeys.all,
    queryFn: ({ signal }) => callData(lightSettingsApi.get, { signal }),
    staleTime: 5 * 60_000,
  });
}

/** How often the progress is asked for while the recompute runs. */
export const RECOMPUTE_POLL_MS = 2_000;

/** Progress of the recompute of every print's category and light warning; asked for again while it runs. */
export function useLightRecompute() {
  return useQuery({
    queryKey: lightSettingsKeys.recompute(),
    queryFn: ({ signal }) => callData(lightApi.recompute, { signal }),
    refetchInterval: (query) => ((query.state.data as LightRecompute | null | undefined)?.status === 'running' ? RECOMPUTE_POLL_MS : false),
  });
}

/** New budgets or rules change every print's dose figures, so all light queries are asked for again. */
export function useUpdateLightSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: BodyIn<typeof lightSettingsApi.put>) => callData(lightSettingsApi.put, { body }),
    onSuccess: async (settings) => {
      queryClient.setQueryData(lightSettingsKeys.all, settings);
      await queryClient.invalidateQueries({ queryKey: lightSettingsKeys.recompute() });
      await queryClient.invalidateQueries({ queryKey: lightKeys.all });
    },
  });
}
