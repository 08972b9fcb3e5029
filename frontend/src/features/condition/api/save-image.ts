import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { FixityResult, PrintImage, imageDeleteSchema, imageUpdateSchema } from '@toneledger/common/schemas/images';
import { requestData } from '@/lib/api-client';
import { fixityKeys, imageKeys, printKeys } from '@/features/condition/api/keys';

export type ImageUpdate = z.input<typeof imageUpdateSchema>;
export type ImageWithdrawal = z.input<typeof imageDeleteSchema>;

export function updateImage(id: string, update: ImageUpdate): Promise<PrintImage> {
  return requestData<PrintImage>(`/api/images/${encodeURIComponent(id)}`, { method: 'PATCH', body: update });
}

export function withdrawImage(id: string, withdrawal: ImageWithdrawal): Promise<PrintImage> {
  return requestData<PrintImage>(`/api/images/${encodeURIComponent(id)}/withdraw`, { method: 'POST', body: withdrawal });
}

export function checkFixity(id: string): Promise<FixityResult> {
  return requestData<FixityResult>(`/api/images/${encodeURIComponent(id)}/fixity`, { method: 'POST', body: {} });
}

/** A changed image: its detail is set; the image lists and the print's timeline are refreshed. */
export async function imageStored(queryClient: QueryClient, image: PrintImage) {
  queryClient.setQueryData(imageKeys.detail(image.id), image);
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: imageKeys.lists() }),
    queryClient.invalidateQueries({ queryKey: printKeys.timeline(image.printId) }),
  ]);
}

export function useUpdateImage() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, update }: { id: string; update: ImageUpdate }) => updateImage(id, update),
    onSuccess: (image) => imageStored(queryClient, image),
  });
}

export function useWithdrawImage() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, withdrawal }: { id: string; withdrawal: ImageWithdrawal }) => withdrawImage(id, withdrawal),
    onSuccess: (image) => imageStored(queryClient, image),
  });
}

export function useCheckFixity() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id }: { id: string; printId: string }) => checkFixity(id),
    onSuccess: async (_result, { id, printId }) => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: imageKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: imageKeys.fixity(id) }),
        queryClient.invalidateQueries({ queryKey: fixityKeys.alerts() }),
        queryClient.invalidateQueries({ queryKey: printKeys.timeline(printId) }),
      ]);
    },
  });
}
