import { warningLabel } from '@/features/catalogue/utils/format';

/** A compact marker for a list row: the count, with every warning named for screen readers and on hover. */
export function WarningIndicator({ codes }: { codes: string[] }) {
  if (codes.length === 0) {
    return (
      <span className="text-ink-600">
        <span aria-hidden="true">—</span>
        <span className="sr-only">No warnings</span>
      </span>
    );
  }
  const names = codes.map(warningLabel);
  const label = `${codes.length} ${codes.length === 1 ? 'warning' : 'warnings'}: ${names.join('; ')}`;
  return (
    <span
      role="img"
      aria-label={label}
      title={names.join('\n')}
      className="inline-flex items-center gap-1 rounded bg-sepia-100 px-1.5 py-0.5 text-xs font-semibold text-sepia-800"
    >
      <span aria-hidden="true">⚠</span>
      <span aria-hidden="true" className="num">
        {codes.length}
      </span>
    </span>
  );
}
