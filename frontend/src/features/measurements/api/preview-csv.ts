import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import type { DataOf } from '@toneledger/common/api/endpoint';
import { measurementsApi } from '@toneledger/common/api/measurements';
import type { csvMappingSchema } from '@toneledger/common/schemas/measurements';
import { callData } from '@/lib/api-client';

export type CsvMapping = z.input<typeof csvMappingSchema>;
export type CsvPreview = DataOf<typeof measurementsApi.previewCsv>;

/**
 * Sends an instrument's CSV file (multipart field `file`, with the column mapping as a JSON string
 * in `mapping` when one is chosen) and returns what the server read from it. Nothing is stored.
 */
export async function previewCsv(printId: string, file: File, mapping?: CsvMapping) {
  const form = new FormData();
  form.append('file', file, file.name);
  if (mapping) form.append('mapping', JSON.stringify(mapping));
  return callData(measurementsApi.previewCsv, { params: { id: printId }, body: form });
}

/** A preview is not a change to any record, so nothing is cached or invalidated. */
export function usePreviewCsv() {
  return useMutation({
    mutationFn: ({ printId, file, mapping }: { printId: string; file: File; mapping?: CsvMapping }) => previewCsv(printId, file, mapping),
  });
}
