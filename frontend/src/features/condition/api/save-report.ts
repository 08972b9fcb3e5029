import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { reportsApi } from '@toneledger/common/api/condition';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import type { ConditionReport } from '@toneledger/common/schemas/condition';
import { callData } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';
import { reportKeys } from '@/features/condition/api/keys';

export type ReportInput = BodyIn<typeof reportsApi.create>;
export type ReportUpdate = BodyIn<typeof reportsApi.update>;

export function createReport(printId: string, input: ReportInput) {
  return callData(reportsApi.create, { params: { id: printId }, body: input });
}

export function updateReport(id: string, update: ReportUpdate) {
  return callData(reportsApi.update, { params: { id }, body: update });
}

export function signReport(id: string, version: number) {
  return callData(reportsApi.sign, { params: { id }, body: { version } });
}

export function addAddendum(id: string, text: string) {
  return callData(reportsApi.addAddendum, { params: { id }, body: { text } });
}

export function discardReport(id: string, version: number) {
  return callData(reportsApi.discard, { params: { id }, query: { version } });
}

/** A saved report: its detail is set, the print's list and timeline are refreshed. */
async function stored(queryClient: QueryClient, report: ConditionReport) {
  queryClient.setQueryData(reportKeys.detail(report.id), report);
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: reportKeys.lists() }),
    queryClient.invalidateQueries({ queryKey: printKeys.timeline(report.printId) }),
  ]);
}

export function useCreateReport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ printId, input }: { printId: string; input: ReportInput }) => createReport(printId, input),
    onSuccess: (report) => stored(queryClient, report),
  });
}

export function useUpdateReport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, update }: { id: string; update: ReportUpdate }) => updateReport(id, update),
    onSuccess: (report) => stored(queryClient, report),
  });
}

export function useSignReport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => signReport(id, version),
    onSuccess: (report) => stored(queryClient, report),
  });
}

export function useAddAddendum() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, text }: { id: string; text: string }) => addAddendum(id, text),
    onSuccess: (report) => stored(queryClient, report),
  });
}

export function useDiscardReport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ report }: { report: ConditionReport }) => discardReport(report.id, report.version),
    onSuccess: async (_result, { report }) => {
      queryClient.removeQueries({ queryKey: reportKeys.detail(report.id) });
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: reportKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: printKeys.timeline(report.printId) }),
      ]);
    },
  });
}
