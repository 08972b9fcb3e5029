import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { toQueryString } from '@/lib/api-client';

/** Download address of one print record as JSON. */
export function printJsonHref(id: string): string {
  return `/api/prints/${encodeURIComponent(id)}/export.json`;
}

/** Download address of the whole filtered list as CSV: the list's filters and sort, without paging. */
export function printsCsvHref(query: PrintListQuery): string {
  const filters: Partial<PrintListQuery> = { ...query };
  delete filters.page;
  delete filters.pageSize;
  return `/api/prints/export.csv${toQueryString(filters)}`;
}

/** A header-only CSV with the import columns. */
export const IMPORT_TEMPLATE_HREF = '/api/imports/template.csv';
