import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CatalogueSettings } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { settingsKeys } from '@/features/condition/api/keys';

/** The institution's name, printed at the head of a condition report. */
export function getCatalogueSettings(signal?: AbortSignal): Promise<CatalogueSettings> {
  return requestData<CatalogueSettings>('/api/settings/catalogue', { signal });
}

export function catalogueSettingsQueryOptions() {
  return queryOptions({
    queryKey: settingsKeys.catalogue(),
    queryFn: ({ signal }) => getCatalogueSettings(signal),
    staleTime: 5 * 60_000,
  });
}

export function useCatalogueSettings() {
  return useQuery(catalogueSettingsQueryOptions());
}
