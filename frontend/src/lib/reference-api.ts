import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Enclosure, Location, Maker, Paper, Recipe } from '@toneledger/common/schemas/catalogue';
import { requestPage } from '@/lib/api-client';

/**
 * Query keys and list queries for the catalogue's reference records (makers, papers, bath recipes,
 * locations, enclosure types). Shared: the reference screens edit them, and the print form picks
 * from them. Keys are rooted at the API resource name.
 */
export interface ReferenceListQuery {
  q?: string;
  page?: number;
  pageSize?: number;
}

function keysFor<R extends string>(resource: R) {
  const all = [resource] as const;
  return {
    all,
    lists: () => [...all, 'list'] as const,
    list: (query: ReferenceListQuery) => [...all, 'list', query] as const,
    details: () => [...all, 'detail'] as const,
    detail: (id: string) => [...all, 'detail', id] as const,
  };
}

export const makerKeys = keysFor('makers');
export const paperKeys = keysFor('papers');
export const recipeKeys = keysFor('recipes');
export const locationKeys = keysFor('locations');
export const enclosureKeys = keysFor('enclosures');

function listOptions<T>(keys: ReturnType<typeof keysFor>, path: string, query: ReferenceListQuery) {
  return queryOptions({
    queryKey: keys.list(query),
    queryFn: ({ signal }) => requestPage<T>(path, { query: { pageSize: 1000, ...query }, signal }),
    staleTime: 30_000,
  });
}

export const makersQueryOptions = (query: ReferenceListQuery = {}) => listOptions<Maker>(makerKeys, '/api/makers', query);
export const papersQueryOptions = (query: ReferenceListQuery = {}) => listOptions<Paper>(paperKeys, '/api/papers', query);
export const recipesQueryOptions = (query: ReferenceListQuery = {}) => listOptions<Recipe>(recipeKeys, '/api/recipes', query);
export const locationsQueryOptions = (query: ReferenceListQuery = {}) => listOptions<Location>(locationKeys, '/api/locations', query);
export const enclosuresQueryOptions = (query: ReferenceListQuery = {}) => listOptions<Enclosure>(enclosureKeys, '/api/enclosures', query);

export const useMakers = (query?: ReferenceListQuery) => useQuery(makersQueryOptions(query));
export const usePapers = (query?: ReferenceListQuery) => useQuery(papersQueryOptions(query));
export const useRecipes = (query?: ReferenceListQuery) => useQuery(recipesQueryOptions(query));
export const useLocations = (query?: ReferenceListQuery, enabled = true) => useQuery({ ...locationsQueryOptions(query), enabled });
export const useEnclosures = (query?: ReferenceListQuery) => useQuery(enclosuresQueryOptions(query));
