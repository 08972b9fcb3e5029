import type { BodyIn } from '@toneledger/common/api/endpoint';
import { recipesApi } from '@toneledger/common/api/reference';
import { recipeKeys } from '@/lib/reference-api';
import { createReference, updateReference, useSaveReference } from '@/features/reference/api/save-reference';

export function createRecipe(input: BodyIn<typeof recipesApi.create>) {
  return createReference(recipesApi, input);
}

export function updateRecipe(id: string, patch: BodyIn<typeof recipesApi.update>) {
  return updateReference(recipesApi, id, patch);
}

export function useSaveRecipe() {
  return useSaveReference(recipeKeys, recipesApi);
}
