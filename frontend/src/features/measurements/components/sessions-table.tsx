import { useMemo } from 'react';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import type { MeasurementSession } from '@toneledger/common/schemas/measurements';
import { DataTable } from '@/components/ui/data-table';
import { formatDay, formatNumber } from '@/features/measurements/utils/format';
import { VoidSession } from '@/features/measurements/components/void-session';

const column = createColumnHelper<MeasurementSession>();
const none = <span className="text-ink-600">—</span>;

const sessionColumns = [
  column.accessor('measuredOn', {
    header: 'Date',
    cell: (info) => (
      <time dateTime={info.getValue()} className={`whitespace-nowrap ${info.row.original.voided ? 'line-through' : ''}`}>
        {formatDay(info.getValue())}
      </time>
    ),
  }),
  column.accessor('instrument', {
    header: 'Instrument',
    cell: (info) => (
      <>
        {info.getValue()}
        {info.row.original.serial ? <span className="block text-xs text-ink-700">Serial {info.row.original.serial}</span> : null}
      </>
    ),
  }),
  column.accessor((s) => `${s.illuminant}/${s.observer}°`, { id: 'illuminant', header: 'Illuminant / observer' }),
  column.accessor('geometry', {
    header: 'Geometry',
    cell: (info) => (
      <>
        {info.getValue()}
        {info.row.original.aperture ? <span className="block text-xs text-ink-700">Aperture {info.row.original.aperture}</span> : null}
        {info.row.original.backing ? <span className="block text-xs text-ink-700">Backing: {info.row.original.backing}</span> : null}
      </>
    ),
  }),
  column.accessor('condition', { header: 'Condition', cell: (info) => info.getValue() ?? none }),
  column.accessor('measuredBy', { header: 'Measured by', cell: (info) => info.getValue() ?? none }),
  column.display({
    id: 'readings',
    // a* and b* keep their lower case inside the upper-case header row.
    header: () => <span className="normal-case">Readings: mean L* a* b*, n, sd</span>,
    cell: (info) => (
      <ul className={`num flex flex-col gap-1 ${info.row.original.voided ? 'line-through' : ''}`}>
        {info.row.original.readings.map((r) => (
          // The spot's name may wrap, each figure keeps together and the spread and density wrap between
          // figures, so the table fits a 1440 px screen with four spots of long names (e2e/measurements-width.e2e.ts).
          <li key={r.spotId}>
            <span className="font-medium">{r.spotName}</span>: <span className="whitespace-nowrap">{formatNumber(r.mean.L)} {formatNumber(r.mean.a)} {formatNumber(r.mean.b)}</span>
            <span className="block text-ink-700">
              <span className="whitespace-nowrap">n = {r.n}</span>
              {r.sd ? <> · <span className="whitespace-nowrap">sd {formatNumber(r.sd.L)} / {formatNumber(r.sd.a)} / {formatNumber(r.sd.b)}</span></> : null}
              {r.density !== null ? <> · <span className="whitespace-nowrap">D {formatNumber(r.density)}{r.densityType === 'status_a' ? ' (Status A)' : r.densityType === 'visual' ? ' (visual)' : ''}</span></> : null}
            </span>
          </li>
        ))}
      </ul>
    ),
  }),
  column.display({ id: 'void', header: 'Void', cell: (info) => <VoidSession session={info.row.original} /> }),
];

/** Every session at this print, newest first, with each spot's mean reading and spread. */
export function SessionsTable({ sessions }: { sessions: MeasurementSession[] }) {
  const data = useMemo(() => [...sessions].sort((a, b) => b.measuredOn.localeCompare(a.measuredOn)), [sessions]);
  const table = useReactTable({ data, columns: sessionColumns, getRowId: (s) => s.id, getCoreRowModel: getCoreRowModel(), enableSorting: false });
  return <DataTable table={table} caption="Measurement sessions at this print" empty="No sessions recorded yet." />;
}
