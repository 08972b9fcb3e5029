import type { BodyIn } from '@toneledger/common/api/endpoint';
import { papersApi } from '@toneledger/common/api/reference';
import { paperKeys } from '@/lib/reference-api';
import { createReference, updateReference, useSaveReference } from '@/features/reference/api/save-reference';

export function createPaper(input: BodyIn<typeof papersApi.create>) {
  return createReference(papersApi, input);
}

export function updatePaper(id: string, patch: BodyIn<typeof papersApi.update>) {
  return updateReference(papersApi, id, patch);
}

export function useSavePaper() {
  return useSaveReference(paperKeys, papersApi);
}
