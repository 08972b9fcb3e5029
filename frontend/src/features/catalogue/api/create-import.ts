import { useMutation, useQueryClient } from '@tanstack/react-query';
import { importsApi } from '@toneledger/common/api/imports';
import { callData } from '@/lib/api-client';
import { importKeys } from '@/features/catalogue/api/keys';

/** Uploads a CSV file as multipart/form-data (field `file`); the server starts checking it. */
export async function createImport(file: File) {
  const form = new FormData();
  form.append('file', file, file.name);
  return callData(importsApi.start, { body: form });
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
