import { useMemo } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import { GEOMETRIES, ILLUMINANTS, MEASUREMENT_CONDITIONS, OBSERVERS, sessionInputSchema, type MeasurementSession, type PrintMeasurements } from '@toneledger/common/schemas/measurements';
import { DateInput, SelectInput, TextAreaInput, TextInput, useFieldError } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useCreateSession } from '@/features/measurements/api/create-session';
import { CsvImport, type CsvReadings } from '@/features/measurements/components/csv-import';
import { SpotReadings } from '@/features/measurements/components/spot-readings';
import { formatDay } from '@/features/measurements/utils/format';
import { emptySessionValues, errorKey, newRow, rawSessionBody, sessionConditions, type SessionFormValues } from '@/features/measurements/utils/session-form';

const OBSERVER_LABELS: Record<(typeof OBSERVERS)[number], string> = { '2': '2°', '10': '10°' };
const plain = (codes: readonly string[]) => codes.map((c) => ({ value: c, label: c }));

export interface SessionFormProps {
  printId: string;
  measurements: PrintMeasurements;
  onSaved: (session: MeasurementSession) => void;
  onCancel: () => void;
  /** Today's date, for the default (tests pass a fixed one). */
  today?: string;
}

function Spots({ measurements }: { measurements: PrintMeasurements }) {
  const { control } = useFormContext<SessionFormValues>();
  const [illuminant, observer, geometry, condition] = useWatch({ control, name: ['illuminant', 'observer', 'geometry', 'condition'] });
  const conditions = sessionConditions({ illuminant, observer, geometry, condition });
  const listError = useFieldError('spots');
  return (
    <div data-field="spots" data-label="Readings" tabIndex={-1}>
      {listError ? <p className="mb-2 text-sm font-medium text-danger-700">{listError}</p> : null}
      <div className="flex flex-col gap-3">
        {measurements.spots.map((analysis) => (
          <SpotReadings
            key={analysis.spot.id}
            analysis={analysis}
            baselineSession={analysis.baseline ? (measurements.sessions.find((s) => s.id === analysis.baseline!.sessionId) ?? null) : null}
            conditions={conditions}
            threshold={measurements.threshold}
          />
        ))}
      </div>
    </div>
  );
}

/**
 * Records one measurement session: its conditions, and for each spot one or more L*a*b*
 * readings (typed, or taken from the instrument's CSV file) with an optional density or
 * reflectance. Each spot shows its mean, spread and change against its baseline while typing.
 * Checked with the server's schema; whatever the server answers, the typed values stay.
 */
export function SessionForm({ printId, measurements, onSaved, onCancel, today }: SessionFormProps) {
  const spotOrder = useMemo(() => measurements.spots.map((s) => s.spot.id), [measurements.spots]);
  const latest = useMemo(
    () => [...measurements.sessions].sort((a, b) => b.measuredOn.localeCompare(a.measuredOn) || b.createdAt.localeCompare(a.createdAt))[0] ?? null,
    [measurements.sessions],
  );
  const create = useCreateSession();
  const form = useSchemaForm({
    schema: sessionInputSchema,
    defaultValues: emptySessionValues(spotOrder, latest, today),
    // Only spots and rows with something typed are sent; problems go back to the rows they came from.
    toBody: (values: SessionFormValues) => rawSessionBody(values, spotOrder).body,
    fieldFor: (path, values) => errorKey(path, rawSessionBody(values, spotOrder).order),
  });

  // Where each problem is, in words, for the summary: "Sky, upper left, reading 3, L*".
  const spotName = (id: string) => measurements.spots.find((s) => s.spot.id === id)?.spot.name ?? 'A spot';
  function labelFor(path: string): string | null {
    const m = /^spots\.([^.]+)(?:\.(readings|density|densityType|reflectance))?(?:\.(\d+)\.(L|a|b))?$/.exec(path);
    if (!m) return null;
    const [, id, field, row, channel] = m;
    if (row !== undefined) return `${spotName(id!)}, reading ${Number(row) + 1}, ${channel}*`;
    const what = field === 'density' ? ', density' : field === 'reflectance' ? ', reflectance' : field === 'densityType' ? ', density type' : '';
    return `${spotName(id!)}${what}`;
  }

  function fillFromCsv(readings: CsvReadings) {
    for (const r of readings) {
      form.setValue(`spots.${r.spotId}.readings`, r.readings.map((x) => newRow({ L: String(x.L), a: String(x.a), b: String(x.b) })));
      form.setValue(`spots.${r.spotId}.density`, r.density == null ? '' : String(r.density));
      form.setValue(`spots.${r.spotId}.densityType`, r.densityType ?? '');
      form.setValue(`spots.${r.spotId}.reflectance`, r.reflectance == null ? '' : String(r.reflectance));
    }
  }

  return (
    <SchemaForm
      form={form}
      onValid={(body) => create.mutate({ printId, input: body }, { onSuccess: onSaved, onError: form.serverError })}
      labelFor={labelFor}
      aria-label="Record a session"
      className="max-w-6xl gap-5"
    >
      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4">
        <legend className="px-1 font-serif text-lg font-semibold">Session</legend>
        <DateInput name="measuredOn" label="Measured on" required />
        <TextInput name="instrument" label="Instrument" hint="Make and model" required fieldClassName="lg:col-span-2" />
        <TextInput name="serial" label="Serial number" />
        <SelectInput name="illuminant" label="Illuminant" options={plain(ILLUMINANTS)} />
        <SelectInput name="observer" label="Observer" options={OBSERVERS.map((o) => ({ value: o, label: OBSERVER_LABELS[o] }))} />
        <SelectInput name="geometry" label="Geometry" empty="Choose…" options={plain(GEOMETRIES)} required />
        <SelectInput name="condition" label="Measurement condition" empty="Not stated" options={plain(MEASUREMENT_CONDITIONS)} />
        <TextInput name="aperture" label="Aperture" />
        <TextInput name="backing" label="Backing" />
        <TextAreaInput name="notes" label="Notes" fieldClassName="sm:col-span-2" rows={2} />
        {latest ? (
          <p className="text-xs text-ink-700 sm:col-span-2 lg:col-span-4">
            Instrument and conditions are filled in from the session of {formatDay(latest.measuredOn)}. Readings under other conditions are kept, but not compared with the baseline.
          </p>
        ) : null}
      </fieldset>

      <section aria-labelledby="session-csv" className="rounded border border-paper-300 bg-white p-4">
        <h2 id="session-csv" className="mb-2 text-lg">
          From a CSV file
        </h2>
        <CsvImport printId={printId} spots={measurements.spots.map((s) => s.spot)} onUse={fillFromCsv} />
      </section>

      <section aria-labelledby="session-spots" className="flex flex-col gap-3">
        <h2 id="session-spots" className="text-lg">
          Readings by spot
        </h2>
        <p className="text-sm text-ink-700">Leave a spot empty if it was not measured in this session.</p>
        <Spots measurements={measurements} />
      </section>

      <SubmitCancel label="Save session" busy={create.isPending} busyLabel="Saving…" onCancel={onCancel} />
    </SchemaForm>
  );
}
