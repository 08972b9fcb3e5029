import { useState } from 'react';
import { approvalInputSchema, type ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { TextAreaInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useDecideApproval } from '@/features/exhibitions/api/save-exhibition';

type ExhibitionObject = ExhibitionDetail['objects'][number];

function RefuseForm({ exhibitionId, object, onDone }: { exhibitionId: string; object: ExhibitionObject; onDone: () => void }) {
  const decide = useDecideApproval(exhibitionId, object.printId);
  const form = useSchemaForm({ schema: approvalInputSchema, defaultValues: { decision: 'refused', reason: '' } });
  return (
    <SchemaForm
      form={form}
      aria-label={`Refuse ${object.accessionNumber} for display`}
      failureTitle="The decision was not saved."
      className="gap-2"
      labelFor={(path, label) => (path === 'reason' ? 'Reason' : label)}
      onValid={(body) => decide.mutate(body, { onSuccess: onDone, onError: form.serverError })}
    >
      <TextAreaInput name="reason" label="Reason" rows={2} hint="Why the print may not be shown (kept with the decision)." />
      <SubmitCancel label="Refuse for display" variant="danger" size="sm" busy={decide.isPending} busyLabel="Saving…" onCancel={onDone} />
    </SchemaForm>
  );
}

/** A conservator's decision on one print: approve it for display, or refuse it with a reason. */
export function ApprovalControls({ exhibitionId, object }: { exhibitionId: string; object: ExhibitionObject }) {
  const [refusing, setRefusing] = useState(false);
  const approve = useDecideApproval(exhibitionId, object.printId);
  if (refusing) return <RefuseForm exhibitionId={exhibitionId} object={object} onDone={() => setRefusing(false)} />;
  return (
    <div className="flex flex-col gap-1 print:hidden">
      <div className="flex flex-wrap gap-2">
        {object.approval !== 'approved' ? (
          <Button size="sm" variant="primary" disabled={approve.isPending} onClick={() => approve.mutate({ decision: 'approved' })}>
            Approve
          </Button>
        ) : null}
        {object.approval !== 'refused' ? (
          <Button size="sm" onClick={() => setRefusing(true)}>
            Refuse…
          </Button>
        ) : null}
      </div>
      {approve.isError ? <ErrorNotice error={approve.error} title="The approval was not saved." /> : null}
    </div>
  );
}
