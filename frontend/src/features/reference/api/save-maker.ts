import type { z } from 'zod';
import type { Maker, makerInputSchema, makerUpdateSchema } from '@toneledger/common/schemas/catalogue';
import { makerKeys } from '@/lib/reference-api';
import { createReference, updateReference, useSaveReference } from '@/features/reference/api/save-reference';

export function createMaker(input: z.input<typeof makerInputSchema>): Promise<Maker> {
  return createReference<Maker>('/api/makers', input);
}

export function updateMaker(id: string, patch: z.input<typeof makerUpdateSchema>): Promise<Maker> {
  return updateReference<Maker>('/api/makers', id, patch);
}

export function useSaveMaker() {
  return useSaveReference<Maker>(makerKeys, '/api/makers');
}
