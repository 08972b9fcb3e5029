import { useEffect, useState, type FormEvent } from 'react';
import { measurementSettingsSchema } from '@toneledger/common/schemas/measurements';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { ErrorNotice } from '@/components/ui/notice';
import { isApiError } from '@/lib/api-client';
import { useMeasurementSettings, useUpdateMeasurementSettings } from '@/features/measurements/api/measurement-settings';
import { formatThreshold } from '@/features/measurements/utils/format';

/** The noticeable-change threshold; administrators may change it for the collection. */
export function ThresholdSetting({ mayChange }: { mayChange: boolean }) {
  const settings = useMeasurementSettings();
  const save = useUpdateMeasurementSettings();
  const [text, setText] = useState('');
  const [error, setError] = useState<string | undefined>();
  const [editing, setEditing] = useState(false);
  const current = settings.data?.noticeableDeltaE;
  useEffect(() => {
    if (current !== undefined && !editing) setText(String(current));
  }, [current, editing]);

  if (current === undefined) return null;

  function submit(event: FormEvent) {
    event.preventDefault();
    save.reset();
    const checked = measurementSettingsSchema.safeParse({ noticeableDeltaE: text.trim() === '' ? NaN : Number(text) });
    if (!checked.success) return setError('A ΔE00 from 0.1 to 20');
    setError(undefined);
    save.mutate(checked.data, {
      onSuccess: () => setEditing(false),
      onError: (e) => {
        if (isApiError(e)) setError(e.fieldIssues[0]?.message);
      },
    });
  }

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
        <form onSubmit={submit} noValidate className="flex flex-wrap items-end gap-2">
          <TextField label="Noticeable change (ΔE00)" inputMode="decimal" value={text} onChange={(e) => setText(e.target.value)} error={error} fieldClassName="w-48" />
          <Button type="submit" variant="primary" disabled={save.isPending}>
            Save threshold
          </Button>
          <Button onClick={() => setEditing(false)}>Cancel</Button>
        </form>
      )}
      {save.isError && !error ? <ErrorNotice error={save.error} title="The threshold was not changed." /> : null}
    </div>
  );
}
