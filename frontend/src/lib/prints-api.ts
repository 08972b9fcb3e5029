import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { printsApi } from '@toneledger/common/api/prints';
import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { call, callData } from '@/lib/api-client';

/**
 * The `prints` resource as several features read it: the catalogue lists and edits prints, the
 * condition and measurement screens open one and find one by search. One set of keys, one query
 * per endpoint, shared; features never define their own.
 */
export const printKeys = {
  all: ['prints'] as const,
  lists: () => [...printKeys.all, 'list'] as const,
  list: (query: Partial<PrintListQuery>) => [...printKeys.lists(), query] as const,
  details: () => [...printKeys.all, 'detail'] as const,
  detail: (id: string) => [...printKeys.details(), id] as const,
  movements: (id: string) => [...printKeys.detail(id), 'movements'] as const,
  history: (id: string) => [...printKeys.detail(id), 'history'] as const,
  timeline: (id: string) => [...printKeys.detail(id), 'timeline'] as const,
};

/** A page of the catalogue for a list query (the URL's search params). */
export function printsQueryOptions(query: PrintListQuery) {
  return queryOptions({
    queryKey: printKeys.list(query),
    queryFn: ({ signal }) => call(printsApi.list, { query, signal }),
    placeholderData: keepPreviousData,
  });
}

export function usePrints(query: PrintListQuery) {
  return useQuery(printsQueryOptions(query));
}

export interface PrintSearchQuery {
  q: string;
  pageSize: number;
}

/** Finds prints by accession number or words (the catalogue's own full-text search), for pickers. */
export function findPrintsQueryOptions(query: PrintSearchQuery) {
  return queryOptions({
    queryKey: printKeys.list(query),
    queryFn: ({ signal }) => call(printsApi.list, { query, signal }),
    placeholderData: keepPreviousData,
  });
}

export function useFindPrints(query: PrintSearchQuery) {
  return useQuery({ ...findPrintsQueryOptions(query), enabled: query.q.trim() !== '' });
}

/** One print with its process history and warnings. */
export function printQueryOptions(id: string) {
  return queryOptions({
    queryKey: printKeys.detail(id),
    queryFn: ({ signal }) => callData(printsApi.get, { params: { id }, signal }),
  });
}

export function usePrint(id: string, enabled = true) {
  return useQuery({ ...printQueryOptions(id), enabled: enabled && id !== '' });
}

/** The print's whole life in one list, newest first: cataloguing, movements, condition, images, fixity. */
export function timelineQueryOptions(printId: string) {
  return queryOptions({
    queryKey: printKeys.timeline(printId),
    queryFn: ({ signal }) => callData(printsApi.timeline, { params: { id: printId }, signal }),
  });
}

export function useTimeline(printId: string) {
  return useQuery(timelineQueryOptions(printId));
}
