import type { DigestSend } from '@toneledger/common/schemas/inspections';
import { TableHead } from '@/components/ui/table-head';
import { formatDateTime } from '@/lib/format';

export const DIGEST_STATUS_LABELS: Record<DigestSend['status'], string> = {
  sending: 'Sending', sent: 'Sent', failed: 'Failed, being tried again', empty: 'Nothing due, none sent',
};

/** Every weekly digest sent or tried: to whom, which week, its state, attempts and the last error. */
export function DigestsTable({ digests, busy }: { digests: DigestSend[]; busy: boolean }) {
  if (digests.length === 0) return <p className="py-6 text-sm text-ink-700">No weekly digests yet.</p>;
  return (
    <table className={`w-full text-sm ${busy ? 'opacity-60' : ''}`} aria-busy={busy}>
      <caption className="sr-only">Weekly digests</caption>
      <TableHead columns={['Person', 'Week', 'State', { label: 'Attempts', align: 'right' }, { label: 'Overdue', align: 'right' }, { label: 'Due soon', align: 'right' }, 'Sent', 'Last error']} />
      <tbody>
        {digests.map((d) => (
          <tr key={d.id} className="border-t border-paper-300 align-top">
            <td className="px-2 py-1.5">{d.user.name}<div className="text-xs text-ink-700">{d.user.email ?? 'no e-mail address'}</div></td>
            <td className="mono px-2 py-1.5">{d.week}</td>
            <td className="px-2 py-1.5">{DIGEST_STATUS_LABELS[d.status]}</td>
            <td className="px-2 py-1.5 text-right">{d.attempts}</td>
            <td className="px-2 py-1.5 text-right">{d.overdue}</td>
            <td className="px-2 py-1.5 text-right">{d.due}</td>
            <td className="px-2 py-1.5">{d.sentAt ? formatDateTime(d.sentAt) : '—'}</td>
            <td className="px-2 py-1.5 break-words">{d.lastError ?? '—'}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
