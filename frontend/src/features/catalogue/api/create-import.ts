import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ImportJob } from '@toneledger/common/schemas/catalogue';
import { requestData } from '@/lib/api-client';
import { importKeys } from '@/features/catalogue/api/keys';

/** Uploads a CSV file as multipart/form-data (field `file`); the server starts checking it. */
export async function createImport(file: File): Promise<ImportJob> {
  const form = new FormData();
  form.append('file', file, file.name);
  return requestData<ImportJob>('/api/imports', { method: 'POST', body: form });
}

export function useCreateImport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createImport,
    onSuccess: (job) => {
      queryClient.setQueryData(importKeys.detail(job.id), job);
    },
  });
}
