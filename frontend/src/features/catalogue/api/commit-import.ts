import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ImportJob } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { importKeys } from '@/features/catalogue/api/keys';

export function commitImport(id: string): Promise<ImportJob> {
  return requestData<ImportJob>(`/api/imports/${encodeURIComponent(id)}/commit`, { method: 'POST', body: {} });
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
