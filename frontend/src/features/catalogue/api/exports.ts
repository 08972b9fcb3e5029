import { importsApi } from '@toneledger/common/api/imports';
import { printsApi } from '@toneledger/common/api/prints';
import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { urlOf } from '@/lib/api-client';

/** Download address of one print record as JSON. */
export function printJsonHref(id: string): string {
  return urlOf(printsApi.exportJson, { params: { id } });
}

/** Download address of the whole filtered list as CSV: the list's filters and sort, without paging. */
export function printsCsvHref(query: PrintListQuery): string {
  const filters: Partial<PrintListQuery> = { ...query };
  delete filters.page;
  delete filters.pageSize;
  return urlOf(printsApi.exportCsv, { query: filters });
}

/** A header-only CSV with the import columns. */
export const IMPORT_TEMPLATE_HREF = urlOf(importsApi.template);
