import type { BodyIn } from '@toneledger/common/api/endpoint';
import { locationsApi } from '@toneledger/common/api/reference';
import { locationKeys } from '@/lib/reference-api';
import { createReference, updateReference, useSaveReference } from '@/features/reference/api/save-reference';

export function createLocation(input: BodyIn<typeof locationsApi.create>) {
  return createReference(locationsApi, input);
}

export function updateLocation(id: string, patch: BodyIn<typeof locationsApi.update>) {
  return updateReference(locationsApi, id, patch);
}

export function useSaveLocation() {
  return useSaveReference(locationKeys, locationsApi);
}
