import { queryOptions, useQuery } from '@tanstack/react-query';
import { catalogueSettingsApi } from '@toneledger/common/api/reference';
import { callData } from '@/lib/api-client';

/**
 * The catalogue settings (institution name, accession-number pattern), read by several features:
 * the print form checks numbers against the pattern, the condition report prints the name, and
 * the settings page edits them. One key and one query, shared.
 */
export const catalogueSettingsKey = ['settings', 'catalogue'] as const;

export function catalogueSettingsQueryOptions() {
  return queryOptions({
    queryKey: catalogueSettingsKey,
    queryFn: ({ signal }) => callData(catalogueSettingsApi.get, { signal }),
    staleTime: 5 * 60_000,
  });
}

export function useCatalogueSettings() {
  return useQuery(catalogueSettingsQueryOptions());
}
