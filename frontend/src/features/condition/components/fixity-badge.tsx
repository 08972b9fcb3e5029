import type { FixityResult } from '@toneledger/common/schemas/images';

const OUTCOMES: Record<FixityResult['outcome'] | 'none', { text: string; classes: string }> = {
  match: { text: 'Fixity ok', classes: 'border-ok-200 bg-ok-50 text-ok-700' },
  mismatch: { text: 'Fixity: changed', classes: 'border-danger-200 bg-danger-50 text-danger-700' },
  missing: { text: 'Fixity: missing', classes: 'border-danger-200 bg-danger-50 text-danger-700' },
  error: { text: 'Fixity: check failed', classes: 'border-sepia-200 bg-sepia-50 text-sepia-800' },
  none: { text: 'Fixity: not checked', classes: 'border-paper-300 bg-paper-50 text-ink-700' },
};

/** The latest fixity result of an image: ok, changed (the bytes no longer match), missing, or not checked. */
export function FixityBadge({ result }: { result: FixityResult | null }) {
  const outcome = OUTCOMES[result?.outcome ?? 'none'];
  return <span className={`inline-block rounded border px-1.5 py-0.5 text-[0.6875rem] font-semibold ${outcome.classes}`}>{outcome.text}</span>;
}
