import type { ScheduleRecompute } from '@toneledger/common/schemas/inspections';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { useScheduleRecompute, useStartScheduleRecompute } from '@/features/inspections/api/print-schedule';

const count = (n: number) => n.toLocaleString('en-GB');

/** The line saying how far the full recompute of every print's date has gone. */
export function scheduleRecomputeText(r: ScheduleRecompute): string {
  const rate = r.rate !== null ? `, ${count(Math.round(r.rate))} prints a second` : '';
  if (r.status === 'running') return `Recomputing every print's date: ${count(r.done)} of ${count(r.total)}${rate}`;
  if (r.status === 'failed') return `The last recompute stopped after ${count(r.done)} of ${count(r.total)} prints; start it again.`;
  const when = r.finishedAt ? ` on ${new Date(r.finishedAt).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })}` : '';
  return `Dates of ${count(r.total)} prints recomputed${when}${rate}.`;
}

/**
 * For conservators: start a full recompute of every print's next inspection (after a change of the
 * model's inputs that marks nothing, such as the noticeable-change threshold), and see its progress.
 */
export function PrintScheduleRecompute() {
  const progress = useScheduleRecompute();
  const start = useStartScheduleRecompute();
  const running = progress.data?.status === 'running';
  return (
    <div className="flex flex-col gap-2">
      {progress.data ? (
        <p role="status" aria-live="polite" className="text-sm text-ink-700">
          {scheduleRecomputeText(progress.data)}
        </p>
      ) : null}
      <div>
        <Button size="sm" onClick={() => start.mutate()} disabled={running || start.isPending}>
          {running ? 'Recomputing…' : "Recompute every print's date"}
        </Button>
      </div>
      {start.isError ? <ErrorNotice error={start.error} title="The recompute could not be started." /> : null}
    </div>
  );
}
