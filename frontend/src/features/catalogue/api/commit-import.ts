import { useMutation, useQueryClient } from '@tanstack/react-query';
import { importsApi } from '@toneledger/common/api/imports';
import type { ImportMode } from '@toneledger/common/schemas/catalogue';
import { callData } from '@/lib/api-client';
import { importKeys } from '@/features/catalogue/api/keys';

/** Writes a checked file: `create_only` refuses rows that match prints in the catalogue, `create_or_update` updates them. */
export function commitImport({ id, mode }: { id: string; mode: ImportMode }) {
  return callData(importsApi.commit, { params: { id }, body: { mode } });
}

export function useCommitImport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: commitImport,
    // The server answers 202 with the job now committing; polling takes it from there.
    onSuccess: (job) => {
      queryClient.setQueryData(importKeys.detail(job.id), job);
    },
  });
}
