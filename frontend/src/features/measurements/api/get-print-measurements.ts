import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PrintMeasurements } from '@toneledger/common/schemas/measurements';
import { requestData } from '@/lib/api-client';
import { measurementKeys } from '@/features/measurements/api/keys';

/** A print's spots, each with its change against baseline, rate and projection, and its sessions. */
export function getPrintMeasurements(printId: string, signal?: AbortSignal): Promise<PrintMeasurements> {
  return requestData<PrintMeasurements>(`/api/prints/${encodeURIComponent(printId)}/measurements`, { signal });
}

export function printMeasurementsQueryOptions(printId: string) {
  return queryOptions({
    queryKey: measurementKeys.detail(printId),
    queryFn: ({ signal }) => getPrintMeasurements(printId, signal),
  });
}

export function usePrintMeasurements(printId: string) {
  return useQuery(printMeasurementsQueryOptions(printId));
}
