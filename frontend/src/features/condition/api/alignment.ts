import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { Alignment, alignmentInputSchema } from '@toneledger/common/schemas/images';
import { requestData } from '@/lib/api-client';
import { alignmentKeys, type AlignmentQuery } from '@/features/condition/api/keys';

export type AlignmentInput = z.infer<typeof alignmentInputSchema>;

export function getAlignment(query: AlignmentQuery, signal?: AbortSignal): Promise<Alignment | null> {
  return requestData<Alignment | null>('/api/image-alignments', { query: { ...query }, signal });
}

export function alignmentQueryOptions(query: AlignmentQuery) {
  return queryOptions({
    queryKey: alignmentKeys.detail(query),
    queryFn: ({ signal }) => getAlignment(query, signal),
  });
}

export function useAlignment(query: AlignmentQuery | null) {
  return useQuery({
    ...alignmentQueryOptions(query ?? { baseImageId: '', otherImageId: '' }),
    enabled: query !== null && query.baseImageId !== '' && query.otherImageId !== '' && query.baseImageId !== query.otherImageId,
  });
}

export function saveAlignment(input: AlignmentInput): Promise<Alignment> {
  return requestData<Alignment>('/api/image-alignments', { method: 'PUT', body: input });
}

export function useSaveAlignment() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveAlignment,
    onSuccess: (saved) => {
      queryClient.setQueryData(alignmentKeys.detail({ baseImageId: saved.baseImageId, otherImageId: saved.otherImageId }), saved);
    },
  });
}
