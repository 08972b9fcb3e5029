import { createColumnHelper } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import type { Round } from '@toneledger/common/schemas/inspections';
import { DataTable } from '@/components/ui/data-table';
import { formatDay } from '@/lib/format';
import { useServerTable } from '@/lib/server-table';
import type { RoundListQuery } from '@/features/inspections/api/rounds';

export const ROUND_STATUS_LABELS: Record<Round['status'], string> = { planned: 'Planned', done: 'Done', cancelled: 'Cancelled' };

const column = createColumnHelper<Round>();
const columns = [
  column.accessor('plannedOn', { header: 'Day', enableSorting: false, cell: (info) => <span className="whitespace-nowrap">{formatDay(info.getValue())}</span> }),
  column.accessor('title', {
    header: 'Round',
    enableSorting: false,
    cell: (info) => <Link to={`/inspections/rounds/${info.row.original.id}`}>{info.getValue()}</Link>,
  }),
  column.accessor('locationLabel', { header: 'Place', enableSorting: false, cell: (info) => info.getValue() ?? 'Several places' }),
  column.accessor((r) => r.assignee.name, { id: 'assignee', header: 'Carried out by', enableSorting: false }),
  column.accessor('status', { header: 'Status', enableSorting: false, cell: (info) => ROUND_STATUS_LABELS[info.getValue()] }),
  column.accessor('checkedCount', {
    header: () => <span className="block text-right">Checked</span>,
    enableSorting: false,
    cell: (info) => (
      <span className="num block text-right">
        {info.getValue()} of {info.row.original.printCount}
      </span>
    ),
  }),
];

/** Rounds, soonest planned first, paged by the server. */
export function RoundsTable({ rounds, query, total, busy }: { rounds: Round[]; query: RoundListQuery; total: number; busy: boolean }) {
  const table = useServerTable({ data: rounds, columns, getRowId: (r) => r.id, query, total, sorting: [], onSortingChange: () => {} });
  return <DataTable table={table} caption="Inspection rounds, soonest first" empty="No round matches these filters." busy={busy} />;
}
