import { Fragment, useEffect, useRef, useState, type ReactNode } from 'react';
import { flexRender, type Row, type Table } from '@tanstack/react-table';

export interface DataTableProps<T> {
  table: Table<T>;
  caption: string;
  /** Shown when the table has no rows. */
  empty: ReactNode;
  /** True while a new page is being fetched and the old one is still shown. */
  busy?: boolean;
  /** Content of the full-width row under an expanded row. */
  renderExpanded?: (row: Row<T>) => ReactNode;
}

function sortLabel(direction: false | 'asc' | 'desc'): string {
  if (direction === 'asc') return '▲';
  if (direction === 'desc') return '▼';
  return '↕';
}

/** Whether a box is wider inside than on screen, watched as it and its content change size. */
export function useScrollableRegion() {
  const ref = useRef<HTMLDivElement>(null);
  const [overflows, setOverflows] = useState(false);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const check = () => setOverflows(el.scrollWidth > el.clientWidth + 1);
    check();
    if (typeof ResizeObserver === 'undefined') return;
    const observer = new ResizeObserver(check);
    observer.observe(el);
    if (el.firstElementChild) observer.observe(el.firstElementChild);
    return () => observer.disconnect();
  }, []);
  return { ref, overflows };
}

/** The table shell every list uses: sortable headers, dense rows, optional expanded rows. */
export function DataTable<T>({ table, caption, empty, busy = false, renderExpanded }: DataTableProps<T>) {
  const rows = table.getRowModel().rows;
  const columnCount = table.getVisibleLeafColumns().length;
  const scroll = useScrollableRegion();
  return (
    <div
      ref={scroll.ref}
      className="overflow-x-auto rounded border border-paper-300 bg-white focus-visible:outline-2 focus-visible:outline-iron-700"
      // Wider than the screen: the keyboard can reach and scroll it (WCAG 2.1, 2.1.1), and it is named.
      {...(scroll.overflows ? { tabIndex: 0, role: 'region', 'aria-label': `${caption} (scrolls sideways)` } : {})}
    >
      <table className="w-full border-collapse text-left text-sm" aria-busy={busy || undefined}>
        <caption className="sr-only">{caption}</caption>
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
                    className="border-b border-paper-300 px-3 py-2 text-xs font-semibold tracking-wide whitespace-nowrap text-ink-700 uppercase"
                  >
                    {canSort ? (
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className="inline-flex items-center gap-1 uppercase hover:text-iron-800"
                      >
                        {content}
                        <span aria-hidden="true" className={direction ? 'text-iron-700' : 'text-paper-400'}>
                          {sortLabel(direction)}
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
        <tbody className={busy ? 'opacity-60 transition-opacity' : undefined}>
          {rows.length === 0 ? (
            <tr>
              <td colSpan={columnCount} className="px-3 py-8 text-center text-ink-700">
                {empty}
              </td>
            </tr>
          ) : (
            rows.map((row) => (
              <Fragment key={row.id}>
                <tr className="border-b border-paper-200 last:border-b-0 hover:bg-paper-50">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2 align-top">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
                {renderExpanded && row.getIsExpanded() ? (
                  <tr className="border-b border-paper-200 bg-paper-50">
                    <td colSpan={columnCount} className="px-3 py-3">
                      {renderExpanded(row)}
                    </td>
                  </tr>
                ) : null}
              </Fragment>
            ))
          )}
        </tbody>
      </table>
    </div>
  );
}
