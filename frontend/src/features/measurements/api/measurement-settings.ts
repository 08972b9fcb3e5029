import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { measurementSettingsApi } from '@toneledger/common/api/measurements';
import { callData } from '@/lib/api-client';
import { measurementSettingsKey } from '@/lib/settings-api';
import { measurementKeys } from '@/features/measurements/api/keys';

// The settings are read through `useMeasurementSettings` in `@/lib/settings-api` (the light panel reads them too).

export function updateMeasurementSettings(settings: BodyIn<typeof measurementSettingsApi.put>) {
  return callData(measurementSettingsApi.put, { body: settings });
}

/** A new threshold changes every projection, so all measurement queries are asked for again. */
export function useUpdateMeasurementSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateMeasurementSettings,
    onSuccess: async (settings) => {
      queryClient.setQueryData(measurementSettingsKey, settings);
      await queryClient.invalidateQueries({ queryKey: measurementKeys.all });
    },
  });
}
