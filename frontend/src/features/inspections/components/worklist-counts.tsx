import type { z } from 'zod';
import type { worklistCountsSchema } from '@toneledger/common/schemas/inspections';
import { formatCount } from '@/lib/format';
import type { WorklistQuery } from '@/features/inspections/api/rounds';

const WINDOWS: { window: WorklistQuery['window']; label: string; count: (c: z.infer<typeof worklistCountsSchema>) => number }[] = [
  { window: 'overdue', label: 'Overdue', count: (c) => c.overdue },
  { window: '30', label: 'Due within 30 days', count: (c) => c.within30 },
  { window: '90', label: 'Due within 90 days', count: (c) => c.within90 },
  { window: 'all', label: 'Every scheduled print', count: (c) => c.total },
];

/** The header's counts, each a button choosing its window (the 30 and 90 days include the overdue). */
export function WorklistCounts({ counts, window, onWindow }: {
  counts: z.infer<typeof worklistCountsSchema> | undefined;
  window: WorklistQuery['window'];
  onWindow: (window: WorklistQuery['window']) => void;
}) {
  return (
    <div role="group" aria-label="Due dates" className="mb-4 flex flex-wrap gap-2 print:hidden">
      {WINDOWS.map((w) => (
        <button
          key={w.window}
          type="button"
          aria-pressed={window === w.window}
          onClick={() => onWindow(w.window)}
          className={`rounded border px-3 py-2 text-left ${window === w.window ? 'border-iron-700 bg-iron-50' : 'border-paper-300 bg-white hover:bg-paper-50'}`}
        >
          <span className="num block text-xl font-semibold text-ink-900">{counts ? formatCount(w.count(counts)) : '–'}</span>
          <span className="text-xs text-ink-700">{w.label}</span>
        </button>
      ))}
    </div>
  );
}
