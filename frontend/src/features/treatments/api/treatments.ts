import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { treatmentsApi } from '@toneledger/common/api/procedures';
import type { Treatment } from '@toneledger/common/schemas/treatments';
import { callData } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';

export const treatmentKeys = {
  all: ['treatments'] as const,
  list: (status?: string) => ['treatments', 'list', status ?? 'all'] as const,
  forPrint: (printId: string) => ['treatments', 'print', printId] as const,
  detail: (id: string) => ['treatments', 'detail', id] as const,
};

export function useTreatments(status?: Treatment['status']) {
  return useQuery({ queryKey: treatmentKeys.list(status), queryFn: () => callData(treatmentsApi.list, { query: status ? { status } : {} }) });
}
export function usePrintTreatments(printId: string, enabled = true) {
  return useQuery({ queryKey: treatmentKeys.forPrint(printId), queryFn: () => callData(treatmentsApi.forPrint, { params: { id: printId } }), enabled });
}
export function useTreatment(id: string) {
  return useQuery({ queryKey: treatmentKeys.detail(id), queryFn: () => callData(treatmentsApi.get, { params: { id } }) });
}

function useStored<A>(fn: (args: A) => Promise<Treatment>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: async (t) => {
      qc.setQueryData(treatmentKeys.detail(t.id), t);
      await Promise.all([
        qc.invalidateQueries({ queryKey: ['treatments', 'list'] }),
        qc.invalidateQueries({ queryKey: treatmentKeys.forPrint(t.printId) }),
        qc.invalidateQueries({ queryKey: printKeys.timeline(t.printId) }),
        qc.invalidateQueries({ queryKey: printKeys.detail(t.printId) }),
      ]);
    },
  });
}

export type TreatmentInput = BodyIn<typeof treatmentsApi.propose>;
export type TreatmentUpdate = BodyIn<typeof treatmentsApi.update>;
export type TreatmentApproval = BodyIn<typeof treatmentsApi.approve>;

export const useProposeTreatment = () => useStored(({ printId, body }: { printId: string; body: TreatmentInput }) => callData(treatmentsApi.propose, { params: { id: printId }, body }));
export const useUpdateTreatment = () => useStored(({ id, body }: { id: string; body: TreatmentUpdate }) => callData(treatmentsApi.update, { params: { id }, body }));
export const useApproveTreatment = () => useStored(({ id, body }: { id: string; body: TreatmentApproval }) => callData(treatmentsApi.approve, { params: { id }, body }));
export const useCompleteTreatment = () => useStored(({ id, version }: { id: string; version: number }) => callData(treatmentsApi.complete, { params: { id }, body: { version } }));
export const useSignTreatment = () => useStored(({ id, version }: { id: string; version: number }) => callData(treatmentsApi.sign, { params: { id }, body: { version } }));
export const useTreatmentAddendum = () => useStored(({ id, text }: { id: string; text: string }) => callData(treatmentsApi.addAddendum, { params: { id }, body: { text } }));
