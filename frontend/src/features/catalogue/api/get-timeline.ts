import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TimelineEntry } from '@toneledger/common/schemas/images';
import { requestData } from '@/lib/api-client';
import { printKeys } from '@/features/catalogue/api/keys';

/** The print's whole life in one list, newest first: cataloguing, movements, condition, images, fixity. */
export function getTimeline(printId: string, signal?: AbortSignal): Promise<TimelineEntry[]> {
  return requestData<TimelineEntry[]>(`/api/prints/${encodeURIComponent(printId)}/timeline`, { signal });
}

export const timelineKey = (printId: string) => [...printKeys.detail(printId), 'timeline'] as const;

export function timelineQueryOptions(printId: string) {
  return queryOptions({
    queryKey: timelineKey(printId),
    queryFn: ({ signal }) => getTimeline(printId, signal),
  });
}

export function useTimeline(printId: string) {
  return useQuery(timelineQueryOptions(printId));
}
