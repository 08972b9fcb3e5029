import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { PrintMeasurements, Spot, baselineChoiceSchema, spotInputSchema, spotUpdateSchema } from '@toneledger/common/schemas/measurements';
import { requestData } from '@/lib/api-client';
import { measurementKeys, spotKeys } from '@/features/measurements/api/keys';

export type SpotInput = z.input<typeof spotInputSchema>;
export type SpotUpdate = z.input<typeof spotUpdateSchema>;
export type BaselineChoice = z.input<typeof baselineChoiceSchema>;

export function createSpot(printId: string, input: SpotInput): Promise<Spot> {
  return requestData<Spot>(`/api/prints/${encodeURIComponent(printId)}/measurement-spots`, { method: 'POST', body: input });
}

export function updateSpot(id: string, update: SpotUpdate): Promise<Spot> {
  return requestData<Spot>(`/api/measurement-spots/${encodeURIComponent(id)}`, { method: 'PATCH', body: update });
}

export function chooseBaseline(id: string, choice: BaselineChoice): Promise<Spot> {
  return requestData<Spot>(`/api/measurement-spots/${encodeURIComponent(id)}/baseline`, { method: 'PUT', body: choice });
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
        : [...current.spots, { spot, baseline: null, points: [], rate: null, densityRate: null, projection: null }],
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
