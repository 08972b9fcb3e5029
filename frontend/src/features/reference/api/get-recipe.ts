import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Recipe } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { recipeKeys } from '@/lib/reference-api';

export function getRecipe(id: string, signal?: AbortSignal): Promise<Recipe> {
  return requestData<Recipe>(`/api/recipes/${encodeURIComponent(id)}`, { signal });
}

export function recipeQueryOptions(id: string) {
  return queryOptions({
    queryKey: recipeKeys.detail(id),
    queryFn: ({ signal }) => getRecipe(id, signal),
  });
}

export function useRecipe(id: string, enabled = true) {
  return useQuery({ ...recipeQueryOptions(id), enabled });
}
