import type { ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { TableHead } from '@/components/ui/table-head';
import { formatDateTime } from '@/lib/format';
import type { ReviewValue, StaleRow } from '@/lib/forms/stale-edit';

export interface StaleEditReviewProps {
  /** What was changed, as the heading says it: "this print", "this draft". */
  subject: string;
  rows: StaleRow[];
  lastChangedBy: string | null;
  lastChangedAt: string | null;
  currentVersion: number;
  onReapply: () => void;
  onDiscard: () => void;
}

function Value({ value }: { value: ReviewValue }): ReactNode {
  if (Array.isArray(value)) {
    if (value.length === 0) return <span className="text-ink-600">none</span>;
    return (
      <ol className="list-decimal pl-5">
        {value.map((line, index) => (
          <li key={index}>{line}</li>
        ))}
      </ol>
    );
  }
  return value === '' ? <span className="text-ink-600">empty</span> : value;
}

/**
 * The one review of a stale edit: a record was saved by someone else while the form was open. It
 * lists each field changed since the form opened, on either side, with its value then, as saved
 * since, and as typed; and offers to put the person's edits on top of the saved version, or to load
 * the saved version. Nothing is overwritten without that choice, and nothing typed is lost.
 */
export function StaleEditReview({ subject, rows, lastChangedBy, lastChangedAt, currentVersion, onReapply, onDiscard }: StaleEditReviewProps) {
  const who = lastChangedBy ?? 'Someone';
  const when = lastChangedAt ? ` on ${formatDateTime(lastChangedAt)}` : '';
  return (
    <section role="alert" aria-label="Changed since you opened it" className="rounded border border-sepia-200 bg-sepia-50 p-4 text-sm text-ink-900">
      <h2 className="font-sans text-base font-semibold text-sepia-800">Not saved: {subject} was changed while you were editing</h2>
      <p className="mt-1">
        {who} saved it{when} (now version {currentVersion}). Your edits are still in the form; nothing has been overwritten.
      </p>
      {rows.length > 0 ? (
        <table className="mt-3 w-full border-collapse bg-white text-left text-sm">
          <caption className="mb-1 text-left font-semibold">Changed since you opened it</caption>
          <TableHead columns={['Field', 'When you opened it', 'Saved since', 'Yours']} />
          <tbody>
            {rows.map((row) => (
              <tr key={row.key} className="border-t border-paper-200 align-top">
                <th scope="row" className="px-2 py-1.5 font-medium">
                  {row.label}
                </th>
                <td className="px-2 py-1.5 break-words">
                  <Value value={row.opened} />
                </td>
                <td className="px-2 py-1.5 break-words">{row.theyChanged ? <Value value={row.saved} /> : 'unchanged'}</td>
                <td className="px-2 py-1.5 break-words">
                  {!row.youChanged ? (
                    'Not changed by you; the current value will be kept'
                  ) : row.theyChanged ? (
                    <>
                      <strong className="font-semibold text-danger-700">You changed this too:</strong> <Value value={row.yours} />
                    </>
                  ) : (
                    <Value value={row.yours} />
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : (
        <p className="mt-2">None of the fields in this form changed.</p>
      )}
      <p className="mt-2">Re-applying puts your changes on top of the saved version (yours win where both changed); nothing is saved until you save again.</p>
      <div className="mt-3 flex flex-wrap gap-2">
        <Button variant="primary" onClick={onReapply}>
          Re-apply my changes to the current version
        </Button>
        <Button onClick={onDiscard}>Discard my changes and load the current version</Button>
      </div>
    </section>
  );
}
