import type { z } from 'zod';
import type { Recipe, recipeInputSchema, recipeUpdateSchema } from '@toneledger/common/schemas/catalogue';
import { recipeKeys } from '@/lib/reference-api';
import { createReference, updateReference, useSaveReference } from '@/features/reference/api/save-reference';

export function createRecipe(input: z.input<typeof recipeInputSchema>): Promise<Recipe> {
  return createReference<Recipe>('/api/recipes', input);
}

export function updateRecipe(id: string, patch: z.input<typeof recipeUpdateSchema>): Promise<Recipe> {
  return updateReference<Recipe>('/api/recipes', id, patch);
}

export function useSaveRecipe() {
  return useSaveReference<Recipe>(recipeKeys, '/api/recipes');
}
