import { remindersInputSchema, type Reminders } from '@toneledger/common/schemas/inspections';
import { CheckboxInput, SelectInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useSaveReminders } from '@/features/reminders/api/reminders';

export const WEEKDAY_NAMES = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const;
const WEEKDAY_OPTIONS = WEEKDAY_NAMES.map((label, i) => ({ value: String(i + 1), label }));

interface Values { digestEnabled: boolean; digestWeekday: string }

/** The weekly e-mail of prints overdue or due soon: on or off, and its day. */
export function DigestForm({ reminders, canPlan }: { reminders: Reminders; canPlan: boolean }) {
  const save = useSaveReminders();
  const form = useSchemaForm({
    schema: remindersInputSchema,
    defaultValues: { digestEnabled: reminders.digestEnabled, digestWeekday: String(reminders.digestWeekday) } as Values,
    toBody: (v: Values) => ({ digestEnabled: v.digestEnabled, digestWeekday: Number(v.digestWeekday) }),
  });
  const last = reminders.lastDigest;
  return (
    <SchemaForm
      form={form}
      onValid={(body) => save.mutate(body, { onError: form.serverError })}
      failureTitle="Your choice was not saved."
      aria-labelledby="digest-heading"
      className="gap-3 rounded border border-paper-300 bg-paper-100 p-4"
    >
      <h2 id="digest-heading" className="text-lg">Weekly e-mail</h2>
      <p className="text-sm text-ink-700">
        Once a week, early in the day (UTC), a list of the prints overdue for inspection and those due in the next 30 days, by place, with
        links to each print and to the work list. A week with nothing due sends nothing.
      </p>
      {canPlan ? null : (
        <Notice tone="info">
          <p>The weekly e-mail goes to the people who plan inspections. Your choice is kept in case your role changes.</p>
        </Notice>
      )}
      <CheckboxInput name="digestEnabled" label="Send me the weekly e-mail" />
      <SelectInput name="digestWeekday" label="Day" options={WEEKDAY_OPTIONS} fieldClassName="w-48" />
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" disabled={save.isPending}>Save</Button>
        <span aria-live="polite" className="text-sm text-ink-700">{save.isSuccess ? 'Saved.' : ''}</span>
      </div>
      {last ? (
        <p className="text-sm text-ink-700">
          Last week's message ({last.week}): {last.status === 'sent' ? 'sent' : last.status === 'empty' ? 'nothing was due, none sent' : last.status === 'failed' ? 'not sent yet, being tried again' : 'on its way'}.
        </p>
      ) : null}
    </SchemaForm>
  );
}
