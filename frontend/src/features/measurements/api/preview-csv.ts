import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import type { csvMappingSchema, csvPreviewSchema } from '@toneledger/common/schemas/measurements';
import { requestData } from '@/lib/api-client';

export type CsvMapping = z.input<typeof csvMappingSchema>;
export type CsvPreview = z.infer<typeof csvPreviewSchema>;

/**
 * Sends an instrument's CSV file (multipart field `file`, with the column mapping as a JSON string
 * in `mapping` when one is chosen) and returns what the server read from it. Nothing is stored.
 */
export async function previewCsv(printId: string, file: File, mapping?: CsvMapping): Promise<CsvPreview> {
  const form = new FormData();
  form.append('file', file, file.name);
  if (mapping) form.append('mapping', JSON.stringify(mapping));
  return requestData<CsvPreview>(`/api/prints/${encodeURIComponent(printId)}/measurement-sessions/csv-preview`, { method: 'POST', body: form });
}

/** A preview is not a change to any record, so nothing is cached or invalidated. */
export function usePreviewCsv() {
  return useMutation({
    mutationFn: ({ printId, file, mapping }: { printId: string; file: File; mapping?: CsvMapping }) => previewCsv(printId, file, mapping),
  });
}
