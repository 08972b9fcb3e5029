import { useId, useState, type FormEvent } from 'react';
import { addendumInputSchema } from '@toneledger/common/schemas/condition';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { TextAreaField } from '@/components/ui/text-area-field';
import { isApiError } from '@/lib/api-client';
import { useAddAddendum } from '@/features/condition/api/save-report';
import { serverIssuesToErrors } from '@/features/condition/utils/report-form';

/** A dated, attributed addition or correction to a signed report. The report itself is not changed. */
export function AddendumForm({ reportId }: { reportId: string }) {
  const headingId = useId();
  const [text, setText] = useState('');
  const [error, setError] = useState<string | undefined>();
  const [done, setDone] = useState(false);
  const add = useAddAddendum();

  function submit(event: FormEvent) {
    event.preventDefault();
    setDone(false);
    const checked = addendumInputSchema.safeParse({ text });
    if (!checked.success) {
      setError(checked.error.issues[0]?.message);
      return;
    }
    setError(undefined);
    add.mutate(
      { id: reportId, text: checked.data.text },
      {
        onSuccess: () => {
          setText('');
          setDone(true);
        },
        onError: (e) => {
          if (isApiError(e)) setError(serverIssuesToErrors(e.details).text);
        },
      },
    );
  }

  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4 print:hidden">
      <h2 id={headingId} className="text-lg">
        Add an addendum
      </h2>
      <p className="mt-1 text-sm text-ink-700">The signed report stays as it is. An addendum is dated and carries your name.</p>
      <form onSubmit={submit} noValidate className="mt-3 flex flex-col gap-3">
        <TextAreaField label="Addendum" value={text} onChange={(e) => setText(e.target.value)} error={error} rows={3} maxLength={10000} />
        {add.isError && !error ? <ErrorNotice error={add.error} title="The addendum was not added." /> : null}
        {done ? (
          <Notice tone="success" role="status">
            <p>Addendum added.</p>
          </Notice>
        ) : null}
        <div>
          <Button type="submit" variant="primary" disabled={add.isPending}>
            Add addendum
          </Button>
        </div>
      </form>
    </section>
  );
}
