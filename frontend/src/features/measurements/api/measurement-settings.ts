import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { measurementSettingsApi } from '@toneledger/common/api/measurements';
import { callData } from '@/lib/api-client';
import { measurementKeys, settingsKeys } from '@/features/measurements/api/keys';

export function measurementSettingsQueryOptions() {
  return queryOptions({
    queryKey: settingsKeys.measurements(),
    queryFn: ({ signal }) => callData(measurementSettingsApi.get, { signal }),
    staleTime: 5 * 60_000,
  });
}

export function useMeasurementSettings() {
  return useQuery(measurementSettingsQueryOptions());
}

export function updateMeasurementSettings(settings: BodyIn<typeof measurementSettingsApi.put>) {
  return callData(measurementSettingsApi.put, { body: settings });
}

/** A new threshold changes every projection, so all measurement queries are asked for again. */
export function useUpdateMeasurementSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateMeasurementSettings,
    onSuccess: async (settings) => {
      queryClient.setQueryData(settingsKeys.measurements(), settings);
      await queryClient.invalidateQueries({ queryKey: measurementKeys.all });
    },
  });
}
