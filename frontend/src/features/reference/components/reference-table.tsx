import type { ReactNode } from 'react';
import { getCoreRowModel, useReactTable, type ColumnDef } from '@tanstack/react-table';
import { DataTable } from '@/components/ui/data-table';
import { Button } from '@/components/ui/button';
import { formatCount } from '@/lib/format';

export interface ReferenceTableProps<T extends { id: string }> {
  rows: T[];
  // Column value types differ per column.
  columns: ColumnDef<T, any>[];
  caption: string;
  empty: ReactNode;
  busy: boolean;
}

/** A reference list in the server's order (by name); search and paging happen on the server. */
export function ReferenceTable<T extends { id: string }>({ rows, columns, caption, empty, busy }: ReferenceTableProps<T>) {
  const table = useReactTable({
    data: rows,
    columns,
    getRowId: (row) => row.id,
    getCoreRowModel: getCoreRowModel(),
    enableSorting: false,
    manualPagination: true,
    manualFiltering: true,
  });
  return <DataTable table={table} caption={caption} empty={empty} busy={busy} />;
}

/** A count of prints that use a record, right-aligned in tabular figures. */
export function CountCell({ value }: { value: number }) {
  return <span className="num block text-right">{formatCount(value)}</span>;
}

export function EditButton({ name, onClick }: { name: string; onClick: () => void }) {
  return (
    <Button size="sm" variant="quiet" onClick={onClick} aria-label={`Edit ${name}`}>
      Edit
    </Button>
  );
}

export function Empty({ children }: { children: ReactNode }) {
  return <span className="text-ink-600">{children}</span>;
}
