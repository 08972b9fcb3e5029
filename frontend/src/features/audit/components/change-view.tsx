import type { AuditEvent } from '@toneledger/common/schemas/audit';
import { TableHead } from '@/components/ui/table-head';

/**
 * The before and after of one audited change, field by field: each field by its label, each value as
 * the screens show it (the server words them with fields/audit-words.ts), never raw JSON or codes.
 */
export function ChangeView({ changes }: { changes: AuditEvent['changes'] }) {
  if (changes.length === 0) return <p className="text-sm text-ink-700">No field changed.</p>;
  return (
    <table className="w-full border-collapse text-left text-sm">
      <caption className="sr-only">Fields changed, before and after</caption>
      <TableHead variant="inline" columns={['Field', 'Before', 'After']} />
      <tbody>
        {changes.map((c) => (
          <tr key={c.field} className="border-t border-paper-200 align-top">
            <th scope="row" className="py-1 pr-3 font-medium text-ink-900">
              {c.label}
            </th>
            <td className="py-1 pr-3 [overflow-wrap:anywhere] whitespace-pre-line text-ink-800">{c.before}</td>
            <td className="py-1 [overflow-wrap:anywhere] whitespace-pre-line text-ink-900">{c.after}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
