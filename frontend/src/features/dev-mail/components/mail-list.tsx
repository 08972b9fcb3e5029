import type { CapturedMail } from '@toneledger/common/schemas/system';
import { formatDateTime } from '@/lib/format';

export function MailList({ messages, selectedId, onSelect }: { messages: CapturedMail[]; selectedId: string | null; onSelect: (id: string) => void }) {
  if (messages.length === 0) {
    return <p className="rounded border border-paper-300 bg-white px-3 py-6 text-center text-sm text-ink-700">No messages caught yet.</p>;
  }
  return (
    <ul aria-label="Caught messages" className="divide-y divide-paper-200 overflow-hidden rounded border border-paper-300 bg-white">
      {messages.map((message) => {
        const selected = message.id === selectedId;
        return (
          <li key={message.id}>
            <button
              type="button"
              onClick={() => onSelect(message.id)}
              aria-current={selected ? 'true' : undefined}
              className={`flex w-full flex-col gap-0.5 border-l-[3px] px-3 py-2 text-left ${
                selected ? 'border-sepia-700 bg-iron-50' : 'border-transparent hover:bg-paper-50'
              }`}
            >
              <span className="truncate text-sm font-medium text-ink-900">{message.subject || '(no subject)'}</span>
              <span className="truncate text-xs text-ink-700">To {message.to.join(', ') || '—'}</span>
              <time dateTime={message.receivedAt} className="text-xs text-ink-600">
                {formatDateTime(message.receivedAt)}
              </time>
            </button>
          </li>
        );
      })}
    </ul>
  );
}
