import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { fixityApi, imagesApi } from '@toneledger/common/api/images';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { callData } from '@/lib/api-client';
import { imageKeys } from '@/lib/images-api';
import { printKeys } from '@/lib/prints-api';
import { fixityKeys } from '@/features/condition/api/keys';

export type ImageUpdate = BodyIn<typeof imagesApi.update>;
export type ImageWithdrawal = BodyIn<typeof imagesApi.withdraw>;

export function updateImage(id: string, update: ImageUpdate) {
  return callData(imagesApi.update, { params: { id }, body: update });
}

export function withdrawImage(id: string, withdrawal: ImageWithdrawal) {
  return callData(imagesApi.withdraw, { params: { id }, body: withdrawal });
}

export function checkFixity(id: string) {
  return callData(fixityApi.check, { params: { id }, body: {} });
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
