import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { errorEnvelopeSchema } from '@toneledger/common/schemas/envelope';
import type { csvMappingSchema, csvPreviewSchema } from '@toneledger/common/schemas/measurements';
import { ApiError } from '@/lib/api-client';

export type CsvMapping = z.input<typeof csvMappingSchema>;
export type CsvPreview = z.infer<typeof csvPreviewSchema>;

const STATUS_CODES: Record<number, ApiError['code']> = {
  400: 'validation_failed', 401: 'unauthenticated', 403: 'forbidden', 404: 'not_found', 409: 'conflict',
  413: 'payload_too_large', 415: 'unsupported_media_type', 503: 'service_unavailable',
};

/**
 * Sends an instrument's CSV file (multipart field `file`, with the column mapping as a JSON string
 * in `mapping` when one is chosen) and returns what the server read from it. Nothing is stored.
 * The JSON client cannot send a file, so this request goes through fetch directly.
 */
export async function previewCsv(printId: string, file: File, mapping?: CsvMapping): Promise<CsvPreview> {
  const form = new FormData();
  form.append('file', file, file.name);
  if (mapping) form.append('mapping', JSON.stringify(mapping));
  let response: Response;
  try {
    response = await fetch(`/api/prints/${encodeURIComponent(printId)}/measurement-sessions/csv-preview`, {
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
      code: STATUS_CODES[response.status] ?? 'internal_error',
      status: response.status,
      message: `The server answered ${response.status}.`,
      requestId: response.headers.get('x-request-id'),
    });
  }
  if (typeof body !== 'object' || body === null || !('data' in body)) {
    throw new ApiError({ code: 'internal_error', status: response.status, message: 'The server sent an answer this page cannot read.' });
  }
  return (body as { data: CsvPreview }).data;
}

/** A preview is not a change to any record, so nothing is cached or invalidated. */
export function usePreviewCsv() {
  return useMutation({
    mutationFn: ({ printId, file, mapping }: { printId: string; file: File; mapping?: CsvMapping }) => previewCsv(printId, file, mapping),
  });
}
