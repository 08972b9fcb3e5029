import type { ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { formatDateTime } from '@/lib/format';

/** One field that someone else changed while this form was open. */
export interface StaleFieldChange<F extends string = string> {
  field: F;
  label: string;
  opened: string;
  now: string;
  alsoChangedByYou: boolean;
}

export interface StaleEditNoticeProps<F extends string> {
  /** What was changed, as the heading says it: "this print", "this draft". */
  subject: string;
  caption: string;
  /** Shown when none of the form's fields changed. */
  noChanges: string;
  changes: StaleFieldChange<F>[];
  lastChangedBy: string | null;
  lastChangedAt: string | null;
  currentVersion: number;
  /** How the person's own value of a field reads. */
  describeMine: (field: F) => string;
  onReapply: () => void;
  onDiscard: () => void;
}

const blank = (value: string): ReactNode => (value === '' ? <span className="text-ink-600">empty</span> : value);

/**
 * A record was saved by someone else while this form was open. Shows what they changed, next to what
 * this person typed, and lets them put their edits on top of the current version or take the current
 * version. Nothing is overwritten without that choice.
 */
export function StaleEditNotice<F extends string>(props: StaleEditNoticeProps<F>) {
  const { subject, caption, noChanges, changes, lastChangedBy, lastChangedAt, currentVersion, describeMine, onReapply, onDiscard } = props;
  const who = lastChangedBy ?? 'Someone';
  const when = lastChangedAt ? ` on ${formatDateTime(lastChangedAt)}` : '';
  return (
    <section role="alert" aria-label="Changed since you opened it" className="rounded border border-sepia-200 bg-sepia-50 p-4 text-sm text-ink-900">
      <h2 className="font-sans text-base font-semibold text-sepia-800">Not saved: {subject} was changed while you were editing</h2>
      <p className="mt-1">
        {who} saved it{when} (now version {currentVersion}). Your edits are still in the form; nothing has been overwritten.
      </p>
      {changes.length > 0 ? (
        <table className="mt-3 w-full border-collapse bg-white text-left text-sm">
          <caption className="mb-1 text-left font-semibold">{caption}</caption>
          <thead className="bg-paper-100 text-xs text-ink-700 uppercase">
            <tr>
              <th scope="col" className="px-2 py-1.5">Field</th>
              <th scope="col" className="px-2 py-1.5">When you opened it</th>
              <th scope="col" className="px-2 py-1.5">Now</th>
              <th scope="col" className="px-2 py-1.5">Your edit</th>
            </tr>
          </thead>
          <tbody>
            {changes.map((c) => (
              <tr key={c.field} className="border-t border-paper-200 align-top">
                <th scope="row" className="px-2 py-1.5 font-medium">
                  {c.label}
                </th>
                <td className="px-2 py-1.5">{blank(c.opened)}</td>
                <td className="px-2 py-1.5">{blank(c.now)}</td>
                <td className="px-2 py-1.5">
                  {c.alsoChangedByYou ? (
                    <>
                      <strong className="font-semibold text-danger-700">You changed this too:</strong> {blank(describeMine(c.field))}
                    </>
                  ) : (
                    <span className="text-ink-700">Not changed by you; the current value will be kept</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : (
        <p className="mt-2">{noChanges}</p>
      )}
      <div className="mt-3 flex flex-wrap gap-2">
        <Button variant="primary" onClick={onReapply}>
          Re-apply my changes to the current version
        </Button>
        <Button onClick={onDiscard}>Discard my changes and load the current version</Button>
      </div>
    </section>
  );
}
