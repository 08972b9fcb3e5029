import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CatalogueSettings } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { settingsKeys } from '@/features/reference/api/keys';

export function updateCatalogueSettings(settings: CatalogueSettings): Promise<CatalogueSettings> {
  return requestData<CatalogueSettings>('/api/settings/catalogue', { method: 'PUT', body: settings });
}

export function useUpdateCatalogueSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCatalogueSettings,
    onSuccess: (settings) => queryClient.setQueryData(settingsKeys.catalogue(), settings),
  });
}
