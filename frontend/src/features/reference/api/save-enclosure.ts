import type { z } from 'zod';
import type { Enclosure, enclosureInputSchema, enclosureUpdateSchema } from '@toneledger/common/schemas/catalogue';
import { enclosureKeys } from '@/lib/reference-api';
import { createReference, updateReference, useSaveReference } from '@/features/reference/api/save-reference';

export function createEnclosure(input: z.input<typeof enclosureInputSchema>): Promise<Enclosure> {
  return createReference<Enclosure>('/api/enclosures', input);
}

export function updateEnclosure(id: string, patch: z.input<typeof enclosureUpdateSchema>): Promise<Enclosure> {
  return updateReference<Enclosure>('/api/enclosures', id, patch);
}

export function useSaveEnclosure() {
  return useSaveReference<Enclosure>(enclosureKeys, '/api/enclosures');
}
