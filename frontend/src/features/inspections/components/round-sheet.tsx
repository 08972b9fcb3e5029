import { Link } from 'react-router-dom';
import type { RoundDetail } from '@toneledger/common/schemas/inspections';
import { buttonClasses } from '@/components/ui/button';
import { formatDay } from '@/lib/format';

const GRADE_LABELS: Record<string, string> = { good: 'Good', fair: 'Fair', poor: 'Poor', unacceptable: 'Unacceptable' };

/**
 * The round's prints in shelf order, as a sheet to carry along: on paper each row has a box to tick
 * and room for notes; on screen each print opens its condition report, or shows the one that checked it.
 */
export function RoundSheet({ round, canCheck }: { round: RoundDetail; canCheck: boolean }) {
  return (
    <table className="w-full border-collapse text-left text-sm print:text-[10pt]">
      <caption className="sr-only">Prints of the round in shelf order</caption>
      <thead className="bg-paper-100 print:bg-transparent">
        <tr className="text-xs text-ink-700 uppercase">
          <th scope="col" className="hidden w-8 border-b border-paper-300 px-2 py-2 print:table-cell">
            Done
          </th>
          <th scope="col" className="border-b border-paper-300 px-2 py-2">Print</th>
          <th scope="col" className="border-b border-paper-300 px-2 py-2">Place</th>
          <th scope="col" className="border-b border-paper-300 px-2 py-2">Last check</th>
          <th scope="col" className="border-b border-paper-300 px-2 py-2">Due</th>
          <th scope="col" className="border-b border-paper-300 px-2 py-2">Look at</th>
          <th scope="col" className="border-b border-paper-300 px-2 py-2 print:hidden">Check</th>
          <th scope="col" className="hidden w-40 border-b border-paper-300 px-2 py-2 print:table-cell">
            Notes
          </th>
        </tr>
      </thead>
      <tbody>
        {round.items.map((item) => (
          <tr key={item.printId} className="border-b border-paper-200 align-top break-inside-avoid" data-checked={item.checkedOn ? '' : undefined}>
            <td className="hidden px-2 py-2 print:table-cell">
              <span aria-hidden="true" className="inline-block size-4 border border-ink-900">
                {item.checkedOn ? '✓' : ''}
              </span>
            </td>
            <td className="px-2 py-2">
              <Link to={`/catalogue/prints/${item.printId}`} className="mono whitespace-nowrap">
                {item.accessionNumber}
              </Link>
              {item.title ? <span className="block text-xs text-ink-700">{item.title}</span> : null}
            </td>
            <td className="px-2 py-2">{item.locationLabel ?? 'No place recorded'}</td>
            <td className="px-2 py-2 whitespace-nowrap">
              {item.lastCheckedOn ? formatDay(item.lastCheckedOn) : 'Never'}
              {item.lastGrade ? <span className="block text-xs text-ink-700">{GRADE_LABELS[item.lastGrade]}</span> : null}
            </td>
            <td className="px-2 py-2 whitespace-nowrap">{item.dueOn ? formatDay(item.dueOn) : '—'}</td>
            <td className="px-2 py-2">
              {item.lookAt.length ? (
                <ul className="list-disc pl-4">
                  {item.lookAt.map((line, i) => (
                    <li key={i}>{line}</li>
                  ))}
                </ul>
              ) : (
                'A general check'
              )}
            </td>
            <td className="px-2 py-2 print:hidden">
              {item.checkedOn && item.conditionReportId ? (
                <Link to={`/condition/reports/${item.conditionReportId}`} className="whitespace-nowrap">
                  Checked {formatDay(item.checkedOn)}
                </Link>
              ) : canCheck && round.status === 'planned' ? (
                <Link to={`/condition/prints/${item.printId}/reports/new?context=routine`} className={buttonClasses('secondary', 'sm')}>
                  Check now
                </Link>
              ) : (
                'Not checked'
              )}
            </td>
            <td className="hidden px-2 py-2 print:table-cell" />
          </tr>
        ))}
      </tbody>
    </table>
  );
}
