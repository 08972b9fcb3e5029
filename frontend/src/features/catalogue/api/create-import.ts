import { useMutation, useQueryClient } from '@tanstack/react-query';
import { errorEnvelopeSchema } from '@toneledger/common/schemas/envelope';
import type { ImportJob } from '@toneledger/common/schemas/catalogue';
import { ApiError } from '@/lib/api-client';
import { importKeys } from '@/features/catalogue/api/keys';

/**
 * Uploads a CSV file as multipart/form-data (field `file`). The JSON client cannot send a file,
 * so this one request goes through fetch directly; errors still become an ApiError.
 */
export async function createImport(file: File): Promise<ImportJob> {
  const form = new FormData();
  form.append('file', file, file.name);
  let response: Response;
  try {
    response = await fetch('/api/imports', {
      method: 'POST',
      body: form,
      headers: { accept: 'application/json' },
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError({ code: 'service_unavailable', status: 0, message: 'Could not reach the server. Check the connection and try again.' });
  }
  const text = await response.text();
  let body: unknown;
  try {
    body = text ? JSON.parse(text) : undefined;
  } catch {
    body = undefined;
  }
  if (!response.ok) {
    const envelope = errorEnvelopeSchema.safeParse(body);
    if (envelope.success) throw new ApiError(envelope.data.error);
    throw new ApiError({
      code: response.status === 413 ? 'payload_too_large' : response.status === 415 ? 'unsupported_media_type' : 'internal_error',
      status: response.status,
      message: `The server answered ${response.status}.`,
      requestId: response.headers.get('x-request-id'),
    });
  }
  if (typeof body !== 'object' || body === null || !('data' in body)) {
    throw new ApiError({ code: 'internal_error', status: response.status, message: 'The server sent an answer this page cannot read.' });
  }
  return (body as { data: ImportJob }).data;
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
