import type { z } from 'zod';
import type { Paper, paperInputSchema, paperUpdateSchema } from '@toneledger/common/schemas/catalogue';
import { paperKeys } from '@/lib/reference-api';
import { createReference, updateReference, useSaveReference } from '@/features/reference/api/save-reference';

export function createPaper(input: z.input<typeof paperInputSchema>): Promise<Paper> {
  return createReference<Paper>('/api/papers', input);
}

export function updatePaper(id: string, patch: z.input<typeof paperUpdateSchema>): Promise<Paper> {
  return updateReference<Paper>('/api/papers', id, patch);
}

export function useSavePaper() {
  return useSaveReference<Paper>(paperKeys, '/api/papers');
}
