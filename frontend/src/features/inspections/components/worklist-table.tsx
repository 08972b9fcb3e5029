import { useMemo } from 'react';
import { createColumnHelper, getCoreRowModel, useReactTable, type RowSelectionState, type SortingState, type Updater } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import { RISK_BAND_LABELS, type WorklistItem } from '@toneledger/common/schemas/inspections';
import { DataTable } from '@/components/ui/data-table';
import { formatDay } from '@/lib/format';
import { sortToSorting, sortingToSort } from '@/lib/server-table';
import type { WorklistQuery } from '@/features/inspections/api/rounds';

const WORKLIST_SORTS = ['dueOn', '-dueOn', 'location', 'risk', 'accessionNumber'] as const;
const GRADE_LABELS: Record<string, string> = { good: 'Good', fair: 'Fair', poor: 'Poor', unacceptable: 'Unacceptable' };

/** "12 days overdue", "in 5 days", "today". */
export function dueWords(overdueDays: number): string {
  if (overdueDays === 0) return 'today';
  if (overdueDays > 0) return `${overdueDays} ${overdueDays === 1 ? 'day' : 'days'} overdue`;
  return `in ${-overdueDays} ${overdueDays === -1 ? 'day' : 'days'}`;
}

const column = createColumnHelper<WorklistItem>();

function columns(selectable: boolean) {
  return [
    ...(selectable
      ? [
          column.display({
            id: 'select',
            header: ({ table }) => (
              <input
                type="checkbox"
                aria-label="Choose every print on this page"
                checked={table.getIsAllPageRowsSelected()}
                ref={(el) => {
                  if (el) el.indeterminate = table.getIsSomePageRowsSelected();
                }}
                onChange={table.getToggleAllPageRowsSelectedHandler()}
              />
            ),
            cell: ({ row }) => (
              <input
                type="checkbox"
                aria-label={`Choose ${row.original.accessionNumber}`}
                checked={row.getIsSelected()}
                onChange={row.getToggleSelectedHandler()}
              />
            ),
          }),
        ]
      : []),
    column.accessor('dueOn', {
      header: 'Due',
      cell: (info) => (
        <span className="whitespace-nowrap">
          {formatDay(info.getValue())}
          <span className={`block text-xs ${info.row.original.overdueDays > 0 ? 'font-semibold text-danger-700' : 'text-ink-700'}`}>
            {dueWords(info.row.original.overdueDays)}
            {info.row.original.overridden ? ' · set by hand' : ''}
          </span>
        </span>
      ),
    }),
    column.accessor('accessionNumber', {
      header: 'Print',
      cell: (info) => (
        <span>
          <Link to={`/catalogue/prints/${info.row.original.printId}`} className="mono whitespace-nowrap">
            {info.getValue()}
          </Link>
          {info.row.original.title ? <span className="block text-xs text-ink-700">{info.row.original.title}</span> : null}
        </span>
      ),
    }),
    column.accessor('locationLabel', { id: 'location', header: 'Place', cell: (info) => info.getValue() ?? '—' }),
    column.accessor('risk', { header: 'Risk', cell: (info) => RISK_BAND_LABELS[info.getValue()] }),
    column.accessor('mainReason', { header: 'Main reason', enableSorting: false }),
    column.accessor('lastGrade', {
      header: 'Last check',
      enableSorting: false,
      cell: (info) =>
        info.row.original.lastCheckedOn ? `${formatDay(info.row.original.lastCheckedOn)}${info.getValue() ? ` · ${GRADE_LABELS[info.getValue()!]}` : ''}` : 'Never',
    }),
    column.accessor('round', {
      header: 'Round',
      enableSorting: false,
      cell: (info) => {
        const round = info.getValue();
        return round ? (
          <Link to={`/inspections/rounds/${round.id}`}>
            {round.title}
            <span className="block text-xs text-ink-700">
              {formatDay(round.plannedOn)} · {round.assigneeName}
            </span>
          </Link>
        ) : (
          '—'
        );
      },
    }),
  ];
}

export interface WorklistTableProps {
  items: WorklistItem[];
  query: WorklistQuery;
  total: number;
  busy: boolean;
  onSort: (sort: WorklistQuery['sort']) => void;
  /** Chosen prints by id (kept across pages); absent for a role that cannot plan. */
  selection?: RowSelectionState;
  onSelection?: (next: RowSelectionState) => void;
}

/** The prints due, sorted and paged by the server; a conservator chooses prints with the check boxes. */
export function WorklistTable({ items, query, total, busy, onSort, selection, onSelection }: WorklistTableProps) {
  const selectable = !!onSelection;
  const cols = useMemo(() => columns(selectable), [selectable]);
  const sorting = sortToSorting(query.sort);
  const pagination = { pageIndex: query.page - 1, pageSize: query.pageSize };
  const table = useReactTable({
    data: items,
    columns: cols,
    getRowId: (r) => r.printId,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    sortDescFirst: false,
    enableRowSelection: selectable,
    pageCount: Math.max(1, Math.ceil(total / query.pageSize)),
    state: { sorting, pagination, rowSelection: selection ?? {} },
    onSortingChange: (updater: Updater<SortingState>) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      onSort(sortingToSort(next, 'dueOn', WORKLIST_SORTS));
    },
    onRowSelectionChange: (updater: Updater<RowSelectionState>) => onSelection?.(typeof updater === 'function' ? updater(selection ?? {}) : updater),
  });
  return <DataTable table={table} caption="Prints due for a check, soonest first" empty="No print is due in this window with these filters." busy={busy} />;
}
