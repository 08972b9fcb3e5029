import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { requestData } from '@/lib/api-client';
import { imageKeys, type ImageListQuery } from '@/features/condition/api/keys';

/** How often the list is asked again while display copies are still being made. */
export const PENDING_POLL_MS = 1500;

export function getImages(printId: string, query: ImageListQuery = {}, signal?: AbortSignal): Promise<PrintImage[]> {
  return requestData<PrintImage[]>(`/api/prints/${encodeURIComponent(printId)}/images`, {
    query: { includeWithdrawn: query.includeWithdrawn ? 'true' : undefined },
    signal,
  });
}

export function imagesQueryOptions(printId: string, query: ImageListQuery = {}) {
  return queryOptions({
    queryKey: imageKeys.list(printId, query),
    queryFn: ({ signal }) => getImages(printId, query, signal),
    // Display copies are made in the background after an upload: ask again until none is pending.
    refetchInterval: (q) => (q.state.data?.some((image) => image.derivatives === 'pending') ? PENDING_POLL_MS : false),
  });
}

export function useImages(printId: string, query: ImageListQuery = {}, enabled = true) {
  return useQuery({ ...imagesQueryOptions(printId, query), enabled });
}
