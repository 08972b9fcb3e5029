import { useState, type FormEvent } from 'react';
import { testMailSchema } from '@toneledger/common/schemas/system';
import { isApiError } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useSendTestMail } from '@/features/dev-mail/api/send-test-mail';

/** Sends one message through the app's own mail transport, to check that mail goes out. */
export function TestMailForm() {
  const send = useSendTestMail();
  const [to, setTo] = useState('');
  const [error, setError] = useState<string | undefined>();

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = testMailSchema.safeParse(to.trim() ? { to: to.trim() } : {});
    if (!parsed.success) {
      setError(parsed.error.issues[0]?.message ?? 'Check this address');
      return;
    }
    setError(undefined);
    send.mutate(parsed.data);
  }

  const serverFieldError = isApiError(send.error) ? send.error.fieldIssues.find((issue) => issue.path === 'to')?.message : undefined;

  return (
    <form onSubmit={submit} noValidate aria-labelledby="test-mail-heading" className="rounded border border-paper-300 bg-paper-100 p-4">
      <h2 id="test-mail-heading" className="text-lg">
        Send a test message
      </h2>
      <p className="mt-1 text-sm text-ink-700">Leave the address empty to send it to yourself.</p>
      <div className="mt-3 flex flex-wrap items-start gap-3">
        <TextField
          label="To"
          type="email"
          autoComplete="off"
          value={to}
          onChange={(event) => setTo(event.target.value)}
          error={error ?? serverFieldError}
          fieldClassName="w-72"
        />
        <div className="pt-5">
          <Button type="submit" variant="primary" disabled={send.isPending}>
            Send a test message
          </Button>
        </div>
      </div>
      <div className="mt-3" aria-live="polite">
        {send.isSuccess ? (
          <Notice tone="success" role="status">
            Sent. Message id <code className="mono break-all">{send.data.messageId}</code>
          </Notice>
        ) : null}
        {send.isError && !serverFieldError ? (
          <Notice tone="error" role="alert">
            {send.error.message}
          </Notice>
        ) : null}
      </div>
    </form>
  );
}
