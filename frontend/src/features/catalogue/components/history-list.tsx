import { useId } from 'react';
import type { HistoryEvent } from '@toneledger/common/schemas/catalogue';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { TableHead } from '@/components/ui/table-head';
import { formatDateTime } from '@/lib/format';
import { useHistory } from '@/features/catalogue/api/get-history';

/** A readable form of a recorded value: references by their name, step lists as one line per step. */
export function show(value: unknown): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'string') return value;
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  if (Array.isArray(value)) {
    if (value.length === 0) return 'none';
    return value.map((v, i) => `${i + 1}. ${show(describeStep(v))}`).join('\n');
  }
  if (typeof value === 'object') {
    const o = value as Record<string, unknown>;
    for (const key of ['pathLabel', 'label', 'name']) if (typeof o[key] === 'string') return o[key] as string;
  }
  return JSON.stringify(value);
}

function describeStep(v: unknown): unknown {
  if (!v || typeof v !== 'object') return v;
  const s = v as Record<string, unknown>;
  if (typeof s.type !== 'string') return v;
  const recipe = s.recipe && typeof s.recipe === 'object' ? (s.recipe as { name?: string }).name : null;
  return [s.type, s.tonerClass, s.agent, recipe, s.timeSeconds != null ? `${s.timeSeconds} s` : null].filter(Boolean).join(', ').replace(/_/g, ' ');
}

function Changes({ changes }: { changes: HistoryEvent['changes'] }) {
  if (changes.length === 0) return null;
  return (
    <table className="mt-1.5 w-full border-collapse text-left text-xs">
      <TableHead variant="inline" columns={['Field', 'Before', 'After']} />
      <tbody>
        {changes.map((c, i) => (
          <tr key={`${c.field}-${i}`} className="border-t border-paper-200 align-top">
            <th scope="row" className="py-1 pr-3 font-medium text-ink-900">
              <code className="mono">{c.field}</code>
            </th>
            <td className="py-1 pr-3 [overflow-wrap:anywhere] whitespace-pre-line text-ink-800">{show(c.before)}</td>
            <td className="py-1 [overflow-wrap:anywhere] whitespace-pre-line text-ink-900">{show(c.after)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** Every change to this print: who, when, what, with each field's before and after. */
export function HistoryList({ printId }: { printId: string }) {
  const history = useHistory(printId, true);
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4">
      <h2 id={headingId} className="text-lg">
        History of changes
      </h2>
      {history.isPending ? <Loading label="Loading history…" /> : null}
      {history.isError ? <ErrorNotice error={history.error} title="The history could not be loaded." /> : null}
      {history.data ? (
        history.data.length === 0 ? (
          <p className="mt-2 text-sm text-ink-700">No changes recorded.</p>
        ) : (
          <ol className="mt-2 flex flex-col divide-y divide-paper-200">
            {history.data.map((event) => (
              <li key={event.id} className="py-2 text-sm">
                <p>
                  <time dateTime={event.at} className="text-ink-700">
                    {formatDateTime(event.at)}
                  </time>
                  {' · '}
                  <span className="font-medium">{event.actorName ?? 'System'}</span>
                  {' · '}
                  <code className="mono text-xs text-ink-700">{event.action}</code>
                </p>
                <p className="text-ink-900">{event.summary}</p>
                <Changes changes={event.changes} />
              </li>
            ))}
          </ol>
        )
      ) : null}
    </section>
  );
}
