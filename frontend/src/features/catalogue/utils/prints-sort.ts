import type { SortingState } from '@tanstack/react-table';
import { printSortSchema } from '@toneledger/common/schemas/catalogue';

const SORTS = printSortSchema.options as readonly string[];

export function sortToSorting(sort: string): SortingState {
  return [{ id: sort.replace(/^-/, ''), desc: sort.startsWith('-') }];
}

export function sortingToSort(sorting: SortingState, fallback: string): string {
  const first = sorting[0];
  if (!first) return fallback;
  const candidate = `${first.desc ? '-' : ''}${first.id}`;
  return SORTS.includes(candidate) ? candidate : fallback;
}
