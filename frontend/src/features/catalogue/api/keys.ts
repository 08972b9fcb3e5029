import type { ImportRowsQuery } from '@toneledger/common/schemas/catalogue';

/** Query keys for the `imports` resource (CSV import jobs). Prints: `printKeys` in `@/lib/prints-api`. */
export const importKeys = {
  all: ['imports'] as const,
  details: () => [...importKeys.all, 'detail'] as const,
  detail: (id: string) => [...importKeys.details(), id] as const,
  /** What the rows of a checked file would do, a page at a time. */
  rows: (id: string, query: ImportRowsQuery) => [...importKeys.detail(id), 'rows', query] as const,
};
