import { useId } from 'react';
import type { Warning } from '@toneledger/common/schemas/catalogue';

const SEVERITY: Record<Warning['severity'], { label: string; classes: string }> = {
  high: { label: 'High', classes: 'bg-danger-50 text-danger-700 border-danger-200' },
  medium: { label: 'Medium', classes: 'bg-sepia-50 text-sepia-800 border-sepia-200' },
  low: { label: 'Low', classes: 'bg-iron-50 text-iron-800 border-iron-200' },
};

export interface WarningsPanelProps {
  warnings: Warning[];
  /** The region's name; "Warnings" on the print page. */
  title?: string;
  /** Said when there is nothing to warn about. */
  empty?: string;
  intro?: string;
  live?: boolean;
}

/** Warnings computed from the record: severity, the message, and the basis of each rule. */
export function WarningsPanel({ warnings, title = 'Warnings', empty = 'No warnings for this record.', intro, live = false }: WarningsPanelProps) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4">
      <h2 id={headingId} className="text-lg">
        {title}
      </h2>
      {intro ? <p className="mt-1 text-xs text-ink-700">{intro}</p> : null}
      <div aria-live={live ? 'polite' : undefined}>
        {warnings.length === 0 ? (
          <p className="mt-2 text-sm text-ink-700">{empty}</p>
        ) : (
          <ul className="mt-3 flex flex-col gap-3">
            {warnings.map((w) => (
              <li key={w.code} className={`rounded border px-3 py-2 ${SEVERITY[w.severity].classes}`}>
                <p className="text-sm">
                  <span className="mr-2 rounded bg-white/70 px-1.5 py-0.5 text-[0.6875rem] font-semibold tracking-wide uppercase">
                    {SEVERITY[w.severity].label}
                    <span className="sr-only"> severity</span>
                  </span>
                  {w.message}
                </p>
                <details className="mt-1 text-xs text-ink-800">
                  <summary className="cursor-pointer">Basis</summary>
                  <p className="mt-1">{w.basis}</p>
                </details>
              </li>
            ))}
          </ul>
        )}
      </div>
      {warnings.length > 0 ? (
        <p className="mt-3 text-xs text-ink-700">Toneledger advises; decisions on care rest with qualified conservators.</p>
      ) : null}
    </section>
  );
}
