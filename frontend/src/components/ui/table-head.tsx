import type { ReactNode } from 'react';

export type TableColumn = ReactNode | { label: ReactNode; align: 'right' };

const STYLES = {
  /** Small capitals on a tinted row: record tables inside a panel. */
  compact: { head: 'bg-paper-100 text-xs text-ink-700 uppercase', cell: 'px-2 py-1.5' },
  /** Wider cells and spaced capitals: tables that stand on their own (ingredients). */
  roomy: { head: 'bg-paper-100 text-xs font-semibold tracking-wide text-ink-700 uppercase', cell: 'px-3 py-2' },
  /** Tinted, headings as written (a file's own column names, its problems). */
  plain: { head: 'bg-paper-100', cell: 'px-2 py-1 font-semibold' },
  /** No tint: a small table nested in a list entry. */
  inline: { head: 'text-ink-700', cell: 'py-1 pr-3 font-semibold last:pr-0' },
} as const;

function isAligned(column: TableColumn): column is { label: ReactNode; align: 'right' } {
  return typeof column === 'object' && column !== null && 'align' in column;
}

/** The header row of a simple table: one column heading (scope="col") per entry, in order. */
export function TableHead({ columns, variant = 'compact' }: { columns: readonly TableColumn[]; variant?: keyof typeof STYLES }) {
  const style = STYLES[variant];
  return (
    <thead className={style.head}>
      <tr>
        {columns.map((column, index) => (
          <th key={index} scope="col" className={isAligned(column) ? `${style.cell} text-right` : style.cell}>
            {isAligned(column) ? column.label : column}
          </th>
        ))}
      </tr>
    </thead>
  );
}
