import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { measurementSettingsSchema } from '@toneledger/common/schemas/measurements';
import { requestData } from '@/lib/api-client';
import { measurementKeys, settingsKeys } from '@/features/measurements/api/keys';

export type MeasurementSettings = z.infer<typeof measurementSettingsSchema>;

export function getMeasurementSettings(signal?: AbortSignal): Promise<MeasurementSettings> {
  return requestData<MeasurementSettings>('/api/settings/measurements', { signal });
}

export function measurementSettingsQueryOptions() {
  return queryOptions({
    queryKey: settingsKeys.measurements(),
    queryFn: ({ signal }) => getMeasurementSettings(signal),
    staleTime: 5 * 60_000,
  });
}

export function useMeasurementSettings() {
  return useQuery(measurementSettingsQueryOptions());
}

export function updateMeasurementSettings(settings: MeasurementSettings): Promise<MeasurementSettings> {
  return requestData<MeasurementSettings>('/api/settings/measurements', { method: 'PUT', body: settings });
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
