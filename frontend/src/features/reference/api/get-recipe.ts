import { queryOptions, useQuery } from '@tanstack/react-query';
import { recipesApi } from '@toneledger/common/api/reference';
import { callData } from '@/lib/api-client';
import { recipeKeys } from '@/lib/reference-api';

export function recipeQueryOptions(id: string) {
  return queryOptions({
    queryKey: recipeKeys.detail(id),
    queryFn: ({ signal }) => callData(recipesApi.get, { params: { id }, signal }),
  });
}

export function useRecipe(id: string, enabled = true) {
  return useQuery({ ...recipeQueryOptions(id), enabled });
}
