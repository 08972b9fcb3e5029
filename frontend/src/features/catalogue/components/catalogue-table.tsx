import { useEffect, useMemo, useRef, type KeyboardEvent, type MouseEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { createColumnHelper, flexRender, type ColumnDef, type VisibilityState } from '@tanstack/react-table';
import { imagesApi } from '@toneledger/common/api/images';
import { printSortSchema, type PrintListItem, type PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { labelOf } from '@toneledger/common/fields/print';
import { urlOf } from '@/lib/api-client';
import { sortingToSort, sortToSorting, useServerTable } from '@/lib/server-table';
import { printColumns } from '@/features/catalogue/components/prints-table';
import { clickRow, isSelected, togglePage, type ListSelection } from '@/features/catalogue/utils/selection';
import { bareLabel, COMPACT_PROCESS, lastLevels, shortTitle } from '@/features/catalogue/utils/compact';
import { PROCESS, TONER_CLASS } from '@toneledger/common/schemas/vocab';

const SORTS = printSortSchema.options as readonly string[];
const column = createColumnHelper<PrintListItem>();
const none = <span className="text-ink-600">—</span>;

export interface CatalogueTableProps {
  prints: PrintListItem[];
  query: PrintListQuery;
  total: number;
  busy: boolean;
  columnVisibility: VisibilityState;
  showLocation: boolean;
  /** One line per print: short titles, the location's last two levels, small thumbnails. */
  compact: boolean;
  selection: ListSelection;
  onSelectionChange: (next: ListSelection) => void;
  onSortChange: (sort: string) => void;
}

function Thumb({ row, compact }: { row: PrintListItem; compact: boolean }) {
  const size = compact ? 'h-7 w-7' : 'h-12 w-12';
  if (!row.thumbImageId) return <span className={`block ${size} rounded-sm bg-paper-100`} aria-hidden="true" />;
  return <img src={urlOf(imagesApi.file, { params: { id: row.thumbImageId, variant: 'thumb' } })} alt="" loading="lazy" className={`block ${size} bg-paper-100 object-contain`} />;
}

/** One line of a compact cell: the text shortened (or given shorter) with the whole of it on hover. */
function Short({ full, shown, max, className = '' }: { full: string; shown?: string; max: number; className?: string }) {
  const short = shortTitle(shown ?? full, max);
  return (
    <span className={`whitespace-nowrap ${className}`} title={short === full ? undefined : full}>
      {short}
    </span>
  );
}

/**
 * The catalogue list: the print columns of prints-table.tsx with a box per row (shift-click ticks a
 * range), a thumbnail (the latest recto) and a compact mode. Keyboard: arrow keys move between rows,
 * Enter opens the print, space ticks its box.
 */
export function CatalogueTable(props: CatalogueTableProps) {
  const { prints, query, total, busy, columnVisibility, showLocation, compact, selection, onSelectionChange, onSortChange } = props;
  const navigate = useNavigate();
  const pageIds = useMemo(() => prints.map((p) => p.id), [prints]);
  const allOnPage = pageIds.length > 0 && pageIds.every((id) => isSelected(selection, id));
  const someOnPage = pageIds.some((id) => isSelected(selection, id));
  const headerBox = useRef<HTMLInputElement>(null);
  useEffect(() => {
    if (headerBox.current) headerBox.current.indeterminate = someOnPage && !allOnPage;
  }, [someOnPage, allOnPage]);

  const columns = useMemo(() => {
    const select: ColumnDef<PrintListItem, unknown> = {
      id: 'select',
      enableSorting: false,
      enableHiding: false,
      header: () => (
        <input
          ref={headerBox}
          type="checkbox"
          aria-label="Select every print on this page"
          checked={allOnPage}
          onChange={() => onSelectionChange(togglePage(selection, pageIds))}
          className="h-4 w-4"
        />
      ),
      cell: (info) => {
        const row = info.row.original;
        return (
          <input
            type="checkbox"
            aria-label={`Select ${row.accessionNumber}`}
            checked={isSelected(selection, row.id)}
            disabled={selection.kind === 'query'}
            onClick={(event: MouseEvent<HTMLInputElement>) => {
              event.preventDefault();
              onSelectionChange(clickRow(selection, pageIds, row.id, event.shiftKey));
            }}
            onChange={() => {}}
            className="h-4 w-4"
          />
        );
      },
    };
    const thumb: ColumnDef<PrintListItem, unknown> = {
      id: 'thumbnail', header: () => <span className="sr-only">Image</span>, enableSorting: false, cell: (info) => <Thumb row={info.row.original} compact={compact} />,
    };
    const compactOverrides: ColumnDef<PrintListItem, unknown>[] = [
      column.accessor('title', {
        id: 'title', header: labelOf('title'), enableHiding: false,
        cell: (info) => <Short full={info.getValue()} max={28} className="text-ink-900" />,
      }) as ColumnDef<PrintListItem, unknown>,
      column.accessor('makerName', { id: 'maker', header: labelOf('maker'), cell: (info) => (info.getValue() ? <Short full={info.getValue()!} max={16} /> : none) }) as ColumnDef<PrintListItem, unknown>,
      column.accessor('process', {
        id: 'process', header: labelOf('process'), enableSorting: false,
        cell: (info) => <Short full={PROCESS.labels[info.getValue()]} shown={COMPACT_PROCESS[info.getValue()]} max={20} />,
      }) as ColumnDef<PrintListItem, unknown>,
      column.accessor('tonerClasses', {
        id: 'tonerClasses', header: labelOf('tonerClasses'), enableSorting: false,
        cell: (info) => {
          const v = info.getValue();
          if (!v.length) return none;
          return <Short full={v.map((t) => TONER_CLASS.labels[t]).join(', ')} shown={v.map((t) => bareLabel(TONER_CLASS.labels[t])).join(', ')} max={18} />;
        },
      }) as ColumnDef<PrintListItem, unknown>,
      column.accessor('paperLabel', { id: 'paper', header: labelOf('paper'), enableSorting: false, cell: (info) => (info.getValue() ? <Short full={info.getValue()!} max={18} /> : none) }) as ColumnDef<PrintListItem, unknown>,
      column.accessor('enclosureName', { id: 'enclosure', header: labelOf('enclosure'), enableSorting: false, cell: (info) => (info.getValue() ? <Short full={info.getValue()!} max={16} /> : none) }) as ColumnDef<PrintListItem, unknown>,
      column.accessor((row) => row.locationLabel ?? null, {
        id: 'location', header: labelOf('location'), enableSorting: false,
        cell: (info) => {
          const full = info.getValue();
          return full ? <span className="whitespace-nowrap" title={full}>{shortTitle(lastLevels(full), 22)}</span> : none;
        },
      }) as ColumnDef<PrintListItem, unknown>,
    ];
    const accession = printColumns[0] as ColumnDef<PrintListItem, unknown>;
    compactOverrides.push({ ...accession, header: () => <span title={labelOf('accessionNumber')}>Accession no.</span> } as ColumnDef<PrintListItem, unknown>);
    const base = (printColumns as ColumnDef<PrintListItem, unknown>[]).map((c) => (compact ? compactOverrides.find((o) => o.id === c.id) ?? c : c));
    return [select, thumb, ...base];
  }, [compact, selection, pageIds, allOnPage, onSelectionChange]);

  const sorting = useMemo(() => sortToSorting(query.sort), [query.sort]);
  const visibility = useMemo(() => ({ ...columnVisibility, ...(showLocation ? {} : { location: false }) }), [columnVisibility, showLocation]);
  const table = useServerTable({
    data: prints, columns, getRowId: (p) => p.id, query, total, sorting, columnVisibility: visibility,
    onSortingChange: (next) => onSortChange(sortingToSort(next, query.sort, SORTS)),
  });
  const rows = table.getRowModel().rows;
  const body = useRef<HTMLTableSectionElement>(null);

  function onRowKey(event: KeyboardEvent<HTMLTableRowElement>, index: number, id: string) {
    if (event.target !== event.currentTarget) return;
    const go = (i: number) => {
      const next = body.current?.querySelectorAll<HTMLTableRowElement>('tr[data-row]')[i];
      if (next) {
        event.preventDefault();
        next.focus();
      }
    };
    if (event.key === 'ArrowDown') go(index + 1);
    else if (event.key === 'ArrowUp') go(index - 1);
    else if (event.key === 'Home') go(0);
    else if (event.key === 'End') go(rows.length - 1);
    else if (event.key === 'Enter') navigate(`/catalogue/prints/${id}`);
    else if (event.key === ' ' && selection.kind === 'ids') {
      event.preventDefault();
      onSelectionChange(clickRow(selection, pageIds, id, event.shiftKey));
    }
  }

  const cellPad = compact ? 'px-1 py-1 whitespace-nowrap align-middle' : 'px-3 py-2 align-top';
  return (
    <div className="overflow-x-auto rounded border border-paper-300 bg-white" data-testid="catalogue-table">
      <table className={`w-full border-collapse text-left ${compact ? 'text-xs' : 'text-sm'}`} aria-busy={busy || undefined} data-compact={compact || undefined}>
        <caption className="sr-only">Prints in the catalogue. Arrow keys move between rows, Enter opens a print, space selects it.</caption>
        <thead className="bg-paper-100">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const canSort = header.column.getCanSort();
                const direction = header.column.getIsSorted();
                const content = header.isPlaceholder ? null : flexRender(header.column.columnDef.header, header.getContext());
                return (
                  <th
                    key={header.id}
                    scope="col"
                    aria-sort={canSort ? (direction === 'asc' ? 'ascending' : direction === 'desc' ? 'descending' : 'none') : undefined}
                    className={`border-b border-paper-300 text-xs font-semibold whitespace-nowrap text-ink-700 ${compact ? 'px-1 py-1' : 'px-3 py-2 tracking-wide uppercase'}`}
                  >
                    {canSort ? (
                      <button type="button" onClick={header.column.getToggleSortingHandler()} className={`inline-flex items-center gap-1 hover:text-iron-800 ${compact ? '' : 'uppercase'}`}>
                        {content}
                        <span aria-hidden="true" className={direction ? 'text-iron-700' : 'text-paper-400'}>
                          {direction === 'asc' ? '▲' : direction === 'desc' ? '▼' : '↕'}
                        </span>
                      </button>
                    ) : (
                      content
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody ref={body} className={busy ? 'opacity-60 transition-opacity' : undefined}>
          {rows.length === 0 ? (
            <tr>
              <td colSpan={table.getVisibleLeafColumns().length} className="px-3 py-8 text-center text-ink-700">
                No prints match this search.
              </td>
            </tr>
          ) : (
            rows.map((row, index) => (
              <tr
                key={row.id}
                data-row
                tabIndex={index === 0 ? 0 : -1}
                aria-selected={isSelected(selection, row.id)}
                onKeyDown={(event) => onRowKey(event, index, row.id)}
                className={`border-b border-paper-200 last:border-b-0 hover:bg-paper-50 focus:outline-2 focus:-outline-offset-2 focus:outline-iron-700 ${isSelected(selection, row.id) ? 'bg-iron-50' : ''}`}
              >
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className={cellPad}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))
          )}
        </tbody>
      </table>
    </div>
  );
}
