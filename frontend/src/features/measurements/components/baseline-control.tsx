import { useId, useState } from 'react';
import { baselineChoiceSchema, type MeasurementSession, type Spot } from '@toneledger/common/schemas/measurements';
import { Button } from '@/components/ui/button';
import { SelectInput, TextAreaInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useChooseBaseline } from '@/features/measurements/api/save-spot';
import { formatDay } from '@/features/measurements/utils/format';

const AUTOMATIC = '';

export interface BaselineControlProps {
  spot: Spot;
  /** Sessions with readings at this spot, to choose from. */
  sessions: MeasurementSession[];
}

/**
 * Lets a conservator name the session every later reading at this spot is compared with, and
 * say why. The reason is required (the server refuses a choice without one, and so does this form).
 */
export function BaselineControl({ spot, sessions }: BaselineControlProps) {
  const [open, setOpen] = useState(false);
  const [saved, setSaved] = useState(false);
  const choose = useChooseBaseline();
  const headingId = useId();
  const form = useSchemaForm({
    schema: baselineChoiceSchema,
    defaultValues: { sessionId: spot.baseline?.sessionId ?? AUTOMATIC, reason: '' },
    // The body: the automatic choice is no session; on the spot's version.
    toBody: (values: { sessionId: string; reason: string }) => ({ ...values, sessionId: values.sessionId === AUTOMATIC ? null : values.sessionId, version: spot.version }),
  });

  function close() {
    setOpen(false);
    form.reset();
    choose.reset();
  }

  if (!open) {
    return (
      <div className="flex flex-wrap items-center gap-3 print:hidden">
        <Button size="sm" onClick={() => setOpen(true)}>
          Choose baseline
        </Button>
        {saved ? (
          <p role="status" className="text-sm text-ok-700">
            Baseline saved; the figures are being worked out again.
          </p>
        ) : null}
      </div>
    );
  }

  return (
    <SchemaForm
      form={form}
      onValid={(body) => {
        setSaved(false);
        choose.mutate(
          { id: spot.id, choice: body },
          {
            onSuccess: () => {
              close();
              setSaved(true);
            },
            onError: form.serverError,
          },
        );
      }}
      failureTitle="The baseline was not changed."
      aria-labelledby={headingId}
      className="mt-2 max-w-xl gap-3 rounded border border-paper-300 bg-paper-50 p-3 print:hidden"
    >
      <h3 id={headingId} className="font-sans text-sm font-semibold">
        Choose the baseline for {spot.name}
      </h3>
      <SelectInput
        name="sessionId"
        label="Baseline session"
        empty="The first comparable session (automatic)"
        options={sessions.map((s) => ({ value: s.id, label: `${formatDay(s.measuredOn)} · ${s.instrument} · ${s.illuminant}/${s.observer}° · ${s.geometry}` }))}
      />
      <TextAreaInput name="reason" label="Reason" hint="Why this session is the one to compare with: for example, the first reading after treatment." required />
      <SubmitCancel label="Save baseline" busy={choose.isPending} busyLabel="Saving…" onCancel={close} />
    </SchemaForm>
  );
}
