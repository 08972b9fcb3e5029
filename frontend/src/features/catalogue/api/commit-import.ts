import { useMutation, useQueryClient } from '@tanstack/react-query';
import { importsApi } from '@toneledger/common/api/imports';
import { callData } from '@/lib/api-client';
import { importKeys } from '@/features/catalogue/api/keys';

export function commitImport(id: string) {
  return callData(importsApi.commit, { params: { id }, body: {} });
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
