import { useMutation, useQueryClient } from '@tanstack/react-query';
import { importsApi } from '@toneledger/common/api/imports';
import { callData } from '@/lib/api-client';
import { importKeys } from '@/features/catalogue/api/keys';

export interface ImportUpload {
  prints: File;
  /** The process histories, one step per row (optional). */
  steps: File | null;
}

/** Uploads the CSV files as multipart/form-data (fields `file` and `steps`); the server starts checking them. */
export async function createImport({ prints, steps }: ImportUpload) {
  const form = new FormData();
  form.append('file', prints, prints.name);
  if (steps) form.append('steps', steps, steps.name);
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
