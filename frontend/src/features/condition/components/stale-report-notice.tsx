import { Button } from '@/components/ui/button';
import { formatDateTime } from '@/lib/format';
import type { StaleChange } from '@/features/condition/utils/report-form';

export interface StaleReportNoticeProps {
  changes: StaleChange[];
  lastChangedBy: string | null;
  lastChangedAt: string | null;
  currentVersion: number;
  describeMine: (field: StaleChange['field']) => string;
  onReapply: () => void;
  onDiscard: () => void;
}

const blank = (value: string) => (value === '' ? <span className="text-ink-600">empty</span> : value);

/** The draft was saved elsewhere (another tab or window) after this form opened: what changed, and what to do. */
export function StaleReportNotice({ changes, lastChangedBy, lastChangedAt, currentVersion, describeMine, onReapply, onDiscard }: StaleReportNoticeProps) {
  const who = lastChangedBy ?? 'Someone';
  const when = lastChangedAt ? ` on ${formatDateTime(lastChangedAt)}` : '';
  return (
    <section role="alert" aria-label="Changed since you opened it" className="rounded border border-sepia-200 bg-sepia-50 p-4 text-sm text-ink-900">
      <h2 className="font-sans text-base font-semibold text-sepia-800">Not saved: this draft was changed while you were editing</h2>
      <p className="mt-1">
        {who} saved it{when} (now version {currentVersion}). Your edits are still in the form; nothing has been overwritten.
      </p>
      {changes.length > 0 ? (
        <table className="mt-3 w-full border-collapse bg-white text-left text-sm">
          <caption className="mb-1 text-left font-semibold">Changed since you opened the draft</caption>
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
                    <span className="text-ink-700">Not changed by you; the saved value will be kept</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : (
        <p className="mt-2">None of the fields differ.</p>
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
