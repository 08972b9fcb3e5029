import type { BodyIn } from '@toneledger/common/api/endpoint';
import { makersApi } from '@toneledger/common/api/reference';
import { makerKeys } from '@/lib/reference-api';
import { createReference, updateReference, useSaveReference } from '@/features/reference/api/save-reference';

export function createMaker(input: BodyIn<typeof makersApi.create>) {
  return createReference(makersApi, input);
}

export function updateMaker(id: string, patch: BodyIn<typeof makersApi.update>) {
  return updateReference(makersApi, id, patch);
}

export function useSaveMaker() {
  return useSaveReference(makerKeys, makersApi);
}
