import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { exhibitionsApi } from '@toneledger/common/api/exhibitions';
import type { exhibitionListQuerySchema } from '@toneledger/common/schemas/exhibitions';
import { call, callData } from '@/lib/api-client';

export type ExhibitionListQuery = z.output<typeof exhibitionListQuerySchema>;

/**
 * The `exhibitions` resource as several features read it: the exhibitions area lists and edits
 * them, a loan names the exhibition it is for. One set of keys, shared.
 */
export const exhibitionKeys = {
  all: ['exhibitions'] as const,
  lists: () => [...exhibitionKeys.all, 'list'] as const,
  list: (query: Partial<ExhibitionListQuery>) => [...exhibitionKeys.lists(), query] as const,
  details: () => [...exhibitionKeys.all, 'detail'] as const,
  detail: (id: string) => [...exhibitionKeys.details(), id] as const,
};

export function exhibitionsQueryOptions(query: ExhibitionListQuery) {
  return queryOptions({
    queryKey: exhibitionKeys.list(query),
    queryFn: ({ signal }) => call(exhibitionsApi.list, { query, signal }),
    placeholderData: keepPreviousData,
  });
}

export function useExhibitions(query: ExhibitionListQuery, enabled = true) {
  return useQuery({ ...exhibitionsQueryOptions(query), enabled });
}

/** One exhibition with its venues, object list, display periods and each object's light figures. */
export function exhibitionQueryOptions(id: string) {
  return queryOptions({
    queryKey: exhibitionKeys.detail(id),
    queryFn: ({ signal }) => callData(exhibitionsApi.get, { params: { id }, signal }),
  });
}

export function useExhibition(id: string) {
  return useQuery(exhibitionQueryOptions(id));
}
