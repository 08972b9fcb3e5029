import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CatalogueSettings } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { catalogueSettingsKey } from '@/lib/settings-api';

export function updateCatalogueSettings(settings: CatalogueSettings): Promise<CatalogueSettings> {
  return requestData<CatalogueSettings>('/api/settings/catalogue', { method: 'PUT', body: settings });
}

export function useUpdateCatalogueSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCatalogueSettings,
    onSuccess: (settings) => queryClient.setQueryData(catalogueSettingsKey, settings),
  });
}
