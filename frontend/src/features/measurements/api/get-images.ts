import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { requestData } from '@/lib/api-client';
import { imageKeys } from '@/features/measurements/api/keys';

/** A print's images (not withdrawn ones); the spots are placed on their screen copies. */
export function getImages(printId: string, signal?: AbortSignal): Promise<PrintImage[]> {
  return requestData<PrintImage[]>(`/api/prints/${encodeURIComponent(printId)}/images`, { signal });
}

export function imagesQueryOptions(printId: string) {
  return queryOptions({
    queryKey: imageKeys.list(printId),
    queryFn: ({ signal }) => getImages(printId, signal),
  });
}

export function useImages(printId: string) {
  return useQuery(imagesQueryOptions(printId));
}
