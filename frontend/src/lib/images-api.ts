import { queryOptions, useQuery } from '@tanstack/react-query';
import { imagesApi } from '@toneledger/common/api/images';
import { callData } from '@/lib/api-client';

export interface ImageListQuery {
  includeWithdrawn?: boolean;
}

/**
 * The `images` resource as several features read it: the condition screens show and edit a print's
 * images, the measurement screens place spots on them. Lists are per print; fixity history sits under an image.
 */
export const imageKeys = {
  all: ['images'] as const,
  lists: () => [...imageKeys.all, 'list'] as const,
  list: (printId: string, query: ImageListQuery = {}) => [...imageKeys.lists(), { printId, ...query }] as const,
  details: () => [...imageKeys.all, 'detail'] as const,
  detail: (id: string) => [...imageKeys.details(), id] as const,
  fixity: (id: string) => [...imageKeys.detail(id), 'fixity'] as const,
};

/** How often the list is asked again while display copies are still being made. */
export const PENDING_POLL_MS = 1500;

/** A print's images, oldest capture first; withdrawn ones only when asked (staff). */
export function imagesQueryOptions(printId: string, query: ImageListQuery = {}) {
  return queryOptions({
    queryKey: imageKeys.list(printId, query),
    queryFn: ({ signal }) =>
      callData(imagesApi.list, { params: { id: printId }, query: { includeWithdrawn: query.includeWithdrawn ? 'true' : undefined }, signal }),
    // Display copies are made in the background after an upload: ask again until none is pending.
    refetchInterval: (q) => (q.state.data?.some((image) => image.derivatives === 'pending') ? PENDING_POLL_MS : false),
  });
}

export function useImages(printId: string, query: ImageListQuery = {}, enabled = true) {
  return useQuery({ ...imagesQueryOptions(printId, query), enabled });
}
