import { useState } from 'react';
import { Link } from 'react-router-dom';
import { can, type Role } from '@toneledger/common/domain/roles';
import { APPROVAL_LABELS, WEEKDAY_LABELS, type Display, type ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { LIGHT_RESPONSIVITY } from '@toneledger/common/schemas/vocab';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { TableHead } from '@/components/ui/table-head';
import { formatDateTime, formatDay } from '@/lib/format';
import { useDeleteDisplay } from '@/features/exhibitions/api/save-exhibition';
import { ApprovalControls } from '@/features/exhibitions/components/approval';
import { DisplayForm } from '@/features/exhibitions/components/display-form';

type ExhibitionObject = ExhibitionDetail['objects'][number];

const figure = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });
const APPROVAL_TONE = { pending: 'text-sepia-800', approved: 'text-ok-700', refused: 'text-danger-700' } as const;

function days(d: Display): string {
  if (d.daysOpen.length === 7) return 'Every day';
  return [...d.daysOpen].sort((a, b) => a - b).map((n) => WEEKDAY_LABELS[n]).join(' ');
}

/** The light figures the exhibition gives this print: lux-hours, the budget left after it, the ΔE00 it is expected to add. */
function LightFigures({ object }: { object: ExhibitionObject }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 text-sm">
      <dt className="text-ink-700">This exhibition</dt>
      <dd className="num">{figure.format(object.luxHours)} lux-hours</dd>
      <dt className="text-ink-700">Budget left that year</dt>
      <dd className={`num ${object.budgetLeftLuxHours != null && object.budgetLeftLuxHours < 0 ? 'font-semibold text-danger-700' : ''}`}>
        {object.budgetLeftLuxHours == null ? 'No budget for its category' : `${figure.format(object.budgetLeftLuxHours)} lux-hours`}
      </dd>
      <dt className="text-ink-700">Expected ΔE00</dt>
      <dd className="num">{object.expectedDeltaE00 == null ? 'Not enough data' : object.expectedDeltaE00.toFixed(2)}</dd>
    </dl>
  );
}

export interface ExhibitionObjectProps {
  exhibition: ExhibitionDetail;
  object: ExhibitionObject;
  role: Role;
  onRemove?: () => void;
  removing?: boolean;
}

/** One print on the object list: approval, light figures, warnings and its display periods. */
export function ExhibitionObjectEntry({ exhibition, object, role, onRemove, removing = false }: ExhibitionObjectProps) {
  const [editing, setEditing] = useState<string | 'new' | null>(null);
  const remove = useDeleteDisplay(exhibition.id);
  const mayDisplay = can(role, 'displays.write');
  const responsivity = LIGHT_RESPONSIVITY.labels[object.lightResponsivity as keyof typeof LIGHT_RESPONSIVITY.labels] ?? object.lightResponsivity;
  const headingId = `object-${object.printId}`;
  return (
    <li aria-labelledby={headingId} className="flex flex-col gap-2 rounded border border-paper-300 bg-white p-3 break-inside-avoid">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0">
          <h3 id={headingId} className="text-base">
            <Link to={`/catalogue/prints/${object.printId}`} className="mono">
              {object.accessionNumber}
            </Link>{' '}
            {object.printTitle}
          </h3>
          <p className="text-xs text-ink-700">Light responsivity: {responsivity}</p>
          <p className={`text-sm font-medium ${APPROVAL_TONE[object.approval]}`}>
            {APPROVAL_LABELS[object.approval]}
            {object.approvedBy ? (
              <span className="font-normal text-ink-700">
                {' '}
                · {object.approvedBy.name}, {formatDateTime(object.approvedAt)}
              </span>
            ) : null}
          </p>
          {object.approvalReason ? <p className="text-sm whitespace-pre-line">Reason: {object.approvalReason}</p> : null}
        </div>
        <LightFigures object={object} />
        <div className="flex flex-col items-end gap-2">
          {can(role, 'displays.approve') ? <ApprovalControls exhibitionId={exhibition.id} object={object} /> : null}
          {onRemove ? (
            <Button size="sm" variant="quiet" disabled={removing} onClick={onRemove} className="print:hidden" aria-label={`Take ${object.accessionNumber} off the list`}>
              Take off the list
            </Button>
          ) : null}
        </div>
      </div>
      {object.warnings.length > 0 ? (
        <ul aria-label={`Warnings for ${object.accessionNumber}`} className="rounded border border-sepia-200 bg-sepia-50 px-3 py-1 text-sm text-sepia-800">
          {object.warnings.map((w) => (
            <li key={w.code}>{w.message}</li>
          ))}
        </ul>
      ) : null}
      {remove.isError ? <ErrorNotice error={remove.error} title="The display period was not deleted." /> : null}
      {object.displays.length === 0 ? (
        <p className="text-sm text-ink-700">No display period recorded.</p>
      ) : (
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">Display periods of {object.accessionNumber}</caption>
          <TableHead columns={['Dates', 'Venue', { label: 'Lux', align: 'right' }, { label: 'Hours a day', align: 'right' }, 'Days open', 'Closed', 'UV', 'Case or frame', 'Mount', { label: 'Lux-hours', align: 'right' }, ...(mayDisplay ? [''] : [])]} />
          <tbody>
            {object.displays.map((d) => (
              <tr key={d.id} className="border-t border-paper-200 align-top">
                <td className="px-2 py-1.5 whitespace-nowrap">
                  {formatDay(d.startsOn)} – {formatDay(d.endsOn)}
                </td>
                <td className="px-2 py-1.5">{d.venueName ?? '—'}</td>
                <td className="num px-2 py-1.5 text-right">{d.lux}</td>
                <td className="num px-2 py-1.5 text-right">{d.hoursPerDay}</td>
                <td className="px-2 py-1.5">{days(d)}</td>
                <td className="px-2 py-1.5">{d.closedDates.length === 0 ? '—' : d.closedDates.map(formatDay).join(', ')}</td>
                <td className="num px-2 py-1.5">{d.uvMicrowattsPerLumen == null ? '—' : `${d.uvMicrowattsPerLumen} µW/lm`}</td>
                <td className="px-2 py-1.5">{d.caseOrFrame ?? '—'}</td>
                <td className="px-2 py-1.5 whitespace-pre-line">{d.mountNotes ?? '—'}</td>
                <td className="num px-2 py-1.5 text-right">{figure.format(d.luxHours)}</td>
                {mayDisplay ? (
                  <td className="px-2 py-1.5 whitespace-nowrap print:hidden">
                    <Button size="sm" variant="quiet" onClick={() => setEditing(d.id)} aria-label={`Edit the display period from ${d.startsOn}`}>
                      Edit
                    </Button>
                    <Button
                      size="sm"
                      variant="quiet"
                      disabled={remove.isPending}
                      onClick={() => remove.mutate({ id: d.id, printId: d.printId, version: d.version })}
                      aria-label={`Delete the display period from ${d.startsOn}`}
                    >
                      Delete
                    </Button>
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {mayDisplay ? (
        editing ? (
          <DisplayForm
            key={editing}
            exhibition={exhibition}
            printId={object.printId}
            accessionNumber={object.accessionNumber}
            display={editing === 'new' ? undefined : object.displays.find((d) => d.id === editing)}
            onDone={() => setEditing(null)}
          />
        ) : (
          <div className="print:hidden">
            <Button size="sm" onClick={() => setEditing('new')}>
              Add a display period
            </Button>
          </div>
        )
      ) : null}
    </li>
  );
}
