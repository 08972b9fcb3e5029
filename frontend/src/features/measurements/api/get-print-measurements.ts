import { queryOptions, useQuery } from '@tanstack/react-query';
import { measurementsApi } from '@toneledger/common/api/measurements';
import { callData } from '@/lib/api-client';
import { measurementKeys } from '@/features/measurements/api/keys';

/** A print's spots, each with its change against baseline, rate and projection, and its sessions. */
export function printMeasurementsQueryOptions(printId: string) {
  return queryOptions({
    queryKey: measurementKeys.detail(printId),
    queryFn: ({ signal }) => callData(measurementsApi.forPrint, { params: { id: printId }, signal }),
  });
}

export function usePrintMeasurements(printId: string) {
  return useQuery(printMeasurementsQueryOptions(printId));
}
