import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { imagesApi } from '@toneledger/common/api/images';
import { callData } from '@/lib/api-client';
import { alignmentKeys, type AlignmentQuery } from '@/features/condition/api/keys';

export type AlignmentInput = BodyIn<typeof imagesApi.saveAlignment>;

export function alignmentQueryOptions(query: AlignmentQuery) {
  return queryOptions({
    queryKey: alignmentKeys.detail(query),
    queryFn: ({ signal }) => callData(imagesApi.alignment, { query, signal }),
  });
}

export function useAlignment(query: AlignmentQuery | null) {
  return useQuery({
    ...alignmentQueryOptions(query ?? { baseImageId: '', otherImageId: '' }),
    enabled: query !== null && query.baseImageId !== '' && query.otherImageId !== '' && query.baseImageId !== query.otherImageId,
  });
}

export function saveAlignment(input: AlignmentInput) {
  return callData(imagesApi.saveAlignment, { body: input });
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
