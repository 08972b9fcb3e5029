import { useWatch } from 'react-hook-form';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { VIEW_TYPE_LABELS } from '@toneledger/common/schemas/images';
import { SPOT_PURPOSES, SPOT_PURPOSE_LABELS, spotInputSchema, spotSchema, type Spot } from '@toneledger/common/schemas/measurements';
import { NumberInput, SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { Button } from '@/components/ui/button';
import type { FieldErrors } from '@/lib/forms/field-errors';
import { changesOnly, fieldList } from '@/lib/forms/stale-edit';
import { useRecordEdit } from '@/lib/forms/use-record-edit';
import { NOTHING_TO_SAVE, useSchemaForm, type SchemaFormApi } from '@/lib/forms/use-schema-form';
import { useCreateSpot, useUpdateSpot } from '@/features/measurements/api/save-spot';
import { SpotMap } from '@/features/measurements/components/spot-map';

interface SpotValues {
  name: string;
  purpose: string;
  imageId: string;
  /** Percent across and down the image, as typed. */
  x: string;
  y: string;
  notes: string;
}

const LABELS: Record<keyof SpotValues, string> = { name: 'Spot name', purpose: 'Purpose', imageId: 'Image', x: 'Across (%)', y: 'Down (%)', notes: 'Notes' };
const PLACE = ['imageId', 'x', 'y'];

const pct = (v: number) => String(Math.round(v * 1000) / 10);
const placed = (values: SpotValues) => values.x.trim() !== '' || values.y.trim() !== '';

function toValues(spot: Spot | null, defaultImageId: string): SpotValues {
  return {
    name: spot?.name ?? '',
    purpose: spot?.purpose ?? '',
    imageId: spot?.point?.imageId ?? defaultImageId,
    x: spot?.point ? pct(spot.point.x) : '',
    y: spot?.point ? pct(spot.point.y) : '',
    notes: spot?.notes ?? '',
  };
}

/** The body: the position as a fraction of the image (the form shows percent), none when no position is typed. */
function toBody(values: SpotValues) {
  return {
    name: values.name,
    purpose: values.purpose === '' ? undefined : values.purpose,
    notes: values.notes,
    point: placed(values) && values.imageId ? { imageId: values.imageId, x: Number(values.x) / 100, y: Number(values.y) / 100 } : null,
  };
}

/** A position is typed in percent, so it is checked in percent. */
function check(values: SpotValues): FieldErrors {
  if (!placed(values)) return {};
  const errors: FieldErrors = {};
  for (const axis of ['x', 'y'] as const) {
    const n = Number(values[axis].trim());
    if (values[axis].trim() === '' || !Number.isFinite(n) || n < 0 || n > 100) errors[axis] = 'A position from 0 to 100 %';
  }
  return errors;
}

/** `point.x` is shown at Across, `point.y` at Down, the point as a whole at Across. */
const fieldFor = (path: string) => (path === 'point.y' ? 'y' : path.startsWith('point') ? 'x' : path);

function Placement({ form, usable, others, spot }: { form: SchemaFormApi<typeof spotInputSchema, SpotValues>; usable: PrintImage[]; others: Spot[]; spot: Spot | null }) {
  const [imageId, x, y, name] = useWatch({ control: form.control, name: ['imageId', 'x', 'y', 'name'] });
  const image = usable.find((i) => i.id === imageId) ?? null;
  const marks = [
    ...others.filter((o) => o.id !== spot?.id && o.point && o.point.imageId === imageId).map((o) => ({ id: o.id, name: o.name, x: o.point!.x, y: o.point!.y })),
    ...(x.trim() !== '' && y.trim() !== '' && Number.isFinite(Number(x)) && Number.isFinite(Number(y))
      ? [{ id: 'this', name: name.trim() || 'New spot', x: Number(x) / 100, y: Number(y) / 100, active: true }]
      : []),
  ];
  if (usable.length === 0) return <p className="text-sm text-ink-700">The print has no images with a display copy yet, so the spot cannot be placed. It can be placed later.</p>;
  return (
    <>
      {usable.length > 1 ? (
        <SelectInput
          name="imageId"
          label={LABELS.imageId}
          options={usable.map((i) => ({ value: i.id, label: `${VIEW_TYPE_LABELS[i.viewType]}${i.capturedOn ? `, ${i.capturedOn}` : ''}` }))}
        />
      ) : null}
      {image ? (
        <SpotMap
          image={image}
          marks={marks}
          onPlace={(p) => {
            form.setValue('x', pct(p.x), { shouldValidate: form.formState.isSubmitted });
            form.setValue('y', pct(p.y), { shouldValidate: form.formState.isSubmitted });
          }}
        />
      ) : null}
      <div className="flex flex-wrap items-end gap-3">
        <NumberInput name="x" label={LABELS.x} fieldClassName="w-28" />
        <NumberInput name="y" label={LABELS.y} fieldClassName="w-28" />
        {x !== '' || y !== '' ? (
          <Button
            size="sm"
            variant="quiet"
            onClick={() => {
              form.setValue('x', '');
              form.setValue('y', '');
            }}
          >
            Clear position
          </Button>
        ) : null}
      </div>
    </>
  );
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
  const usable = images.filter((i) => !i.withdrawn && i.urls.screen);
  const defaultImageId = usable[0]?.id ?? '';
  const create = useCreateSpot();
  const update = useUpdateSpot();
  const mutation = spot ? update : create;
  const form = useSchemaForm({ schema: spotInputSchema, defaultValues: toValues(spot, defaultImageId), toBody, check, fieldFor });
  const edit = useRecordEdit(form, {
    record: spot,
    recordSchema: spotSchema,
    toValues: (record: Spot) => toValues(record, defaultImageId),
    fields: fieldList(LABELS),
    describe: (key, values) => (key === 'purpose' ? (SPOT_PURPOSE_LABELS[values.purpose as keyof typeof SPOT_PURPOSE_LABELS] ?? values.purpose) : values[key as keyof SpotValues]),
  });

  function onValid(body: ReturnType<typeof spotInputSchema.parse>, values: SpotValues) {
    mutation.reset();
    if (!edit.base) return create.mutate({ printId, input: body }, { onSuccess: onDone, onError: form.serverError });
    const changed = [...new Set(edit.changed(values).map((key) => (PLACE.includes(key) ? 'point' : key)))];
    if (changed.length === 0) return form.setNotice(NOTHING_TO_SAVE);
    update.mutate(
      { id: edit.base.id, update: changesOnly(body, changed, edit.base.version) as never },
      {
        onSuccess: onDone,
        onError: edit.failed,
      },
    );
  }

  return (
    <SchemaForm form={form} edit={edit} subject="this spot" onValid={onValid} aria-label={spot ? `Edit spot ${spot.name}` : 'New spot'} className="gap-4">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextInput name="name" label={LABELS.name} required />
        <SelectInput name="purpose" label={LABELS.purpose} empty="Choose…" options={SPOT_PURPOSES.map((p) => ({ value: p, label: SPOT_PURPOSE_LABELS[p] }))} required />
      </div>
      <fieldset className="flex flex-col gap-3 rounded border border-paper-300 p-3">
        <legend className="px-1 text-xs font-semibold tracking-wide text-ink-700 uppercase">Place on the print</legend>
        <Placement form={form} usable={usable} others={others} spot={spot} />
      </fieldset>
      <TextAreaInput name="notes" label={LABELS.notes} />
      <SubmitCancel label="Save spot" busy={mutation.isPending} busyLabel="Saving…" disabled={edit.conflict !== null} onCancel={() => onDone(null)} />
    </SchemaForm>
  );
}
