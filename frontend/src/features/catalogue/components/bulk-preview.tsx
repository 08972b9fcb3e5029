import type { BulkAction, BulkPreview } from '@toneledger/common/schemas/bulk';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { warningLabel } from '@/features/catalogue/utils/format';

const OUTCOME: Record<string, string> = { change: 'Changes', unchanged: 'Unchanged', refused: 'Refused' };
const n = (v: number) => v.toLocaleString('en-GB');

/** What an action would do: the counts, its warnings (with the rehouse offer), and each print's change. */
export function BulkPreviewView({ preview, action, onRehouse }: { preview: BulkPreview; action: BulkAction; onRehouse: (printIds: string[]) => void }) {
  return (
    <section aria-label="Preview" className="flex flex-col gap-3">
      <p className="text-sm" role="status">
        <strong>{n(preview.changing)}</strong> of {n(preview.total)} {preview.total === 1 ? 'print' : 'prints'} would change
        {preview.unchanged ? `; ${n(preview.unchanged)} already so` : ''}
        {preview.refused ? `; ${n(preview.refused)} refused` : ''}.
      </p>
      {preview.tooMany ? (
        <Notice tone="warning" role="alert" title="Too many prints for one action.">
          <p>
            At most {n(preview.limit)} prints can be changed at once; this selection has {n(preview.total)}. Narrow the search (a place, a status, a
            toner) and apply the action to each part.
          </p>
        </Notice>
      ) : null}
      {preview.warnings.length ? (
        <ul className="flex flex-col gap-2" aria-label="Warnings">
          {preview.warnings.map((w) => (
            <li key={w.code} className={`rounded border p-2 text-sm ${w.severity === 'high' ? 'border-sepia-600 bg-sepia-50' : 'border-paper-300 bg-paper-50'}`}>
              <p>
                <span aria-hidden="true">⚠ </span>
                {w.message}
              </p>
              {w.offer === 'rehouse' ? (
                <Button size="sm" className="mt-1" onClick={() => onRehouse(w.printIds)}>
                  {action === 'rehouse' ? `Choose another enclosure for these ${n(w.count)}` : `Rehouse these ${n(w.count)}`}
                </Button>
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
      <div className="max-h-96 overflow-auto rounded border border-paper-300" tabIndex={0} role="region" aria-label="Each print">
        <table className="w-full border-collapse text-left text-xs">
          <caption className="sr-only">What happens to each print</caption>
          <thead className="sticky top-0 bg-paper-100">
            <tr>
              <th scope="col" className="px-2 py-1">Print</th>
              <th scope="col" className="px-2 py-1">Now</th>
              <th scope="col" className="px-2 py-1">After</th>
              <th scope="col" className="px-2 py-1">Outcome</th>
            </tr>
          </thead>
          <tbody>
            {preview.rows.map((r) => (
              <tr key={r.printId} className={`border-t border-paper-200 ${r.outcome === 'refused' ? 'text-ink-600' : ''}`}>
                <td className="px-2 py-1">
                  <span className="mono">{r.accessionNumber}</span> <span className="text-ink-700">{r.title}</span>
                </td>
                <td className="px-2 py-1">{r.before ?? '—'}</td>
                <td className="px-2 py-1">{r.after ?? '—'}</td>
                <td className="px-2 py-1">
                  {OUTCOME[r.outcome]}
                  {r.note ? `: ${r.note}` : ''}
                  {r.newWarnings.length ? <span className="block text-sepia-800">New: {r.newWarnings.map(warningLabel).join('; ')}</span> : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {preview.rows.length < preview.total ? <p className="text-xs text-ink-600">The first {n(preview.rows.length)} prints are listed; the counts and warnings cover all {n(preview.total)}.</p> : null}
    </section>
  );
}
