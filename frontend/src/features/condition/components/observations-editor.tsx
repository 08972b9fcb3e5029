import { useState } from 'react';
import { useFieldArray, useFormContext, useWatch, get, useFormState } from 'react-hook-form';
import { EXTENTS, SEVERITIES, ZONE_AREAS, ZONE_SIDES, type ConditionTerm } from '@toneledger/common/schemas/condition';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { NumberInput, SelectInput, TextAreaInput } from '@/components/form/fields';
import { Button } from '@/components/ui/button';
import { flattenFormErrors } from '@/lib/forms/field-errors';
import { RegionDrawer, imageLabel } from '@/features/condition/components/region-drawer';
import { AREA_LABELS, EXTENT_LABELS, SEVERITY_LABELS, SIDE_LABELS } from '@/features/condition/utils/labels';
import { describeRegion } from '@/features/condition/utils/region';
import { newObservation, type ReportFormValues } from '@/features/condition/utils/report-form';

export interface ObservationsEditorProps {
  terms: ConditionTerm[];
  /** Images a region may be drawn on. */
  images: PrintImage[];
}

const choices = <C extends string>(codes: readonly C[], labels: Record<C, string>) => codes.map((c) => ({ value: c, label: labels[c] }));

function suggestImage(images: PrintImage[], side: string): string | undefined {
  return images.find((i) => i.viewType === side)?.id ?? images[0]?.id;
}

function Observation({ index, count, terms, images, drawing, onDraw, onMove, onRemove }: {
  index: number;
  count: number;
  terms: ConditionTerm[];
  images: PrintImage[];
  drawing: boolean;
  onDraw: (open: boolean) => void;
  onMove: (by: -1 | 1) => void;
  onRemove: () => void;
}) {
  const { control, setValue } = useFormContext<ReportFormValues>();
  const o = useWatch({ control, name: `observations.${index}` });
  const { errors } = useFormState({ control, name: `observations.${index}.region` });
  const regionError = Object.values(flattenFormErrors(get(errors, `observations.${index}.region`)))[0];
  const n = index + 1;
  const name = (field: string) => `observations.${index}.${field}`;
  const current = terms.find((t) => t.code === o.termCode);
  const regionImage = o.region ? images.find((i) => i.id === o.region!.imageId) : undefined;
  const setRegion = (region: ReportFormValues['observations'][number]['region']) => setValue(`observations.${index}.region`, region, { shouldDirty: true });
  return (
    <fieldset className="rounded border border-paper-300 bg-white p-3" aria-label={`Observation ${n}`}>
      <legend className="px-1 text-sm font-semibold">Observation {n}</legend>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        <SelectInput name={name('termCode')} label="Observed" empty="Choose…" options={terms.filter((t) => t.active).map((t) => ({ value: t.code, label: t.label }))}>
          {current && !current.active ? <option value={current.code}>{current.label} (no longer in use)</option> : null}
        </SelectInput>
        <SelectInput name={name('side')} label="Side" options={choices(ZONE_SIDES, SIDE_LABELS)} />
        <SelectInput name={name('area')} label="Area" options={choices(ZONE_AREAS, AREA_LABELS)} />
        <SelectInput name={name('extent')} label="Extent" options={choices(EXTENTS, EXTENT_LABELS)} />
        {o.extent === 'percentage' ? <NumberInput name={name('extentPercent')} label="Percentage affected" /> : null}
        <SelectInput name={name('severity')} label="Severity" options={choices(SEVERITIES, SEVERITY_LABELS)} />
        <TextAreaInput name={name('notes')} label="Notes" fieldClassName="sm:col-span-2 lg:col-span-3" rows={2} />
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-2 text-sm">
        <span data-field={name('region')} data-label={`Observation ${n} · Region`} tabIndex={-1} className="text-ink-800 outline-none">
          Region: {o.region ? `${describeRegion(o.region)} on ${regionImage ? imageLabel(regionImage) : 'an image no longer shown'}` : 'none drawn'}
        </span>
        <Button size="sm" onClick={() => onDraw(!drawing)} aria-expanded={drawing}>
          Draw region
        </Button>
        {o.region ? (
          <Button size="sm" variant="quiet" onClick={() => setRegion(null)}>
            Remove region
          </Button>
        ) : null}
        <span className="ml-auto flex gap-1">
          <Button size="sm" variant="quiet" disabled={index === 0} onClick={() => onMove(-1)} aria-label={`Move observation ${n} up`}>
            ↑
          </Button>
          <Button size="sm" variant="quiet" disabled={index === count - 1} onClick={() => onMove(1)} aria-label={`Move observation ${n} down`}>
            ↓
          </Button>
          <Button size="sm" variant="quiet" onClick={onRemove} aria-label={`Remove observation ${n}`}>
            Remove
          </Button>
        </span>
      </div>
      {regionError ? <p className="mt-1 text-xs font-medium text-danger-700">{regionError}</p> : null}
      {drawing ? (
        <div className="mt-3">
          <RegionDrawer
            images={images}
            initial={o.region}
            suggestedImageId={suggestImage(images, o.side)}
            onCancel={() => onDraw(false)}
            onSave={(region) => {
              setRegion(region);
              onDraw(false);
            }}
          />
        </div>
      ) : null}
    </fieldset>
  );
}

/** The structured observations of a report: add, remove, reorder, and draw each one's region. */
export function ObservationsEditor({ terms, images }: ObservationsEditorProps) {
  const { control } = useFormContext<ReportFormValues>();
  const { fields, append, remove, move } = useFieldArray({ control, name: 'observations' });
  const [drawing, setDrawing] = useState<string | null>(null);
  return (
    <div className="flex flex-col gap-3">
      {fields.length === 0 ? <p className="text-sm text-ink-700">No observations yet.</p> : null}
      <ol className="flex flex-col gap-3">
        {fields.map((field, index) => (
          <li key={field.id}>
            <Observation
              index={index}
              count={fields.length}
              terms={terms}
              images={images}
              drawing={drawing === field.id}
              onDraw={(open) => setDrawing(open ? field.id : null)}
              onMove={(by) => move(index, index + by)}
              onRemove={() => remove(index)}
            />
          </li>
        ))}
      </ol>
      <div>
        <Button onClick={() => append(newObservation(), { shouldFocus: false })}>Add observation</Button>
      </div>
    </div>
  );
}
