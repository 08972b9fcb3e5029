import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { catalogueSettingsApi } from '@toneledger/common/api/reference';
import { callData } from '@/lib/api-client';
import { catalogueSettingsKey } from '@/lib/settings-api';

export function updateCatalogueSettings(settings: BodyIn<typeof catalogueSettingsApi.put>) {
  return callData(catalogueSettingsApi.put, { body: settings });
}

export function useUpdateCatalogueSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCatalogueSettings,
    onSuccess: (settings) => queryClient.setQueryData(catalogueSettingsKey, settings),
  });
}
