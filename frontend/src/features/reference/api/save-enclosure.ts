import type { BodyIn } from '@toneledger/common/api/endpoint';
import { enclosuresApi } from '@toneledger/common/api/reference';
import { enclosureKeys } from '@/lib/reference-api';
import { createReference, updateReference, useSaveReference } from '@/features/reference/api/save-reference';

export function createEnclosure(input: BodyIn<typeof enclosuresApi.create>) {
  return createReference(enclosuresApi, input);
}

export function updateEnclosure(id: string, patch: BodyIn<typeof enclosuresApi.update>) {
  return updateReference(enclosuresApi, id, patch);
}

export function useSaveEnclosure() {
  return useSaveReference(enclosureKeys, enclosuresApi);
}
