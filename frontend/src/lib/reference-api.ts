import { queryOptions, useQuery } from '@tanstack/react-query';
import { enclosuresApi, locationsApi, makersApi, papersApi, recipesApi } from '@toneledger/common/api/reference';
import type { ResponseOf } from '@toneledger/common/api/endpoint';
import { call } from '@/lib/api-client';

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

type ReferenceContract = typeof makersApi | typeof papersApi | typeof recipesApi | typeof locationsApi | typeof enclosuresApi;

function listOptions<C extends ReferenceContract>(keys: ReturnType<typeof keysFor>, contract: C, query: ReferenceListQuery) {
  return queryOptions({
    queryKey: keys.list(query),
    // The five lists share one shape (a page of their own item): typed per contract at each call site.
    queryFn: ({ signal }) =>
      call(contract.list as typeof makersApi.list, { query: { pageSize: 1000, ...query }, signal }) as Promise<ResponseOf<C['list']>>,
    staleTime: 30_000,
  });
}

export const makersQueryOptions = (query: ReferenceListQuery = {}) => listOptions(makerKeys, makersApi, query);
export const papersQueryOptions = (query: ReferenceListQuery = {}) => listOptions(paperKeys, papersApi, query);
export const recipesQueryOptions = (query: ReferenceListQuery = {}) => listOptions(recipeKeys, recipesApi, query);
export const locationsQueryOptions = (query: ReferenceListQuery = {}) => listOptions(locationKeys, locationsApi, query);
export const enclosuresQueryOptions = (query: ReferenceListQuery = {}) => listOptions(enclosureKeys, enclosuresApi, query);

export const useMakers = (query?: ReferenceListQuery) => useQuery(makersQueryOptions(query));
export const usePapers = (query?: ReferenceListQuery) => useQuery(papersQueryOptions(query));
export const useRecipes = (query?: ReferenceListQuery) => useQuery(recipesQueryOptions(query));
export const useLocations = (query?: ReferenceListQuery, enabled = true) => useQuery({ ...locationsQueryOptions(query), enabled });
export const useEnclosures = (query?: ReferenceListQuery) => useQuery(enclosuresQueryOptions(query));
