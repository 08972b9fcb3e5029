import { useId, useState, type FormEvent } from 'react';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { VIEW_TYPE_LABELS } from '@toneledger/common/schemas/images';
import { SPOT_PURPOSES, SPOT_PURPOSE_LABELS, spotInputSchema, spotUpdateSchema, type Spot } from '@toneledger/common/schemas/measurements';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { TextAreaField } from '@/components/ui/text-area-field';
import { isApiError } from '@/lib/api-client';
import { useCreateSpot, useUpdateSpot } from '@/features/measurements/api/save-spot';
import { SpotMap } from '@/features/measurements/components/spot-map';

interface Values {
  name: string;
  purpose: string;
  notes: string;
  imageId: string;
  /** Percent across and down the image, as typed. */
  x: string;
  y: string;
}

type Errors = Partial<Record<keyof Values | 'point' | 'form', string>>;

const pct = (v: number) => String(Math.round(v * 1000) / 10);

function toValues(spot: Spot | null, defaultImageId: string): Values {
  return {
    name: spot?.name ?? '',
    purpose: spot?.purpose ?? '',
    notes: spot?.notes ?? '',
    imageId: spot?.point?.imageId ?? defaultImageId,
    x: spot?.point ? pct(spot.point.x) : '',
    y: spot?.point ? pct(spot.point.y) : '',
  };
}

function toInput(values: Values) {
  const placed = values.x.trim() !== '' || values.y.trim() !== '';
  const x = Number(values.x) / 100;
  const y = Number(values.y) / 100;
  return {
    name: values.name,
    purpose: values.purpose === '' ? undefined : values.purpose,
    notes: values.notes,
    point: placed && values.imageId ? { imageId: values.imageId, x: Number.isFinite(x) ? x : NaN, y: Number.isFinite(y) ? y : NaN } : null,
  };
}

function issuesToErrors(issues: { path: string; message: string }[]): Errors {
  const errors: Errors = {};
  for (const issue of issues) {
    const head = issue.path.split('.')[0] || 'form';
    const key = (head === 'point' ? (issue.path.endsWith('.x') ? 'x' : issue.path.endsWith('.y') ? 'y' : 'point') : head) as keyof Errors;
    errors[key] ??= head === 'point' && key !== 'point' ? 'A position from 0 to 100 %' : issue.message;
  }
  return errors;
}

export interface SpotFormProps {
  printId: string;
  /** The spot being edited; null for a new spot. */
  spot: Spot | null;
  images: PrintImage[];
  /** The other spots, drawn on the image for orientation. */
  others: Spot[];
  onDone: (spot: Spot | null) => void;
}

/**
 * A new or changed measurement spot: its name, purpose, notes and where it is on one of the
 * print's images (click the image, or type the position). Checked with the server's schema; what
 * was typed stays in the form whatever the server answers.
 */
export function SpotForm({ printId, spot, images, others, onDone }: SpotFormProps) {
  const prefix = `spot${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  const usable = images.filter((i) => !i.withdrawn && i.urls.screen);
  const [values, setValues] = useState<Values>(() => toValues(spot, usable[0]?.id ?? ''));
  const [errors, setErrors] = useState<Errors>({});
  const [notice, setNotice] = useState<string | null>(null);
  const create = useCreateSpot();
  const update = useUpdateSpot();
  const mutation = spot ? update : create;
  const image = usable.find((i) => i.id === values.imageId) ?? null;

  const set = (field: keyof Values) => (event: { target: { value: string } }) => setValues((v) => ({ ...v, [field]: event.target.value }));

  function onServerError(error: unknown) {
    if (!isApiError(error)) return;
    const found = issuesToErrors(error.fieldIssues);
    if (Object.keys(found).length > 0) setErrors(found);
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    setNotice(null);
    mutation.reset();
    const input = toInput(values);
    if (!spot) {
      const checked = spotInputSchema.safeParse(input);
      if (!checked.success) return setErrors(issuesToErrors(checked.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))));
      setErrors({});
      create.mutate({ printId, input: checked.data }, { onSuccess: onDone, onError: onServerError });
      return;
    }
    const before = toInput(toValues(spot, values.imageId));
    const changed = Object.fromEntries(
      (['name', 'purpose', 'notes', 'point'] as const)
        .filter((k) => JSON.stringify(input[k] ?? null) !== JSON.stringify(before[k] ?? null))
        .map((k) => [k, input[k]]),
    );
    const checked = spotUpdateSchema.safeParse({ ...changed, version: spot.version });
    if (!checked.success) return setErrors(issuesToErrors(checked.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))));
    setErrors({});
    if (Object.keys(changed).length === 0) return setNotice('Nothing has changed, so there is nothing to save.');
    update.mutate({ id: spot.id, update: checked.data }, { onSuccess: onDone, onError: onServerError });
  }

  const fieldErrors = Object.keys(errors).length > 0;
  const otherError = mutation.isError && !(isApiError(mutation.error) && mutation.error.fieldIssues.length > 0);
  const marks = [
    ...others.filter((o) => o.id !== spot?.id && o.point && o.point.imageId === values.imageId).map((o) => ({ id: o.id, name: o.name, x: o.point!.x, y: o.point!.y })),
    ...(values.x.trim() !== '' && values.y.trim() !== '' && Number.isFinite(Number(values.x)) && Number.isFinite(Number(values.y))
      ? [{ id: 'this', name: values.name.trim() || 'New spot', x: Number(values.x) / 100, y: Number(values.y) / 100, active: true }]
      : []),
  ];

  return (
    <form onSubmit={submit} noValidate aria-label={spot ? `Edit spot ${spot.name}` : 'New spot'} className="flex flex-col gap-4">
      {notice ? (
        <Notice role="status">
          <p>{notice}</p>
        </Notice>
      ) : null}
      {fieldErrors ? <Notice tone="error" role="alert" title="Not saved: check the fields marked below." /> : null}
      {errors.form ? <p className="text-sm text-danger-700">{errors.form}</p> : null}
      {otherError ? <ErrorNotice error={mutation.error} title="Not saved." /> : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField id={`${prefix}-name`} label="Spot name" value={values.name} onChange={set('name')} error={errors.name} maxLength={100} required />
        <SelectField id={`${prefix}-purpose`} label="Purpose" value={values.purpose} onChange={set('purpose')} error={errors.purpose} required>
          <option value="">Choose…</option>
          {SPOT_PURPOSES.map((p) => (
            <option key={p} value={p}>
              {SPOT_PURPOSE_LABELS[p]}
            </option>
          ))}
        </SelectField>
      </div>
      <fieldset className="flex flex-col gap-3 rounded border border-paper-300 p-3">
        <legend className="px-1 text-xs font-semibold tracking-wide text-ink-700 uppercase">Place on the print</legend>
        {usable.length === 0 ? (
          <p className="text-sm text-ink-700">The print has no images with a display copy yet, so the spot cannot be placed. It can be placed later.</p>
        ) : (
          <>
            {usable.length > 1 ? (
              <SelectField label="Image" value={values.imageId} onChange={set('imageId')}>
                {usable.map((i) => (
                  <option key={i.id} value={i.id}>
                    {VIEW_TYPE_LABELS[i.viewType]}
                    {i.capturedOn ? `, ${i.capturedOn}` : ''}
                  </option>
                ))}
              </SelectField>
            ) : null}
            {image ? (
              <SpotMap
                image={image}
                marks={marks}
                onPlace={({ x, y }) => setValues((v) => ({ ...v, x: pct(x), y: pct(y) }))}
              />
            ) : null}
            <div className="flex flex-wrap items-end gap-3">
              <TextField label="Across (%)" inputMode="decimal" value={values.x} onChange={set('x')} error={errors.x ?? errors.point} fieldClassName="w-28" />
              <TextField label="Down (%)" inputMode="decimal" value={values.y} onChange={set('y')} error={errors.y} fieldClassName="w-28" />
              {values.x !== '' || values.y !== '' ? (
                <Button size="sm" variant="quiet" onClick={() => setValues((v) => ({ ...v, x: '', y: '' }))}>
                  Clear position
                </Button>
              ) : null}
            </div>
          </>
        )}
      </fieldset>
      <TextAreaField label="Notes" value={values.notes} onChange={set('notes')} error={errors.notes} maxLength={2000} />
      <div className="flex gap-2">
        <Button type="submit" variant="primary" disabled={mutation.isPending}>
          {mutation.isPending ? 'Saving…' : 'Save spot'}
        </Button>
        <Button onClick={() => onDone(null)}>Cancel</Button>
      </div>
    </form>
  );
}
