import type { LightRecompute } from '@toneledger/common/schemas/light';
import { useLightRecompute } from '@/features/light/api/light-settings';

const count = (n: number) => n.toLocaleString('en-GB');

/** The line saying how far the recompute of categories and light warnings after a settings change has gone. */
export function recomputeText(r: LightRecompute): string {
  if (r.status === 'running') return `Recomputing categories: ${count(r.done)} of ${count(r.total)}`;
  const when = r.finishedAt ? ` on ${new Date(r.finishedAt).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })}` : '';
  return `Categories and light warnings of ${count(r.total)} prints recomputed${when}.`;
}

export function RecomputeProgress() {
  const progress = useLightRecompute();
  if (!progress.data) return null;
  return (
    <p role="status" aria-live="polite" className="mb-4 text-sm text-ink-700">
      {recomputeText(progress.data)}
    </p>
  );
}
