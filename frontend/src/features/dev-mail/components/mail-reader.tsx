import type { CapturedMail } from '@toneledger/common/schemas/system';
import { formatDateTime } from '@/lib/format';

/** One caught message as plain text. HTML is shown only as source: nothing in it is loaded. */
export function MailReader({ message }: { message: CapturedMail }) {
  return (
    <article aria-labelledby="mail-subject" className="rounded border border-paper-300 bg-white p-4">
      <h2 id="mail-subject" className="text-xl break-words">
        {message.subject || '(no subject)'}
      </h2>
      <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="font-semibold text-ink-700">From</dt>
        <dd className="break-all">{message.from}</dd>
        <dt className="font-semibold text-ink-700">To</dt>
        <dd className="break-all">{message.to.join(', ') || '—'}</dd>
        <dt className="font-semibold text-ink-700">Received</dt>
        <dd>
          <time dateTime={message.receivedAt}>{formatDateTime(message.receivedAt)}</time>
        </dd>
      </dl>
      <pre className="mt-4 overflow-auto rounded bg-paper-50 p-3 font-sans text-sm leading-relaxed whitespace-pre-wrap text-ink-900">
        {message.text || '(This message has no text part.)'}
      </pre>
      {message.html ? (
        <details className="mt-3 text-sm">
          <summary className="cursor-pointer text-iron-700">HTML part (source)</summary>
          <pre className="mt-2 max-h-80 overflow-auto rounded bg-paper-50 p-3 text-xs whitespace-pre-wrap">{message.html}</pre>
        </details>
      ) : null}
    </article>
  );
}
