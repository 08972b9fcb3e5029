import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { acquisitionsApi, entriesApi } from '@toneledger/common/api/procedures';
import { printsApi } from '@toneledger/common/api/prints';
import { callData } from '@/lib/api-client';

export const useEntries = () => useQuery({ queryKey: ['object-entries'], queryFn: () => callData(entriesApi.list, { query: {} }) });
export const useEntry = (id: string) => useQuery({ queryKey: ['object-entries', id], queryFn: () => callData(entriesApi.get, { params: { id } }) });
export const useAcquisitions = () => useQuery({ queryKey: ['acquisitions'], queryFn: () => callData(acquisitionsApi.list) });

function useRefresh<A, R>(fn: (a: A) => Promise<R>) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: async () => { await Promise.all([qc.invalidateQueries({ queryKey: ['object-entries'] }), qc.invalidateQueries({ queryKey: ['acquisitions'] })]); } });
}
export const useCreateEntry = () => useRefresh((body: BodyIn<typeof entriesApi.create>) => callData(entriesApi.create, { body }));
export const useCreateAcquisition = () => useRefresh((body: BodyIn<typeof acquisitionsApi.create>) => callData(acquisitionsApi.create, { body }));
export const useLinkPrints = () => useRefresh(({ id, body }: { id: string; body: BodyIn<typeof acquisitionsApi.setPrints> }) => callData(acquisitionsApi.setPrints, { params: { id }, body }));

/** A print's id by its exact accession number, or null. */
export async function printIdByAccession(accessionNumber: string): Promise<string | null> {
  const page = await callData(printsApi.list, { query: { q: accessionNumber, holding: 'all' } as never });
  const hit = (page as unknown as { id: string; accessionNumber: string }[]).find((p) => p.accessionNumber === accessionNumber);
  return hit?.id ?? null;
}
export const useUpdateEntry = () => useRefresh(({ id, body }: { id: string; body: BodyIn<typeof entriesApi.update> }) => callData(entriesApi.update, { params: { id }, body }));
export const useUpdateAcquisition = () => useRefresh(({ id, body }: { id: string; body: BodyIn<typeof acquisitionsApi.update> }) => callData(acquisitionsApi.update, { params: { id }, body }));
