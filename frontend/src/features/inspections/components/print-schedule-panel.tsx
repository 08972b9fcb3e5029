import { useId, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { RISK_BAND_LABELS, type PrintSchedule, type RiskFactor } from '@toneledger/common/schemas/inspections';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { useMe } from '@/lib/auth';
import { isApiError } from '@/lib/api-client';
import { formatDay } from '@/lib/format';
import { usePrintSchedule } from '@/features/inspections/api/print-schedule';
import { PrintScheduleOverrideForm } from '@/features/inspections/components/print-schedule-override-form';
import { PrintScheduleRecompute } from '@/features/inspections/components/print-schedule-recompute';

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[10rem_minmax(0,1fr)] gap-2 py-1">
      <dt className="text-ink-700">{term}</dt>
      <dd className="text-ink-900">{children}</dd>
    </div>
  );
}

/** How a factor moved the date, in words: "6 months sooner", "12 months later", "by 2027-03-09". */
export function factorEffect(f: RiskFactor): string {
  if (f.dueBy) return `check by ${formatDay(f.dueBy)}`;
  const m = f.months ?? 0;
  return m < 0 ? `${-m} months sooner` : `${m} months later`;
}

function Figures({ schedule, mayWrite }: { schedule: PrintSchedule; mayWrite: boolean }) {
  const [changing, setChanging] = useState(false);
  const [saved, setSaved] = useState(false);
  return (
    <div className="flex flex-col gap-4">
      <dl className="divide-y divide-paper-200 text-sm">
        <Row term="Due">
          <span className="font-medium">{formatDay(schedule.dueOn)}</span>
          {schedule.override ? (
            <span className="mt-0.5 block text-xs text-ink-700">
              Set by {schedule.override.by.name}: {schedule.override.reason}. The computed date is {formatDay(schedule.computedDueOn)}.
            </span>
          ) : null}
        </Row>
        <Row term="Risk">
          {RISK_BAND_LABELS[schedule.risk]} <span className="text-ink-700">— a check every {schedule.intervalMonths} months</span>
        </Row>
        <Row term="Last checked">{schedule.lastCheckedOn ? formatDay(schedule.lastCheckedOn) : 'Never'}</Row>
        <Row term="In rounds">
          {schedule.rounds.length ? (
            <ul>
              {schedule.rounds.map((r) => (
                <li key={r.id}>
                  <Link to={`/inspections/rounds/${r.id}`}>{r.title}</Link> <span className="text-ink-700">({formatDay(r.plannedOn)})</span>
                </li>
              ))}
            </ul>
          ) : (
            'None planned'
          )}
        </Row>
      </dl>

      <div className="flex flex-col gap-1">
        <h3 className="font-sans text-xs font-semibold tracking-wider text-ink-700 uppercase">Why this date</h3>
        {schedule.factors.length ? (
          <ol aria-label="Reasons, largest first" className="list-decimal pl-5 text-sm">
            {schedule.factors.map((f) => (
              <li key={f.code + f.text}>
                {f.text} <span className="text-ink-700">({factorEffect(f)})</span>
              </li>
            ))}
          </ol>
        ) : (
          <p className="text-sm text-ink-700">Nothing brings it forward: the routine interval.</p>
        )}
        <p className="text-xs text-ink-700">Computed {new Date(schedule.computedAt).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })}.</p>
      </div>

      {saved ? (
        <Notice tone="success" role="status">
          Date saved.
        </Notice>
      ) : null}
      {mayWrite && !changing ? (
        <div>
          <Button
            size="sm"
            onClick={() => {
              setSaved(false);
              setChanging(true);
            }}
          >
            Set the date
          </Button>
        </div>
      ) : null}
      {mayWrite && changing ? (
        <PrintScheduleOverrideForm
          schedule={schedule}
          onDone={(done) => {
            setChanging(false);
            setSaved(done !== null);
          }}
        />
      ) : null}
      {mayWrite ? <PrintScheduleRecompute /> : null}
    </div>
  );
}

function deaccessionedDay(details: unknown): string | null {
  const day = (details as { deaccessioned?: unknown } | null)?.deaccessioned;
  return typeof day === 'string' ? day : null;
}

/**
 * The print page's "Next inspection" panel: the date in force, the risk, the reasons in plain words
 * largest first, the rounds it is in; conservators set a date of their own with a reason. Shown
 * only to roles that may read the schedule; for others it renders nothing and asks nothing.
 */
export function PrintSchedulePanel({ printId }: { printId: string }) {
  const me = useMe();
  const mayRead = can(me.role, 'schedule.read');
  const schedule = usePrintSchedule(printId, mayRead);
  const headingId = useId();
  if (!mayRead) return null;
  // A deaccessioned print is not inspected: the server answers 409 naming the day it left.
  const left = schedule.isError && isApiError(schedule.error) && schedule.error.status === 409 ? deaccessionedDay(schedule.error.details) : null;
  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4">
      <h2 id={headingId} className="mb-2 text-lg">
        Next inspection
      </h2>
      {schedule.isPending ? <Loading label="Loading the next inspection…" /> : null}
      {left ? (
        <p className="text-sm text-ink-800">No further inspections: the print was deaccessioned on {formatDay(left)}.</p>
      ) : schedule.isError ? (
        <ErrorNotice error={schedule.error} title="The next inspection could not be loaded." />
      ) : null}
      {schedule.data ? <Figures schedule={schedule.data} mayWrite={can(me.role, 'schedule.write')} /> : null}
    </section>
  );
}
