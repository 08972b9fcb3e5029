import { printScheduleSchema, scheduleOverrideInputSchema, type PrintSchedule } from '@toneledger/common/schemas/inspections';
import { DateInput, TextAreaInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { useRecordEdit } from '@/lib/forms/use-record-edit';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { formatDay } from '@/lib/format';
import { useOverrideSchedule } from '@/features/inspections/api/print-schedule';

/** What the controls hold: the conservator's date or '' for "the computed date"; the reason as typed. */
export interface OverrideFormValues {
  dueOn: string;
  reason: string;
  version: number;
}

export function scheduleToValues(s: PrintSchedule): OverrideFormValues {
  return { dueOn: s.override?.dueOn ?? '', reason: s.override?.reason ?? '', version: s.version };
}

/** An empty date is sent as `dueOn: null` (back to the computed date); the schema reads the rest (an empty reason is null). */
export function overrideValuesToBody(values: OverrideFormValues) {
  return { dueOn: values.dueOn === '' ? null : values.dueOn, reason: values.reason, version: values.version };
}

const FIELDS = [
  { key: 'dueOn', label: 'Inspect by' },
  { key: 'reason', label: 'Reason' },
] as const;

/**
 * A conservator's own next-inspection date for the print, with the reason, or (date left empty) the
 * computed date again. Someone else's change in between is shown beside what was typed.
 */
export function PrintScheduleOverrideForm({ schedule, onDone }: { schedule: PrintSchedule; onDone: (saved: PrintSchedule | null) => void }) {
  const save = useOverrideSchedule(schedule.printId);
  const form = useSchemaForm({ schema: scheduleOverrideInputSchema, defaultValues: scheduleToValues(schedule), toBody: overrideValuesToBody });
  const edit = useRecordEdit(form, {
    record: schedule,
    recordSchema: printScheduleSchema,
    toValues: scheduleToValues,
    fields: FIELDS,
    comparable: (v) => ({ dueOn: v.dueOn, reason: v.reason.trim() }),
    describe: (key, v) => (key === 'dueOn' ? (v.dueOn ? formatDay(v.dueOn) : `The computed date (${formatDay(schedule.computedDueOn)})`) : v.reason),
  });

  return (
    <SchemaForm
      form={form}
      edit={edit}
      subject="this print's next inspection"
      className="gap-3 rounded border border-paper-300 bg-paper-100 p-3"
      aria-label="Set the date"
      onValid={(body) =>
        save.mutate(body, {
          onSuccess: (saved) => {
            edit.saved(saved);
            onDone(saved);
          },
          onError: edit.failed,
        })
      }
    >
      <DateInput
        name="dueOn"
        label="Inspect by"
        hint={`Leave empty to use the computed date, ${formatDay(schedule.computedDueOn)}.`}
        fieldClassName="max-w-xs"
      />
      <TextAreaInput name="reason" label="Reason" hint="Required with a date of your own: what you saw or know that the model does not." rows={3} />
      <SubmitCancel label="Save date" busy={save.isPending} busyLabel="Saving…" onCancel={() => onDone(null)} size="sm" />
    </SchemaForm>
  );
}
