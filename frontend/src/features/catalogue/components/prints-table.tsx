import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper, type VisibilityState } from '@tanstack/react-table';
import { printSortSchema, type PrintListItem, type PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { PROCESS, STATUS, SUPPORT, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { labelOf } from '@toneledger/common/fields/print';
import { edtfAsWritten } from '@toneledger/common/domain/edtf-words';
import { DataTable } from '@/components/ui/data-table';
import { formatDate } from '@/lib/format';
import { sortingToSort, sortToSorting, useServerTable } from '@/lib/server-table';
import { WarningIndicator } from '@/features/catalogue/components/warning-indicator';

const SORTS = printSortSchema.options as readonly string[];
const column = createColumnHelper<PrintListItem>();
const none = <span className="text-ink-600">—</span>;

/** Every column of the list; `id` is the print field's key (fields/print.ts), which is also the API's sort name where the column sorts. */
export const printColumns = [
  column.accessor('accessionNumber', {
    id: 'accessionNumber',
    header: labelOf('accessionNumber'),
    enableHiding: false,
    cell: (info) => (
      <Link to={`/catalogue/prints/${info.row.original.id}`} className="mono font-medium whitespace-nowrap">
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor('title', {
    id: 'title',
    header: labelOf('title'),
    enableHiding: false,
    cell: (info) => <span className="text-ink-900">{info.getValue()}</span>,
  }),
  column.accessor('makerName', { id: 'maker', header: labelOf('maker'), cell: (info) => info.getValue() ?? none }),
  column.accessor('dateMade', {
    id: 'dateMade',
    header: labelOf('dateMade'),
    cell: (info) => {
      const row = info.row.original;
      if (!row.dateMade) return none;
      return (
        <span className="whitespace-nowrap" title={`EDTF ${row.dateMade}`}>
          {edtfAsWritten(row.dateMade)}
        </span>
      );
    },
  }),
  column.accessor('process', { id: 'process', header: labelOf('process'), enableSorting: false, cell: (info) => PROCESS.labels[info.getValue()] }),
  column.accessor('support', {
    id: 'support',
    header: labelOf('support'),
    enableSorting: false,
    cell: (info) => {
      const value = info.getValue();
      return value ? SUPPORT.labels[value] : none;
    },
  }),
  column.accessor('tonerClasses', {
    id: 'tonerClasses',
    header: labelOf('tonerClasses'),
    enableSorting: false,
    cell: (info) => (info.getValue().length ? info.getValue().map((t) => TONER_CLASS.labels[t]).join(', ') : none),
  }),
  column.accessor('paperLabel', { id: 'paper', header: labelOf('paper'), enableSorting: false, cell: (info) => info.getValue() ?? none }),
  column.accessor('status', { id: 'status', header: labelOf('status'), cell: (info) => <span className="whitespace-nowrap">{STATUS.labels[info.getValue()]}</span> }),
  column.accessor('enclosureName', { id: 'enclosure', header: labelOf('enclosure'), enableSorting: false, cell: (info) => info.getValue() ?? none }),
  column.accessor((row) => row.locationLabel ?? null, { id: 'location', header: labelOf('location'), enableSorting: false, cell: (info) => info.getValue() ?? none }),
  column.accessor('warningCodes', {
    id: 'warnings',
    header: labelOf('warnings'),
    enableSorting: false,
    cell: (info) => <WarningIndicator codes={info.getValue()} />,
  }),
  column.accessor('updatedAt', {
    id: 'updatedAt',
    header: labelOf('updatedAt'),
    cell: (info) => (
      <time dateTime={info.getValue()} className="whitespace-nowrap">
        {formatDate(info.getValue())}
      </time>
    ),
  }),
];

/** Columns a person can show or hide, with their labels from the print field table. */
export const CHOOSABLE_COLUMNS: { id: string; label: string }[] = printColumns
  .filter((c) => c.enableHiding !== false)
  .map((c) => ({ id: c.id!, label: labelOf(c.id!) }));

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
  const table = useServerTable({
    data: prints,
    columns: printColumns,
    getRowId: (print) => print.id,
    query,
    total,
    sorting,
    columnVisibility: visibility,
    onSortingChange: (next) => onSortChange(sortingToSort(next, query.sort, SORTS)),
  });
  return <DataTable table={table} caption="Prints in the catalogue" empty="No prints match this search." busy={busy} />;
}
