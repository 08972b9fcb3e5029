import { useId, useState } from 'react';
import { addendumInputSchema } from '@toneledger/common/schemas/condition';
import { TextAreaInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useAddAddendum } from '@/features/condition/api/save-report';

/** A dated, attributed addition or correction to a signed report. The report itself is not changed. */
export function AddendumForm({ reportId }: { reportId: string }) {
  const headingId = useId();
  const [done, setDone] = useState(false);
  const add = useAddAddendum();
  const form = useSchemaForm({ schema: addendumInputSchema, defaultValues: { text: '' } });

  function onValid(body: { text: string }) {
    setDone(false);
    add.mutate(
      { id: reportId, text: body.text },
      {
        onSuccess: () => {
          form.reset({ text: '' });
          setDone(true);
        },
        onError: form.serverError,
      },
    );
  }

  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4 print:hidden">
      <h2 id={headingId} className="text-lg">
        Add an addendum
      </h2>
      <p className="mt-1 text-sm text-ink-700">The signed report stays as it is. An addendum is dated and carries your name.</p>
      <SchemaForm form={form} onValid={onValid} failureTitle="The addendum was not added." className="mt-3 gap-3">
        <TextAreaInput name="text" label="Addendum" rows={3} />
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
      </SchemaForm>
    </section>
  );
}
