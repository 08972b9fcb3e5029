import { useState, type FormEvent } from 'react';
import { useSearchParams } from 'react-router-dom';
import { climatePeriodQuerySchema } from '@toneledger/common/schemas/climate';
import { Button } from '@/components/ui/button';
import type { Period } from '@/features/climate/api/keys';

/** The period in the URL (`?from=&to=`); empty means the last 365 days to today. */
export function usePeriod(): [Period, (p: Period) => void] {
  const [params, setParams] = useSearchParams();
  const parsed = climatePeriodQuerySchema.safeParse({ from: params.get('from') || undefined, to: params.get('to') || undefined });
  const period = parsed.success ? parsed.data : {};
  const set = (p: Period) => {
    const next = new URLSearchParams(params);
    for (const k of ['from', 'to'] as const) {
      if (p[k]) next.set(k, p[k]!);
      else next.delete(k);
    }
    setParams(next, { replace: true });
  };
  return [period, set];
}

const DAY = 86_400_000;
const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** Chooses the period the figures cover: the last 365 or 30 days, a calendar year, or dates typed in. */
export function PeriodChooser({ period, onChange, shown }: { period: Period; onChange: (p: Period) => void; shown?: { from: string; to: string } }) {
  const [from, setFrom] = useState(period.from ?? '');
  const [to, setTo] = useState(period.to ?? '');
  const [problem, setProblem] = useState<string | null>(null);
  const year = new Date().getUTCFullYear();
  const today = Date.now();

  function submit(e: FormEvent) {
    e.preventDefault();
    const parsed = climatePeriodQuerySchema.safeParse({ from: from || undefined, to: to || undefined });
    if (!parsed.success) return setProblem(parsed.error.issues[0]?.message ?? 'Check the dates');
    setProblem(null);
    onChange(parsed.data);
  }
  const choose = (p: Period) => {
    setFrom(p.from ?? '');
    setTo(p.to ?? '');
    setProblem(null);
    onChange(p);
  };

  return (
    <form aria-label="Period" onSubmit={submit} className="mb-4 flex flex-wrap items-end gap-2 print:hidden">
      <div className="flex flex-wrap gap-1" role="group" aria-label="Quick periods">
        <Button size="sm" onClick={() => choose({})}>Last 365 days</Button>
        <Button size="sm" onClick={() => choose({ from: isoDay(today - 29 * DAY), to: isoDay(today) })}>Last 30 days</Button>
        {[year - 1, year - 2].map((y) => (
          <Button key={y} size="sm" onClick={() => choose({ from: `${y}-01-01`, to: `${y}-12-31` })}>{y}</Button>
        ))}
      </div>
      <label className="flex flex-col text-sm">
        From
        <input type="date" className="rounded border border-paper-400 px-2 py-1" value={from} onChange={(e) => setFrom(e.target.value)} />
      </label>
      <label className="flex flex-col text-sm">
        To
        <input type="date" className="rounded border border-paper-400 px-2 py-1" value={to} onChange={(e) => setTo(e.target.value)} />
      </label>
      <Button type="submit" size="sm" variant="primary">Show</Button>
      {shown ? <span className="text-sm text-ink-700">Showing {shown.from} to {shown.to}</span> : null}
      {problem ? <p role="alert" className="w-full text-xs font-medium text-danger-700">{problem}</p> : null}
    </form>
  );
}
