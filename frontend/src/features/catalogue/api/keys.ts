import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';

/** Query keys for the `prints` resource and its sub-resources (movements, history). */
export const printKeys = {
  all: ['prints'] as const,
  lists: () => [...printKeys.all, 'list'] as const,
  list: (query: PrintListQuery) => [...printKeys.lists(), query] as const,
  details: () => [...printKeys.all, 'detail'] as const,
  detail: (id: string) => [...printKeys.details(), id] as const,
  movements: (id: string) => [...printKeys.detail(id), 'movements'] as const,
  history: (id: string) => [...printKeys.detail(id), 'history'] as const,
};

/** Query keys for the `imports` resource (CSV import jobs). */
export const importKeys = {
  all: ['imports'] as const,
  details: () => [...importKeys.all, 'detail'] as const,
  detail: (id: string) => [...importKeys.details(), id] as const,
};

