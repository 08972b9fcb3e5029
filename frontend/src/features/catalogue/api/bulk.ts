import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { bulkApi, savedSearchesApi } from '@toneledger/common/api/bulk';
import { roundsApi } from '@toneledger/common/api/inspections';
import type { BulkAction, PrintSelection } from '@toneledger/common/schemas/bulk';
import { callData, callFile } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';

/** Keys of the bulk screens' own reads: saved searches, and the planned rounds a selection can join. */
export const bulkKeys = {
  savedSearches: ['saved-searches'] as const,
  plannedRounds: ['inspection-rounds', 'planned-for-bulk'] as const,
};

/** The preview and apply endpoints of each action, by its name. */
export const BULK_ENDPOINTS = {
  move: { preview: bulkApi.movePreview, apply: bulkApi.move },
  rehouse: { preview: bulkApi.rehousePreview, apply: bulkApi.rehouse },
  status: { preview: bulkApi.statusPreview, apply: bulkApi.status },
  round: { preview: bulkApi.roundPreview, apply: bulkApi.round },
  exhibition: { preview: bulkApi.exhibitionPreview, apply: bulkApi.exhibition },
} as const;

/** An action's own fields (what its form holds), without the selection. */
export type ActionFields = Record<string, unknown>;

export function usePreviewAction(action: BulkAction) {
  return useMutation({
    mutationFn: ({ selection, fields }: { selection: PrintSelection; fields: ActionFields }) =>
      callData(BULK_ENDPOINTS[action].preview, { body: { ...fields, selection } as never }),
  });
}

export function useApplyAction(action: BulkAction) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ selection, fields, fingerprint }: { selection: PrintSelection; fields: ActionFields; fingerprint: string }) =>
      callData(BULK_ENDPOINTS[action].apply, { body: { ...fields, selection, fingerprint } as never }),
    onSuccess: () => qc.invalidateQueries({ queryKey: printKeys.all }),
  });
}

/** Downloads the selection as CSV or JSON through the catalogue's export. */
export function useExportSelection() {
  return useMutation({
    mutationFn: async ({ selection, format }: { selection: PrintSelection; format: 'csv' | 'json' }) => {
      const { blob, fileName } = await callFile(format === 'csv' ? bulkApi.exportCsv : bulkApi.exportJson, { body: { selection } });
      const url = URL.createObjectURL(blob);
      const a = document.createElement('a');
      a.href = url;
      a.download = fileName ?? `prints-selection.${format}`;
      document.body.append(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
      return fileName;
    },
  });
}

export function usePlannedRounds(enabled: boolean) {
  return useQuery(
    queryOptions({
      queryKey: bulkKeys.plannedRounds,
      queryFn: ({ signal }) => callData(roundsApi.list, { query: { status: 'planned', pageSize: 100 }, signal }),
      enabled,
    }),
  );
}

// ── Saved searches ──

export function savedSearchesOptions() {
  return queryOptions({ queryKey: bulkKeys.savedSearches, queryFn: ({ signal }) => callData(savedSearchesApi.list, { signal }) });
}

export function useSavedSearches() {
  return useQuery(savedSearchesOptions());
}

export function useSaveSearch() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: BodyIn<typeof savedSearchesApi.create>) => callData(savedSearchesApi.create, { body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: bulkKeys.savedSearches }),
  });
}

export function useUpdateSavedSearch() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: BodyIn<typeof savedSearchesApi.update> }) => callData(savedSearchesApi.update, { params: { id }, body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: bulkKeys.savedSearches }),
  });
}

export function useDeleteSavedSearch() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => callData(savedSearchesApi.remove, { params: { id }, query: { version } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: bulkKeys.savedSearches }),
  });
}
