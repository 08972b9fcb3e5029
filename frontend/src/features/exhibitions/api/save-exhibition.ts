import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { displaysApi, exhibitionsApi } from '@toneledger/common/api/exhibitions';
import type { ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { callData } from '@/lib/api-client';
import { exhibitionKeys } from '@/lib/exhibitions-api';
import { printKeys } from '@/lib/prints-api';

export type ExhibitionInput = BodyIn<typeof exhibitionsApi.create>;
export type ExhibitionUpdate = BodyIn<typeof exhibitionsApi.update>;
export type ApprovalInput = BodyIn<typeof exhibitionsApi.decide>;
export type DisplayInput = BodyIn<typeof displaysApi.create>;
export type DisplayUpdate = BodyIn<typeof displaysApi.update>;

async function stored(queryClient: QueryClient, exhibition: ExhibitionDetail) {
  queryClient.setQueryData(exhibitionKeys.detail(exhibition.id), exhibition);
  await queryClient.invalidateQueries({ queryKey: exhibitionKeys.lists() });
}

export function useCreateExhibition() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ExhibitionInput) => callData(exhibitionsApi.create, { body: input }),
    onSuccess: (exhibition) => stored(queryClient, exhibition),
  });
}

export function useUpdateExhibition(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (update: ExhibitionUpdate) => callData(exhibitionsApi.update, { params: { id }, body: update }),
    onSuccess: (exhibition) => stored(queryClient, exhibition),
  });
}

export function useAddExhibitionPrints(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { printIds: string[]; version: number }) => callData(exhibitionsApi.addObjects, { params: { id }, body: input }),
    onSuccess: (exhibition) => stored(queryClient, exhibition),
  });
}

export function useRemoveExhibitionPrint(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ printId, version }: { printId: string; version: number }) =>
      callData(exhibitionsApi.removeObject, { params: { id, printId }, query: { version } }),
    onSuccess: (exhibition) => stored(queryClient, exhibition),
  });
}

export function useDecideApproval(id: string, printId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ApprovalInput) => callData(exhibitionsApi.decide, { params: { id, printId }, body: input }),
    onSuccess: (exhibition) => stored(queryClient, exhibition),
  });
}

/** A display period changed: the exhibition's figures and the print's light dose are fetched again. */
async function displayChanged(queryClient: QueryClient, exhibitionId: string, printId: string) {
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: exhibitionKeys.detail(exhibitionId) }),
    queryClient.invalidateQueries({ queryKey: printKeys.detail(printId) }),
  ]);
}

export function useCreateDisplay(exhibitionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: DisplayInput) => callData(displaysApi.create, { params: { id: exhibitionId }, body: input }),
    onSuccess: (display) => displayChanged(queryClient, exhibitionId, display.printId),
  });
}

export function useUpdateDisplay(exhibitionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, update }: { id: string; update: DisplayUpdate }) => callData(displaysApi.update, { params: { id }, body: update }),
    onSuccess: (display) => displayChanged(queryClient, exhibitionId, display.printId),
  });
}

export function useDeleteDisplay(exhibitionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; printId: string; version: number }) => callData(displaysApi.remove, { params: { id }, query: { version } }),
    onSuccess: (_deleted, { printId }) => displayChanged(queryClient, exhibitionId, printId),
  });
}

/** Deletes an exhibition that has no display periods and no loan (the server refuses otherwise, saying why). */
export function useDeleteExhibition(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (version: number) => callData(exhibitionsApi.remove, { params: { id }, query: { version } }),
    onSuccess: async () => {
      queryClient.removeQueries({ queryKey: exhibitionKeys.detail(id) });
      await queryClient.invalidateQueries({ queryKey: exhibitionKeys.lists() });
    },
  });
}
