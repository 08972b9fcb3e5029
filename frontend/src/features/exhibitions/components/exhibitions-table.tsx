import { createColumnHelper } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import type { Exhibition } from '@toneledger/common/schemas/exhibitions';
import { DataTable } from '@/components/ui/data-table';
import { formatDay } from '@/lib/format';
import type { ExhibitionListQuery } from '@/lib/exhibitions-api';
import { useServerTable } from '@/lib/server-table';

const column = createColumnHelper<Exhibition>();

const columns = [
  column.accessor('title', {
    header: 'Title',
    enableSorting: false,
    cell: (info) => (
      <Link to={`/exhibitions/${info.row.original.id}`} className="font-medium">
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor('organiser', { header: 'Organiser', enableSorting: false, cell: (info) => info.getValue() ?? <span className="text-ink-600">—</span> }),
  column.accessor('venues', {
    header: 'Venues',
    enableSorting: false,
    cell: (info) => info.getValue().map((v) => v.name).join(' · '),
  }),
  column.accessor('opensOn', { header: 'Opens', enableSorting: false, cell: (info) => <span className="whitespace-nowrap">{formatDay(info.getValue())}</span> }),
  column.accessor('closesOn', { header: 'Closes', enableSorting: false, cell: (info) => <span className="whitespace-nowrap">{formatDay(info.getValue())}</span> }),
  column.accessor('objectCount', {
    header: () => <span className="block text-right">Objects</span>,
    enableSorting: false,
    cell: (info) => <span className="num block text-right">{info.getValue()}</span>,
  }),
];

/** Exhibitions, latest opening first, paged by the server. */
export function ExhibitionsTable({ exhibitions, query, total, busy }: { exhibitions: Exhibition[]; query: ExhibitionListQuery; total: number; busy: boolean }) {
  const table = useServerTable({ data: exhibitions, columns, getRowId: (e) => e.id, query, total, sorting: [], onSortingChange: () => {} });
  return <DataTable table={table} caption="Exhibitions, latest opening first" empty="No exhibition matches these filters." busy={busy} />;
}
