import type { z } from 'zod';
import type { Location, locationInputSchema, locationUpdateSchema } from '@toneledger/common/schemas/catalogue';
import { locationKeys } from '@/lib/reference-api';
import { createReference, updateReference, useSaveReference } from '@/features/reference/api/save-reference';

export function createLocation(input: z.input<typeof locationInputSchema>): Promise<Location> {
  return createReference<Location>('/api/locations', input);
}

export function updateLocation(id: string, patch: z.input<typeof locationUpdateSchema>): Promise<Location> {
  return updateReference<Location>('/api/locations', id, patch);
}

export function useSaveLocation() {
  return useSaveReference<Location>(locationKeys, '/api/locations');
}
