import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import {
  createColumnHelper,
  getCoreRowModel,
  useReactTable,
  type SortingState,
  type Updater,
  type VisibilityState,
} from '@tanstack/react-table';
import type { PrintListItem, PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { PROCESS, STATUS, SUPPORT, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { DataTable } from '@/components/ui/data-table';
import { formatDate } from '@/lib/format';
import { sortingToSort, sortToSorting } from '@/features/catalogue/utils/prints-sort';
import { WarningIndicator } from '@/features/catalogue/components/warning-indicator';

const column = createColumnHelper<PrintListItem>();
const none = <span className="text-ink-600">—</span>;

/** Every column of the list; `id` matches the API's sort names where the column sorts. */
export const printColumns = [
  column.accessor('accessionNumber', {
    id: 'accessionNumber',
    header: 'Accession no.',
    enableHiding: false,
    cell: (info) => (
      <Link to={`/catalogue/prints/${info.row.original.id}`} className="mono font-medium whitespace-nowrap">
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor('title', {
    id: 'title',
    header: 'Title',
    enableHiding: false,
    cell: (info) => <span className="text-ink-900">{info.getValue()}</span>,
  }),
  column.accessor('makerName', { id: 'maker', header: 'Maker', cell: (info) => info.getValue() ?? none }),
  column.accessor('dateMade', {
    id: 'dateMade',
    header: 'Date made',
    cell: (info) => {
      const row = info.row.original;
      if (!row.dateMade) return none;
      return (
        <span className="whitespace-nowrap" title={`EDTF ${row.dateMade}`}>
          {row.dateDisplay ?? row.dateMade}
        </span>
      );
    },
  }),
  column.accessor('process', { id: 'process', header: 'Process', enableSorting: false, cell: (info) => PROCESS.labels[info.getValue()] }),
  column.accessor('support', {
    id: 'support',
    header: 'Support',
    enableSorting: false,
    cell: (info) => {
      const value = info.getValue();
      return value ? SUPPORT.labels[value] : none;
    },
  }),
  column.accessor('tonerClasses', {
    id: 'tonerClasses',
    header: 'Toners',
    enableSorting: false,
    cell: (info) => (info.getValue().length ? info.getValue().map((t) => TONER_CLASS.labels[t]).join(', ') : none),
  }),
  column.accessor('paperLabel', { id: 'paper', header: 'Paper', enableSorting: false, cell: (info) => info.getValue() ?? none }),
  column.accessor('status', { id: 'status', header: 'Status', cell: (info) => <span className="whitespace-nowrap">{STATUS.labels[info.getValue()]}</span> }),
  column.accessor('enclosureName', { id: 'enclosure', header: 'Enclosure', enableSorting: false, cell: (info) => info.getValue() ?? none }),
  column.accessor((row) => row.locationLabel ?? null, { id: 'location', header: 'Location', enableSorting: false, cell: (info) => info.getValue() ?? none }),
  column.accessor('warningCodes', {
    id: 'warnings',
    header: 'Warnings',
    enableSorting: false,
    cell: (info) => <WarningIndicator codes={info.getValue()} />,
  }),
  column.accessor('updatedAt', {
    id: 'updatedAt',
    header: 'Updated',
    cell: (info) => (
      <time dateTime={info.getValue()} className="whitespace-nowrap">
        {formatDate(info.getValue())}
      </time>
    ),
  }),
];

/** Columns a person can show or hide, with their header text. */
export const CHOOSABLE_COLUMNS: { id: string; label: string }[] = [
  { id: 'maker', label: 'Maker' },
  { id: 'dateMade', label: 'Date made' },
  { id: 'process', label: 'Process' },
  { id: 'support', label: 'Support' },
  { id: 'tonerClasses', label: 'Toners' },
  { id: 'paper', label: 'Paper' },
  { id: 'status', label: 'Status' },
  { id: 'enclosure', label: 'Enclosure' },
  { id: 'location', label: 'Location' },
  { id: 'warnings', label: 'Warnings' },
  { id: 'updatedAt', label: 'Updated' },
];

export const DEFAULT_HIDDEN_COLUMNS: VisibilityState = { support: false, paper: false, updatedAt: false };

export interface PrintsTableProps {
  prints: PrintListItem[];
  query: PrintListQuery;
  total: number;
  busy: boolean;
  columnVisibility: VisibilityState;
  /** Locations are not shown to roles that may not see them, whatever the column choice says. */
  showLocation: boolean;
  onSortChange: (sort: string) => void;
}

/** Prints, sorted and paged by the server: the table only mirrors the query in the URL. */
export function PrintsTable({ prints, query, total, busy, columnVisibility, showLocation, onSortChange }: PrintsTableProps) {
  const sorting = useMemo(() => sortToSorting(query.sort), [query.sort]);
  const visibility = useMemo(
    () => ({ ...columnVisibility, ...(showLocation ? {} : { location: false }) }),
    [columnVisibility, showLocation],
  );
  const table = useReactTable({
    data: prints,
    columns: printColumns,
    getRowId: (print) => print.id,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    enableSortingRemoval: false,
    sortDescFirst: false,
    pageCount: Math.max(1, Math.ceil(total / query.pageSize)),
    state: { sorting, columnVisibility: visibility, pagination: { pageIndex: query.page - 1, pageSize: query.pageSize } },
    onSortingChange: (updater: Updater<SortingState>) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      onSortChange(sortingToSort(next, query.sort));
    },
  });
  return <DataTable table={table} caption="Prints in the catalogue" empty="No prints match this search." busy={busy} />;
}
