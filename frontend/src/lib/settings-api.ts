import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CatalogueSettings } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';

/**
 * The catalogue settings (institution name, accession-number pattern), read by several features:
 * the print form checks numbers against the pattern, the condition report prints the name, and
 * the settings page edits them. One key and one query, shared.
 */
export const catalogueSettingsKey = ['settings', 'catalogue'] as const;

export function getCatalogueSettings(signal?: AbortSignal): Promise<CatalogueSettings> {
  return requestData<CatalogueSettings>('/api/settings/catalogue', { signal });
}

export function catalogueSettingsQueryOptions() {
  return queryOptions({
    queryKey: catalogueSettingsKey,
    queryFn: ({ signal }) => getCatalogueSettings(signal),
    staleTime: 5 * 60_000,
  });
}

export function useCatalogueSettings() {
  return useQuery(catalogueSettingsQueryOptions());
}
