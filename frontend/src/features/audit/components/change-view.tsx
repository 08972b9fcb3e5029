function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Top-level fields whose value differs between two snapshots (all fields when one side is missing). */
export function changedFields(before: unknown, after: unknown): string[] {
  if (!isRecord(before) && !isRecord(after)) return [];
  const a = isRecord(before) ? before : {};
  const b = isRecord(after) ? after : {};
  const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])];
  return keys.filter((key) => JSON.stringify(a[key]) !== JSON.stringify(b[key])).sort();
}

function Snapshot({ title, value }: { title: string; value: unknown }) {
  return (
    <div className="min-w-0 flex-1">
      <h3 className="mb-1 font-sans text-xs font-semibold tracking-wider text-ink-700 uppercase">{title}</h3>
      {value === null || value === undefined ? (
        <p className="text-sm text-ink-600">Nothing recorded.</p>
      ) : (
        <pre className="max-h-80 overflow-auto rounded border border-paper-300 bg-white p-2.5 text-xs leading-relaxed whitespace-pre-wrap text-ink-900">
          {JSON.stringify(value, null, 2)}
        </pre>
      )}
    </div>
  );
}

/** The before and after of one audited change, side by side, with the fields that changed named. */
export function ChangeView({ before, after }: { before: unknown; after: unknown }) {
  const changed = changedFields(before, after);
  return (
    <div className="flex flex-col gap-3">
      {changed.length > 0 ? (
        <p className="text-sm text-ink-800">
          Changed:{' '}
          {changed.map((field, index) => (
            <span key={field}>
              {index > 0 ? ', ' : ''}
              <code className="mono rounded bg-sepia-50 px-1 text-sepia-800">{field}</code>
            </span>
          ))}
        </p>
      ) : null}
      <div className="flex flex-col gap-3 lg:flex-row">
        <Snapshot title="Before" value={before} />
        <Snapshot title="After" value={after} />
      </div>
    </div>
  );
}
