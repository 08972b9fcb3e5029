import { useId, useMemo, useRef, useState, type FormEvent } from 'react';
import { GEOMETRIES, ILLUMINANTS, MEASUREMENT_CONDITIONS, OBSERVERS, type MeasurementSession, type PrintMeasurements } from '@toneledger/common/schemas/measurements';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { TextAreaField } from '@/components/ui/text-area-field';
import { isApiError } from '@/lib/api-client';
import { useCreateSession } from '@/features/measurements/api/create-session';
import { CsvImport, type CsvReadings } from '@/features/measurements/components/csv-import';
import { SpotReadings } from '@/features/measurements/components/spot-readings';
import { formatDay } from '@/features/measurements/utils/format';
import {
  SESSION_FIELD_LABELS,
  checkSession,
  emptySessionValues,
  emptySpotEntry,
  issuesToErrors,
  newRow,
  sessionConditions,
  type FieldErrors,
  type SentOrder,
  type SessionField,
  type SessionFormValues,
  type SpotEntry,
} from '@/features/measurements/utils/session-form';

const OBSERVER_LABELS: Record<(typeof OBSERVERS)[number], string> = { '2': '2°', '10': '10°' };

export interface SessionFormProps {
  printId: string;
  measurements: PrintMeasurements;
  onSaved: (session: MeasurementSession) => void;
  onCancel: () => void;
  /** Today's date, for the default (tests pass a fixed one). */
  today?: string;
}

/**
 * Records one measurement session: its conditions, and for each spot one or more L*a*b*
 * readings (typed, or taken from the instrument's CSV file) with an optional density or
 * reflectance. Each spot shows its mean, spread and change against its baseline while typing.
 * Checked with the server's schema; whatever the server answers, the typed values stay.
 */
export function SessionForm({ printId, measurements, onSaved, onCancel, today }: SessionFormProps) {
  const prefix = `session${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  const spotOrder = useMemo(() => measurements.spots.map((s) => s.spot.id), [measurements.spots]);
  const latest = useMemo(
    () => [...measurements.sessions].sort((a, b) => b.measuredOn.localeCompare(a.measuredOn) || b.createdAt.localeCompare(a.createdAt))[0] ?? null,
    [measurements.sessions],
  );
  const [values, setValues] = useState<SessionFormValues>(() => emptySessionValues(spotOrder, latest, today));
  const [errors, setErrors] = useState<FieldErrors>({});
  const orderRef = useRef<SentOrder>([]);
  const summaryRef = useRef<HTMLDivElement>(null);
  const create = useCreateSession();
  const conditions = sessionConditions(values);

  const setField = (field: SessionField) => (event: { target: { value: string } }) => setValues((v) => ({ ...v, [field]: event.target.value }));
  const setEntry = (spotId: string, change: (entry: SpotEntry) => SpotEntry) =>
    setValues((v) => ({ ...v, spots: { ...v.spots, [spotId]: change(v.spots[spotId] ?? emptySpotEntry()) } }));

  function fillFromCsv(readings: CsvReadings) {
    setValues((v) => {
      const spots = { ...v.spots };
      for (const r of readings) {
        spots[r.spotId] = {
          readings: r.readings.map((x) => newRow({ L: String(x.L), a: String(x.a), b: String(x.b) })),
          density: r.density == null ? '' : String(r.density),
          densityType: r.densityType ?? '',
          reflectance: r.reflectance == null ? '' : String(r.reflectance),
        };
      }
      return { ...v, spots };
    });
  }

  function showErrors(next: FieldErrors) {
    setErrors(next);
    requestAnimationFrame(() => summaryRef.current?.focus());
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    create.reset();
    const checked = checkSession(values, spotOrder);
    orderRef.current = checked.order;
    if (!checked.ok) return showErrors(checked.errors);
    setErrors({});
    create.mutate(
      { printId, input: checked.data },
      {
        onSuccess: onSaved,
        onError: (error) => {
          if (!isApiError(error)) return;
          const found = issuesToErrors(error.fieldIssues, orderRef.current);
          if (Object.keys(found).length > 0) showErrors(found);
        },
      },
    );
  }

  // Where each error is, in words, for the list at the top.
  const spotName = (id: string) => measurements.spots.find((s) => s.spot.id === id)?.spot.name ?? 'A spot';
  function describe(key: string): { label: string; href: string } {
    const [kind, a, b] = key.split(':');
    if (kind === 'reading' && a && b) {
      for (const [spotId, entry] of Object.entries(values.spots)) {
        const index = entry.readings.findIndex((r) => r.key === a);
        if (index >= 0) return { label: `${spotName(spotId)}, reading ${index + 1}, ${b}*`, href: `#${prefix}-${a}-${b}` };
      }
    }
    if (kind === 'spot' && a) {
      const field = b === 'density' ? ', density' : b === 'reflectance' ? ', reflectance' : b === 'densityType' ? ', density type' : '';
      return { label: `${spotName(a)}${field}`, href: `#${prefix}-${a}-${b === 'density' || b === 'reflectance' ? b : 'group'}` };
    }
    if (key === 'readings') return { label: 'Readings', href: `#${prefix}-spots` };
    if (key in SESSION_FIELD_LABELS) return { label: SESSION_FIELD_LABELS[key as SessionField], href: `#${prefix}-${key}` };
    return { label: 'Session', href: `#${prefix}-measuredOn` };
  }
  const errorEntries = Object.entries(errors).filter(([, m]) => m) as [string, string][];
  const otherError = create.isError && !(isApiError(create.error) && create.error.fieldIssues.length > 0);
  const id = (field: SessionField) => `${prefix}-${field}`;

  return (
    <form onSubmit={submit} noValidate aria-label="Record a session" className="flex max-w-6xl flex-col gap-5">
      <div ref={summaryRef} tabIndex={-1} className="outline-none">
        {errorEntries.length > 0 ? (
          <Notice tone="error" role="alert" title={`Not saved: ${errorEntries.length === 1 ? 'one thing needs' : `${errorEntries.length} things need`} attention.`}>
            <ul className="mt-1 list-disc pl-5">
              {errorEntries.map(([key, message]) => {
                const where = describe(key);
                return (
                  <li key={key}>
                    <a href={where.href} className="text-danger-700">
                      {where.label}: {message}
                    </a>
                  </li>
                );
              })}
            </ul>
          </Notice>
        ) : null}
      </div>
      {otherError ? <ErrorNotice error={create.error} title="Not saved." /> : null}

      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4">
        <legend className="px-1 font-serif text-lg font-semibold">Session</legend>
        <TextField id={id('measuredOn')} label="Measured on" type="date" value={values.measuredOn} onChange={setField('measuredOn')} error={errors.measuredOn} required />
        <TextField id={id('instrument')} label="Instrument" hint="Make and model" value={values.instrument} onChange={setField('instrument')} error={errors.instrument} maxLength={200} required fieldClassName="lg:col-span-2" />
        <TextField id={id('serial')} label="Serial number" value={values.serial} onChange={setField('serial')} error={errors.serial} maxLength={100} />
        <SelectField id={id('illuminant')} label="Illuminant" value={values.illuminant} onChange={setField('illuminant')} error={errors.illuminant}>
          {ILLUMINANTS.map((i) => (
            <option key={i} value={i}>
              {i}
            </option>
          ))}
        </SelectField>
        <SelectField id={id('observer')} label="Observer" value={values.observer} onChange={setField('observer')} error={errors.observer}>
          {OBSERVERS.map((o) => (
            <option key={o} value={o}>
              {OBSERVER_LABELS[o]}
            </option>
          ))}
        </SelectField>
        <SelectField id={id('geometry')} label="Geometry" value={values.geometry} onChange={setField('geometry')} error={errors.geometry} required>
          <option value="">Choose…</option>
          {GEOMETRIES.map((g) => (
            <option key={g} value={g}>
              {g}
            </option>
          ))}
        </SelectField>
        <SelectField id={id('condition')} label="Measurement condition" value={values.condition} onChange={setField('condition')} error={errors.condition}>
          <option value="">Not stated</option>
          {MEASUREMENT_CONDITIONS.map((c) => (
            <option key={c} value={c}>
              {c}
            </option>
          ))}
        </SelectField>
        <TextField id={id('aperture')} label="Aperture" value={values.aperture} onChange={setField('aperture')} error={errors.aperture} maxLength={50} />
        <TextField id={id('backing')} label="Backing" value={values.backing} onChange={setField('backing')} error={errors.backing} maxLength={100} />
        <TextAreaField id={id('notes')} label="Notes" value={values.notes} onChange={setField('notes')} error={errors.notes} maxLength={5000} fieldClassName="sm:col-span-2" rows={2} />
        {latest ? (
          <p className="text-xs text-ink-700 sm:col-span-2 lg:col-span-4">
            Instrument and conditions are filled in from the session of {formatDay(latest.measuredOn)}. Readings under other conditions are kept, but not compared with the baseline.
          </p>
        ) : null}
      </fieldset>

      <section aria-labelledby={`${prefix}-csv`} className="rounded border border-paper-300 bg-white p-4">
        <h2 id={`${prefix}-csv`} className="mb-2 text-lg">
          From a CSV file
        </h2>
        <CsvImport printId={printId} spots={measurements.spots.map((s) => s.spot)} onUse={fillFromCsv} />
      </section>

      <section aria-labelledby={`${prefix}-spots-heading`} className="flex flex-col gap-3">
        <h2 id={`${prefix}-spots-heading`} className="text-lg">
          Readings by spot
        </h2>
        <p className="text-sm text-ink-700">Leave a spot empty if it was not measured in this session.</p>
        <div id={`${prefix}-spots`} tabIndex={-1}>
          {errors.readings ? <p className="mb-2 text-sm font-medium text-danger-700">{errors.readings}</p> : null}
          <div className="flex flex-col gap-3">
            {measurements.spots.map((analysis) => {
              const spotId = analysis.spot.id;
              const entry = values.spots[spotId] ?? emptySpotEntry();
              return (
                <SpotReadings
                  key={spotId}
                  idPrefix={prefix}
                  analysis={analysis}
                  baselineSession={analysis.baseline ? (measurements.sessions.find((s) => s.id === analysis.baseline!.sessionId) ?? null) : null}
                  entry={entry}
                  conditions={conditions}
                  threshold={measurements.threshold}
                  errors={errors}
                  onRowChange={(rowKey, channel, value) =>
                    setEntry(spotId, (e) => ({ ...e, readings: e.readings.map((r) => (r.key === rowKey ? { ...r, [channel]: value } : r)) }))
                  }
                  onAddRow={() => setEntry(spotId, (e) => ({ ...e, readings: [...e.readings, newRow()] }))}
                  onRemoveRow={(rowKey) => setEntry(spotId, (e) => ({ ...e, readings: e.readings.filter((r) => r.key !== rowKey) }))}
                  onFieldChange={(field, value) => setEntry(spotId, (e) => ({ ...e, [field]: value }))}
                />
              );
            })}
          </div>
        </div>
      </section>

      <div className="flex gap-2">
        <Button type="submit" variant="primary" disabled={create.isPending}>
          {create.isPending ? 'Saving…' : 'Save session'}
        </Button>
        <Button onClick={onCancel}>Cancel</Button>
      </div>
    </form>
  );
}
