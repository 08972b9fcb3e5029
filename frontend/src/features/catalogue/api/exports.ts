import { importsApi } from '@toneledger/common/api/imports';
import { printsApi } from '@toneledger/common/api/prints';
import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { urlOf } from '@/lib/api-client';

/** Download address of one print record as JSON. */
export function printJsonHref(id: string): string {
  return urlOf(printsApi.exportJson, { params: { id } });
}

function withoutPaging(query: PrintListQuery): Partial<PrintListQuery> {
  const filters: Partial<PrintListQuery> = { ...query };
  delete filters.page;
  delete filters.pageSize;
  return filters;
}

/** Download address of the whole filtered list as CSV: the list's filters and sort, without paging. */
export function printsCsvHref(query: PrintListQuery): string {
  return urlOf(printsApi.exportCsv, { query: withoutPaging(query) });
}

/** Download address of the process histories of the filtered list as CSV, one row per step. */
export function stepsCsvHref(query: PrintListQuery): string {
  return urlOf(printsApi.exportStepsCsv, { query: withoutPaging(query) });
}

/** The import templates: notes on every column, the header and an example row. */
export function importTemplateHref(file: 'prints' | 'steps'): string {
  return urlOf(importsApi.template, { query: { file } });
}
