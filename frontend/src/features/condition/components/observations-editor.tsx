import { useState } from 'react';
import { EXTENTS, SEVERITIES, ZONE_AREAS, ZONE_SIDES, type ConditionTerm } from '@toneledger/common/schemas/condition';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { TextAreaField } from '@/components/ui/text-area-field';
import { RegionDrawer, imageLabel } from '@/features/condition/components/region-drawer';
import { AREA_LABELS, EXTENT_LABELS, SEVERITY_LABELS, SIDE_LABELS } from '@/features/condition/utils/labels';
import { describeRegion } from '@/features/condition/utils/region';
import { newObservation, type FieldErrors, type ObservationDraft } from '@/features/condition/utils/report-form';

export interface ObservationsEditorProps {
  observations: ObservationDraft[];
  onChange: (next: ObservationDraft[]) => void;
  terms: ConditionTerm[];
  /** Images a region may be drawn on. */
  images: PrintImage[];
  errors: FieldErrors;
  /** Builds the id of a control, so the error summary can link to it. */
  fieldId: (path: string) => string;
}

function suggestImage(images: PrintImage[], side: string): string | undefined {
  return images.find((i) => i.viewType === side)?.id ?? images[0]?.id;
}

/** The structured observations of a report: add, remove, reorder, and draw each one's region. */
export function ObservationsEditor({ observations, onChange, terms, images, errors, fieldId }: ObservationsEditorProps) {
  const [drawing, setDrawing] = useState<string | null>(null);
  const active = terms.filter((t) => t.active);

  function update(index: number, patch: Partial<ObservationDraft>) {
    onChange(observations.map((o, i) => (i === index ? { ...o, ...patch } : o)));
  }
  function move(index: number, by: -1 | 1) {
    const next = [...observations];
    const [item] = next.splice(index, 1);
    next.splice(index + by, 0, item!);
    onChange(next);
  }

  return (
    <div className="flex flex-col gap-3">
      {observations.length === 0 ? <p className="text-sm text-ink-700">No observations yet.</p> : null}
      <ol className="flex flex-col gap-3">
        {observations.map((o, index) => {
          const n = index + 1;
          const err = (field: string) => errors[`observations.${index}.${field}`];
          const id = (field: string) => fieldId(`observations.${index}.${field}`);
          const current = terms.find((t) => t.code === o.termCode);
          const regionImage = o.region ? images.find((i) => i.id === o.region!.imageId) : undefined;
          const regionError = err('region') ?? err('region.imageId') ?? err('region.points');
          return (
            <li key={o.key}>
              <fieldset className="rounded border border-paper-300 bg-white p-3" aria-label={`Observation ${n}`}>
                <legend className="px-1 text-sm font-semibold">Observation {n}</legend>
                <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
                  <SelectField id={id('termCode')} label="Observed" value={o.termCode} onChange={(e) => update(index, { termCode: e.target.value })} error={err('termCode')}>
                    <option value="">Choose…</option>
                    {current && !current.active ? <option value={current.code}>{current.label} (no longer in use)</option> : null}
                    {active.map((t) => (
                      <option key={t.code} value={t.code}>
                        {t.label}
                      </option>
                    ))}
                  </SelectField>
                  <SelectField id={id('side')} label="Side" value={o.side} onChange={(e) => update(index, { side: e.target.value })} error={err('side')}>
                    {ZONE_SIDES.map((s) => (
                      <option key={s} value={s}>
                        {SIDE_LABELS[s]}
                      </option>
                    ))}
                  </SelectField>
                  <SelectField id={id('area')} label="Area" value={o.area} onChange={(e) => update(index, { area: e.target.value })} error={err('area')}>
                    {ZONE_AREAS.map((s) => (
                      <option key={s} value={s}>
                        {AREA_LABELS[s]}
                      </option>
                    ))}
                  </SelectField>
                  <SelectField id={id('extent')} label="Extent" value={o.extent} onChange={(e) => update(index, { extent: e.target.value })} error={err('extent')}>
                    {EXTENTS.map((s) => (
                      <option key={s} value={s}>
                        {EXTENT_LABELS[s]}
                      </option>
                    ))}
                  </SelectField>
                  {o.extent === 'percentage' ? (
                    <TextField
                      id={id('extentPercent')}
                      label="Percentage affected"
                      value={o.extentPercent}
                      onChange={(e) => update(index, { extentPercent: e.target.value })}
                      error={err('extentPercent')}
                      inputMode="decimal"
                      className="num"
                    />
                  ) : null}
                  <SelectField id={id('severity')} label="Severity" value={o.severity} onChange={(e) => update(index, { severity: e.target.value })} error={err('severity')}>
                    {SEVERITIES.map((s) => (
                      <option key={s} value={s}>
                        {SEVERITY_LABELS[s]}
                      </option>
                    ))}
                  </SelectField>
                  <TextAreaField
                    id={id('notes')}
                    label="Notes"
                    value={o.notes}
                    onChange={(e) => update(index, { notes: e.target.value })}
                    error={err('notes')}
                    fieldClassName="sm:col-span-2 lg:col-span-3"
                    rows={2}
                    maxLength={2000}
                  />
                </div>
                <div className="mt-3 flex flex-wrap items-center gap-2 text-sm">
                  <span id={id('region')} className="text-ink-800">
                    Region:{' '}
                    {o.region ? `${describeRegion(o.region)} on ${regionImage ? imageLabel(regionImage) : 'an image no longer shown'}` : 'none drawn'}
                  </span>
                  <Button size="sm" onClick={() => setDrawing(drawing === o.key ? null : o.key)} aria-expanded={drawing === o.key}>
                    Draw region
                  </Button>
                  {o.region ? (
                    <Button size="sm" variant="quiet" onClick={() => update(index, { region: null })}>
                      Remove region
                    </Button>
                  ) : null}
                  <span className="ml-auto flex gap-1">
                    <Button size="sm" variant="quiet" disabled={index === 0} onClick={() => move(index, -1)} aria-label={`Move observation ${n} up`}>
                      ↑
                    </Button>
                    <Button
                      size="sm"
                      variant="quiet"
                      disabled={index === observations.length - 1}
                      onClick={() => move(index, 1)}
                      aria-label={`Move observation ${n} down`}
                    >
                      ↓
                    </Button>
                    <Button size="sm" variant="quiet" onClick={() => onChange(observations.filter((_, i) => i !== index))} aria-label={`Remove observation ${n}`}>
                      Remove
                    </Button>
                  </span>
                </div>
                {regionError ? <p className="mt-1 text-xs font-medium text-danger-700">{regionError}</p> : null}
                {drawing === o.key ? (
                  <div className="mt-3">
                    <RegionDrawer
                      images={images}
                      initial={o.region}
                      suggestedImageId={suggestImage(images, o.side)}
                      onCancel={() => setDrawing(null)}
                      onSave={(region) => {
                        update(index, { region });
                        setDrawing(null);
                      }}
                    />
                  </div>
                ) : null}
              </fieldset>
            </li>
          );
        })}
      </ol>
      <div>
        <Button onClick={() => onChange([...observations, newObservation()])}>Add observation</Button>
      </div>
    </div>
  );
}
