import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper, type SortingState } from '@tanstack/react-table';
import { PROCESS, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { DataTable } from '@/components/ui/data-table';
import { useServerTable } from '@/lib/server-table';
import type { Leader } from '@/features/measurements/api/get-leaders';
import type { LeadersQuery } from '@/features/measurements/api/keys';
import { formatDay, formatMonthYear, formatNumber, formatRange } from '@/features/measurements/utils/format';

const column = createColumnHelper<Leader>();
const none = <span className="text-ink-600">—</span>;
const label = <T extends string>(labels: Record<T, string>, code: string) => (labels as Record<string, string>)[code] ?? code;

/** Columns; `rate` and `change` are the API's sort names, highest first. */
export const leaderColumns = [
  column.accessor('accessionNumber', {
    header: 'Print',
    enableSorting: false,
    cell: (info) => (
      <Link to={`/measurements/prints/${info.row.original.printId}`} className="mono font-medium whitespace-nowrap">
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor('title', { header: 'Title', enableSorting: false }),
  column.accessor('process', { header: 'Process', enableSorting: false, cell: (info) => label(PROCESS.labels, info.getValue()) }),
  column.accessor('tonerClasses', {
    header: 'Toners',
    enableSorting: false,
    cell: (info) => (info.getValue().length ? info.getValue().map((t) => label(TONER_CLASS.labels, t)).join(', ') : none),
  }),
  column.accessor('spotName', { header: 'Spot', enableSorting: false }),
  column.accessor('latestDeltaE00', {
    id: 'change',
    header: 'Latest ΔE00',
    sortDescFirst: true,
    cell: (info) => {
      const v = info.getValue();
      return v === null ? none : <span className="num">{formatNumber(v)}</span>;
    },
  }),
  column.accessor('ratePerYear', {
    id: 'rate',
    header: 'ΔE00 per year',
    sortDescFirst: true,
    cell: (info) => {
      const v = info.getValue();
      const ci = info.row.original.rateCi95;
      if (v === null) return <span className="text-ink-700">No rate</span>;
      return (
        <span className="num whitespace-nowrap">
          {formatNumber(v)}
          {ci ? <span className="block text-xs text-ink-700">95 % CI {formatRange(ci[0], ci[1])}</span> : null}
        </span>
      );
    },
  }),
  column.accessor('sessions', { header: 'Sessions', enableSorting: false, cell: (info) => <span className="num">{info.getValue()}</span> }),
  column.accessor('projectedDate', {
    header: 'Noticeable around',
    enableSorting: false,
    cell: (info) => {
      const v = info.getValue();
      return v ? <span className="whitespace-nowrap">{formatMonthYear(v)}</span> : none;
    },
  }),
  column.accessor('lastMeasuredOn', {
    header: 'Last measured',
    enableSorting: false,
    cell: (info) => (
      <time dateTime={info.getValue()} className="whitespace-nowrap">
        {formatDay(info.getValue())}
      </time>
    ),
  }),
];

export interface LeadersTableProps {
  leaders: Leader[];
  query: LeadersQuery;
  total: number;
  busy: boolean;
  onSortChange: (sort: LeadersQuery['sort']) => void;
}

/** Spots changing most, sorted and paged by the server: the table mirrors the query in the URL. */
export function LeadersTable({ leaders, query, total, busy, onSortChange }: LeadersTableProps) {
  const sorting = useMemo<SortingState>(() => [{ id: query.sort, desc: true }], [query.sort]);
  const table = useServerTable({
    data: leaders,
    columns: leaderColumns,
    getRowId: (l) => l.spotId,
    query,
    total,
    sorting,
    enableMultiSort: false,
    onSortingChange: (next) => {
      const id = next[0]?.id;
      if (id === 'rate' || id === 'change') onSortChange(id);
    },
  });
  return <DataTable table={table} caption="Spots whose colour is changing most" empty="No spots with measurements match these filters." busy={busy} />;
}
