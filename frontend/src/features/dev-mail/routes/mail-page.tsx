import { useSearchParams } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useMail } from '@/features/dev-mail/api/get-mail';
import { MailList } from '@/features/dev-mail/components/mail-list';
import { MailReader } from '@/features/dev-mail/components/mail-reader';
import { TestMailForm } from '@/features/dev-mail/components/test-mail-form';

export function MailPage() {
  useDocumentTitle('Outgoing mail');
  const mail = useMail();
  const [params, setParams] = useSearchParams();
  const selectedId = params.get('message');
  const messages = mail.data ?? [];
  const selected = messages.find((message) => message.id === selectedId) ?? null;

  return (
    <section>
      <PageHeader
        title="Outgoing mail"
        description="Messages the app has sent on this machine, caught by the local mail sink instead of being delivered. This page exists only on development and test machines."
        actions={
          <Button size="sm" onClick={() => void mail.refetch()} disabled={mail.isFetching}>
            Refresh
          </Button>
        }
      />
      <div className="mb-5 max-w-3xl">
        <TestMailForm />
      </div>
      {mail.isError ? <ErrorNotice error={mail.error} title="The caught messages could not be loaded." /> : null}
      {mail.isPending ? (
        <Loading label="Loading messages…" />
      ) : (
        <div className="grid gap-4 lg:grid-cols-[minmax(16rem,22rem)_1fr]">
          <MailList messages={messages} selectedId={selectedId} onSelect={(id) => setParams({ message: id })} />
          <div>
            {selected ? (
              <MailReader message={selected} />
            ) : (
              <p className="rounded border border-dashed border-paper-400 px-4 py-8 text-center text-sm text-ink-700">
                {selectedId && messages.length > 0 ? 'That message is no longer in the sink.' : 'Select a message to read it.'}
              </p>
            )}
          </div>
        </div>
      )}
    </section>
  );
}
