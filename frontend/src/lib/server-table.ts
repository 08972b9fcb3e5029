import { useMemo } from 'react';
import { getCoreRowModel, useReactTable, type ColumnDef, type SortingState, type Updater, type VisibilityState } from '@tanstack/react-table';

/** A list's sort as the API names it ("title", "-title" for descending), as the table holds it. */
export function sortToSorting(sort: string): SortingState {
  return [{ id: sort.replace(/^-/, ''), desc: sort.startsWith('-') }];
}

/** The table's sort back in the API's words; a sort the API does not offer keeps the current one. */
export function sortingToSort<S extends string>(sorting: SortingState, fallback: S, sorts: readonly S[]): S {
  const first = sorting[0];
  if (!first) return fallback;
  const candidate = `${first.desc ? '-' : ''}${first.id}`;
  return (sorts as readonly string[]).includes(candidate) ? (candidate as S) : fallback;
}

export interface ServerTableOptions<T> {
  data: T[];
  // Columns made with createColumnHelper differ in their value types.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<T, any>[];
  getRowId: (row: T) => string;
  /** The page as the URL holds it. */
  query: { page: number; pageSize: number };
  total: number;
  sorting: SortingState;
  /** A header was clicked: the sort the table would show next. */
  onSortingChange: (next: SortingState) => void;
  columnVisibility?: VisibilityState;
  enableMultiSort?: boolean;
}

/** A table whose rows the server has sorted and paged: it only mirrors the query in the URL. */
export function useServerTable<T>({ data, columns, getRowId, query, total, sorting, onSortingChange, columnVisibility, enableMultiSort }: ServerTableOptions<T>) {
  const pagination = useMemo(() => ({ pageIndex: query.page - 1, pageSize: query.pageSize }), [query.page, query.pageSize]);
  return useReactTable({
    data,
    columns,
    getRowId,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    enableSortingRemoval: false,
    enableMultiSort,
    sortDescFirst: false,
    pageCount: Math.max(1, Math.ceil(total / query.pageSize)),
    state: { sorting, pagination, ...(columnVisibility ? { columnVisibility } : {}) },
    onSortingChange: (updater: Updater<SortingState>) => onSortingChange(typeof updater === 'function' ? updater(sorting) : updater),
  });
}
