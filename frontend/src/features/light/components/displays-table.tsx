import { Link } from 'react-router-dom';
import type { PrintLight } from '@toneledger/common/schemas/light';
import { TableHead } from '@/components/ui/table-head';
import { formatLux, formatLuxHours } from '@/features/light/utils/format';

/** Every display period of the print, oldest first, each linked to its exhibition. */
export function DisplaysTable({ displays, asOf }: { displays: PrintLight['displays']; asOf: string }) {
  if (displays.length === 0) return <p className="text-sm text-ink-700">Never on display, and no display planned.</p>;
  const rows = [...displays].sort((a, b) => a.startsOn.localeCompare(b.startsOn));
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm">
        <caption className="sr-only">Displays</caption>
        <TableHead columns={['Exhibition', 'Dates', { label: 'Illuminance', align: 'right' }, { label: 'Hours a day', align: 'right' }, { label: 'Exposure', align: 'right' }]} />
        <tbody className="divide-y divide-paper-200">
          {rows.map((d) => (
            <tr key={d.id}>
              <td className="px-2 py-1.5">
                <Link to={`/exhibitions/${d.exhibitionId}`}>{d.exhibitionTitle}</Link>
                {d.endsOn >= asOf ? <span className="ml-1 text-xs text-ink-700">(planned)</span> : null}
              </td>
              <td className="num px-2 py-1.5">
                {/* The two dates may stack, so the exposure column stays in view in the print page's narrow panel. */}
                <span className="whitespace-nowrap">{d.startsOn}</span> – <span className="whitespace-nowrap">{d.endsOn}</span>
              </td>
              <td className="num px-2 py-1.5 text-right">{formatLux(d.lux)}</td>
              <td className="num px-2 py-1.5 text-right">{d.hoursPerDay}</td>
              <td className="num px-2 py-1.5 text-right whitespace-nowrap">{formatLuxHours(d.luxHours)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
