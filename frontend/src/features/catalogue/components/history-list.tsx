import { useId } from 'react';
import type { HistoryEvent } from '@toneledger/common/schemas/catalogue';
import { auditSentence, changeLabel, formatAuditValue } from '@toneledger/common/fields/audit-words';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { TableHead } from '@/components/ui/table-head';
import { formatDateTime } from '@/lib/format';
import { useHistory } from '@/features/catalogue/api/get-history';

/**
 * One change as people read it: the field's label from the field tables and each value formatted the
 * way the screens show it (labels of codes, m:ss bath times, names of references, one step a line),
 * by the same words as the audit trail (fields/audit-words.ts). No internal code reaches the reader.
 */
function Changes({ changes }: { changes: HistoryEvent['changes'] }) {
  if (changes.length === 0) return null;
  return (
    <table className="mt-1.5 w-full border-collapse text-left text-xs">
      <TableHead variant="inline" columns={['Field', 'Before', 'After']} />
      <tbody>
        {changes.map((c, i) => (
          <tr key={`${c.field}-${i}`} className="border-t border-paper-200 align-top">
            <th scope="row" className="py-1 pr-3 font-medium text-ink-900">
              {changeLabel('print', c.field)}
            </th>
            <td className="py-1 pr-3 [overflow-wrap:anywhere] whitespace-pre-line text-ink-800">{formatAuditValue('print', c.field, c.before)}</td>
            <td className="py-1 [overflow-wrap:anywhere] whitespace-pre-line text-ink-900">{formatAuditValue('print', c.field, c.after)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** Every change to this print: who, when, what, with each field's before and after. */
export function HistoryList({ printId, accessionNumber }: { printId: string; accessionNumber: string }) {
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
                </p>
                <p className="text-ink-900">
                  {auditSentence({ actorName: event.actorName, action: event.action, entityType: 'print', before: null, after: event.action === 'print.moved' ? { location: event.changes.find((c) => c.field === 'location')?.after } : null }, `print ${accessionNumber}`)}
                </p>
                <Changes changes={event.changes} />
              </li>
            ))}
          </ol>
        )
      ) : null}
    </section>
  );
}
