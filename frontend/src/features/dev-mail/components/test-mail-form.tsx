import { testMailSchema } from '@toneledger/common/schemas/system';
import { TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useSendTestMail } from '@/features/dev-mail/api/send-test-mail';

/** Sends one message through the app's own mail transport, to check that mail goes out. */
export function TestMailForm() {
  const send = useSendTestMail();
  const form = useSchemaForm({
    schema: testMailSchema,
    defaultValues: { to: '' },
    // The body: no address means "to me".
    toBody: (values: { to: string }) => (values.to.trim() ? { to: values.to.trim() } : {}),
  });

  return (
    <SchemaForm
      form={form}
      onValid={(body) => send.mutate(body, { onError: form.serverError })}
      failureTitle="The message was not sent."
      aria-labelledby="test-mail-heading"
      className="rounded border border-paper-300 bg-paper-100 p-4"
    >
      <h2 id="test-mail-heading" className="text-lg">
        Send a test message
      </h2>
      <p className="mt-1 text-sm text-ink-700">Leave the address empty to send it to yourself.</p>
      <div className="mt-3 flex flex-wrap items-start gap-3">
        <TextInput name="to" label="To" type="email" autoComplete="off" fieldClassName="w-72" />
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
      </div>
    </SchemaForm>
  );
}
