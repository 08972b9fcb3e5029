import { queryOptions, useQuery } from '@tanstack/react-query';
import { catalogueSettingsApi } from '@toneledger/common/api/reference';
import { measurementSettingsApi } from '@toneledger/common/api/measurements';
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

/**
 * The measurement settings (the ΔE00 taken as a noticeable change), read by the measurements
 * screens and by the light panel (whether a planned display would reach it). One key and one query.
 */
export const measurementSettingsKey = ['settings', 'measurements'] as const;

export function measurementSettingsQueryOptions() {
  return queryOptions({
    queryKey: measurementSettingsKey,
    queryFn: ({ signal }) => callData(measurementSettingsApi.get, { signal }),
    staleTime: 5 * 60_000,
  });
}

/** `enabled: false` for a role that may not read them, so nothing is asked. */
export function useMeasurementSettings(enabled = true) {
  return useQuery({ ...measurementSettingsQueryOptions(), enabled });
}
