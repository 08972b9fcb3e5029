import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { ConditionReport, ReportInput, reportUpdateSchema } from '@toneledger/common/schemas/condition';
import { requestData } from '@/lib/api-client';
import { printKeys, reportKeys } from '@/features/condition/api/keys';

export type ReportUpdate = z.input<typeof reportUpdateSchema>;

export function createReport(printId: string, input: ReportInput): Promise<ConditionReport> {
  return requestData<ConditionReport>(`/api/prints/${encodeURIComponent(printId)}/condition-reports`, { method: 'POST', body: input });
}

export function updateReport(id: string, update: ReportUpdate): Promise<ConditionReport> {
  return requestData<ConditionReport>(`/api/condition-reports/${encodeURIComponent(id)}`, { method: 'PATCH', body: update });
}

export function signReport(id: string, version: number): Promise<ConditionReport> {
  return requestData<ConditionReport>(`/api/condition-reports/${encodeURIComponent(id)}/sign`, { method: 'POST', body: { version } });
}

export function addAddendum(id: string, text: string): Promise<ConditionReport> {
  return requestData<ConditionReport>(`/api/condition-reports/${encodeURIComponent(id)}/addenda`, { method: 'POST', body: { text } });
}

export function discardReport(id: string, version: number): Promise<{ id: string }> {
  return requestData<{ id: string }>(`/api/condition-reports/${encodeURIComponent(id)}`, { method: 'DELETE', query: { version } });
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
