import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { measurementsApi } from '@toneledger/common/api/measurements';
import type { PrintMeasurements, Spot } from '@toneledger/common/schemas/measurements';
import { callData } from '@/lib/api-client';
import { measurementKeys, spotKeys } from '@/features/measurements/api/keys';

export type SpotInput = BodyIn<typeof measurementsApi.createSpot>;
export type SpotUpdate = BodyIn<typeof measurementsApi.updateSpot>;
export type BaselineChoice = BodyIn<typeof measurementsApi.chooseBaseline>;

export function createSpot(printId: string, input: SpotInput) {
  return callData(measurementsApi.createSpot, { params: { id: printId }, body: input });
}

export function updateSpot(id: string, update: SpotUpdate) {
  return callData(measurementsApi.updateSpot, { params: { id }, body: update });
}

export function chooseBaseline(id: string, choice: BaselineChoice) {
  return callData(measurementsApi.chooseBaseline, { params: { id }, body: choice });
}

/**
 * A saved spot: its detail is set, and put into the print's measurements at once (so its name,
 * place and version show without waiting); the analysis, which a new baseline changes, and the
 * collection-wide list are then asked for again.
 */
async function stored(queryClient: QueryClient, spot: Spot) {
  queryClient.setQueryData(spotKeys.detail(spot.id), spot);
  queryClient.setQueryData<PrintMeasurements>(measurementKeys.detail(spot.printId), (current) => {
    if (!current) return current;
    const known = current.spots.some((s) => s.spot.id === spot.id);
    return {
      ...current,
      spots: known
        ? current.spots.map((s) => (s.spot.id === spot.id ? { ...s, spot } : s))
        : [...current.spots, { spot, baseline: null, points: [], rate: null, densityChangeRate: null, densityLossRate: null, projection: null }],
    };
  });
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: measurementKeys.detail(spot.printId) }),
    queryClient.invalidateQueries({ queryKey: measurementKeys.lists() }),
  ]);
}

export function useCreateSpot() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ printId, input }: { printId: string; input: SpotInput }) => createSpot(printId, input),
    onSuccess: (spot) => stored(queryClient, spot),
  });
}

export function useUpdateSpot() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, update }: { id: string; update: SpotUpdate }) => updateSpot(id, update),
    onSuccess: (spot) => stored(queryClient, spot),
  });
}

export function useChooseBaseline() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, choice }: { id: string; choice: BaselineChoice }) => chooseBaseline(id, choice),
    onSuccess: (spot) => stored(queryClient, spot),
  });
}
