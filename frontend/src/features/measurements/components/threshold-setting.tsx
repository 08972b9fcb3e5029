import { useState } from 'react';
import { measurementSettingsSchema } from '@toneledger/common/schemas/measurements';
import { NumberInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useMeasurementSettings } from '@/lib/settings-api';
import { useUpdateMeasurementSettings } from '@/features/measurements/api/measurement-settings';
import { formatThreshold } from '@/features/measurements/utils/format';

function ThresholdForm({ current, onDone }: { current: number; onDone: () => void }) {
  const save = useUpdateMeasurementSettings();
  const form = useSchemaForm({
    schema: measurementSettingsSchema,
    defaultValues: { noticeableDeltaE: String(current) },
    // The body: the figure as typed, read as a number (an empty box is no figure).
    toBody: (values: { noticeableDeltaE: string }) => ({ noticeableDeltaE: values.noticeableDeltaE.trim() === '' ? undefined : Number(values.noticeableDeltaE.trim()) }),
  });
  return (
    <SchemaForm
      form={form}
      onValid={(body) => save.mutate(body, { onSuccess: onDone, onError: form.serverError })}
      failureTitle="The threshold was not changed."
      className="gap-2"
    >
      <div className="flex flex-wrap items-end gap-2">
        <NumberInput name="noticeableDeltaE" label="Noticeable change (ΔE00)" fieldClassName="w-48" />
        <Button type="submit" variant="primary" disabled={save.isPending}>
          Save threshold
        </Button>
        <Button onClick={onDone}>Cancel</Button>
      </div>
    </SchemaForm>
  );
}

/** The noticeable-change threshold; administrators may change it for the collection. */
export function ThresholdSetting({ mayChange }: { mayChange: boolean }) {
  const settings = useMeasurementSettings();
  const [editing, setEditing] = useState(false);
  const current = settings.data?.noticeableDeltaE;
  if (current === undefined) return null;
  return (
    <div className="mb-4 text-sm text-ink-800">
      {!editing ? (
        <p>
          A change counts as noticeable from <strong className="num">ΔE00 {formatThreshold(current)}</strong>; projections use this figure.{' '}
          {mayChange ? (
            <Button size="sm" variant="quiet" onClick={() => setEditing(true)}>
              Change threshold
            </Button>
          ) : null}
        </p>
      ) : (
        <ThresholdForm current={current} onDone={() => setEditing(false)} />
      )}
    </div>
  );
}
