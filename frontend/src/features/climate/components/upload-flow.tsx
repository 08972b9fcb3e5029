import { useRef, useState } from 'react';
import { climateMappingSchema, type ClimateFile, type ClimateMapping } from '@toneledger/common/schemas/climate';
import { SelectInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useAcceptClimateFile, useCheckClimateFile, useDiscardClimateFile, useUploadClimateFile } from '@/features/climate/api/climate';
import { browserTimeZone, formatWhen } from '@/features/climate/utils/format';

const DATE_ORDERS = [
  { value: 'auto', label: 'ISO 8601, or day first (31/12/2026)' },
  { value: 'day-first', label: 'Day first (31/12/2026)' },
  { value: 'month-first', label: 'Month first (12/31/2026)' },
];
const UNITS = [{ value: 'C', label: '°C' }, { value: 'F', label: '°F' }];

type MappingValues = { timestampColumn: string; timeZone: string; dateOrder: string; temperatureColumn: string; temperatureUnit: string; rhColumn: string };

function toValues(f: ClimateFile): MappingValues {
  const m = { ...f.suggestedMapping, ...(f.mapping ?? {}) };
  return {
    timestampColumn: m.timestampColumn ?? '', timeZone: m.timeZone ?? browserTimeZone(), dateOrder: m.dateOrder ?? 'auto',
    temperatureColumn: m.temperatureColumn ?? '', temperatureUnit: m.temperatureUnit ?? 'C', rhColumn: m.rhColumn ?? '',
  };
}

/** Step 2: which column is which, how times are read, with the file's first rows beside. */
function MappingStep({ file, onChecked }: { file: ClimateFile; onChecked: (f: ClimateFile) => void }) {
  const check = useCheckClimateFile();
  const form = useSchemaForm({ schema: climateMappingSchema, defaultValues: toValues(file) });
  const columns = file.columns.map((c) => ({ value: c, label: c }));
  return (
    <SchemaForm
      form={form}
      className="flex flex-col gap-3"
      onValid={(mapping) => check.mutate({ id: file.id, mapping }, { onSuccess: onChecked, onError: form.serverError })}
    >
      <div className="overflow-x-auto">
        <table className="border-collapse text-xs">
          <caption className="mb-1 text-left text-sm">The first rows of {file.fileName} ({file.rowCount.toLocaleString('en-GB')} rows)</caption>
          <thead><tr>{file.columns.map((c) => <th key={c} scope="col" className="border border-paper-300 px-2 py-1 text-left">{c}</th>)}</tr></thead>
          <tbody>
            {file.sample.map((row, i) => (
              <tr key={i}>{file.columns.map((c, k) => <td key={c} className="border border-paper-300 px-2 py-1">{row[k] ?? ''}</td>)}</tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap gap-3">
        <SelectInput name="timestampColumn" label="Date and time column" options={columns} empty="Choose…" fieldClassName="w-56" />
        <SelectInput name="dateOrder" label="Dates written" options={DATE_ORDERS} fieldClassName="w-64" />
        <TextInput name="timeZone" label="Time zone of the logger's clock" hint="An IANA name (Europe/London follows summer time) or a fixed offset (+01:00). Times written with their own offset keep it." fieldClassName="w-72" />
      </div>
      <div className="flex flex-wrap gap-3">
        <SelectInput name="temperatureColumn" label="Temperature column" options={columns} empty="Choose…" fieldClassName="w-56" />
        <SelectInput name="temperatureUnit" label="Temperature unit" options={UNITS} fieldClassName="w-28" />
        <SelectInput name="rhColumn" label="RH column" options={columns} empty="Choose…" fieldClassName="w-56" />
      </div>
      <div>
        <Button type="submit" variant="primary" disabled={check.isPending}>{check.isPending ? 'Checking every row…' : 'Check the file'}</Button>
      </div>
    </SchemaForm>
  );
}

/** Step 3: what the check found; accept writes the readings, nothing before. */
function PreviewStep({ file, onDone }: { file: ClimateFile; onDone: (written: number) => void }) {
  const accept = useAcceptClimateFile();
  const c = file.check!;
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm">
        {c.goodRows.toLocaleString('en-GB')} rows read, {c.badRows.toLocaleString('en-GB')} bad
        {c.firstAt ? `, from ${formatWhen(c.firstAt)} to ${formatWhen(c.lastAt)}` : ''}.
        {c.duplicates ? ` ${c.duplicates.toLocaleString('en-GB')} readings are at times this location already holds: the readings held are kept.` : ''}
      </p>
      {c.problems.length ? (
        <div className="overflow-x-auto">
          <table className="border-collapse text-sm">
            <caption className="mb-1 text-left font-semibold text-danger-700">
              Rows that cannot be read{c.badRows > c.problems.length ? ` (the first ${c.problems.length} problems)` : ''}
            </caption>
            <thead><tr className="text-left"><th scope="col" className="pr-3">Row</th><th scope="col" className="pr-3">Column</th><th scope="col">Problem</th></tr></thead>
            <tbody>
              {c.problems.map((p, i) => (
                <tr key={i}><td className="pr-3">{p.row}</td><td className="pr-3">{p.column ?? '—'}</td><td>{p.message}</td></tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {c.preview.length ? (
        <table className="border-collapse text-xs">
          <caption className="mb-1 text-left text-sm">As they will be stored (first {c.preview.length})</caption>
          <thead><tr className="text-left"><th scope="col" className="pr-3">Taken at (UTC)</th><th scope="col" className="pr-3">°C</th><th scope="col">% RH</th></tr></thead>
          <tbody>
            {c.preview.map((r) => (
              <tr key={r.takenAt}><td className="pr-3">{r.takenAt.replace('T', ' ').slice(0, 19)}</td><td className="pr-3">{r.temperatureC.toFixed(2)}</td><td>{r.rhPercent.toFixed(1)}</td></tr>
            ))}
          </tbody>
        </table>
      ) : null}
      {accept.isError ? <ErrorNotice error={accept.error} title="The readings were not written." /> : null}
      {c.badRows > 0 ? (
        <Notice tone="warning">Correct the file or the mapping and check again: a file with bad rows cannot be accepted.</Notice>
      ) : (
        <div>
          <Button variant="primary" disabled={accept.isPending || !file.mapping} onClick={() => accept.mutate({ id: file.id, mapping: file.mapping as ClimateMapping }, { onSuccess: (f) => onDone(f.acceptedRows ?? 0) })}>
            {accept.isPending ? 'Writing readings…' : `Accept ${c.goodRows.toLocaleString('en-GB')} readings`}
          </Button>
        </div>
      )}
    </div>
  );
}

/** Loading a logger file: choose → map columns → check → preview → accept. Nothing is written until accepted. */
export function UploadFlow({ locationId, resume, onClose }: { locationId: string; resume?: ClimateFile | null; onClose?: () => void }) {
  const upload = useUploadClimateFile(locationId);
  const discard = useDiscardClimateFile(locationId);
  const [file, setFile] = useState<ClimateFile | null>(resume ?? null);
  const [accepted, setAccepted] = useState<number | null>(null);
  const input = useRef<HTMLInputElement>(null);

  const reset = () => { setFile(null); upload.reset(); if (input.current) input.current.value = ''; };
  if (accepted !== null) {
    return (
      <Notice tone="success" title="Readings written">
        {accepted.toLocaleString('en-GB')} new readings were written. <Button size="sm" onClick={() => { setAccepted(null); reset(); onClose?.(); }}>Done</Button>
      </Notice>
    );
  }
  return (
    <section aria-labelledby="upload-title" className="flex flex-col gap-3 rounded border border-paper-300 bg-white p-3">
      <h2 id="upload-title" className="font-serif text-lg">Load a logger file</h2>
      <ol className="flex gap-4 text-xs text-ink-700" aria-label="Steps">
        {['Choose the file', 'Map the columns', 'Check and accept'].map((s, i) => {
          const step = !file ? 0 : !file.check ? 1 : 2;
          return <li key={s} aria-current={i === step ? 'step' : undefined} className={i === step ? 'font-semibold text-ink-900' : ''}>{i + 1}. {s}</li>;
        })}
      </ol>
      {!file ? (
        <div className="flex flex-col gap-2">
          <label className="flex flex-col text-sm">
            Logger CSV (UTF-8, a header row naming the columns)
            <input ref={input} type="file" accept=".csv,text/csv,text/plain" onChange={(e) => { const f = e.target.files?.[0]; if (f) upload.mutate(f, { onSuccess: setFile }); }} />
          </label>
          {upload.isPending ? <p className="text-sm">Uploading…</p> : null}
          {upload.isError ? <ErrorNotice error={upload.error} title="The file was not loaded." /> : null}
        </div>
      ) : (
        <>
          <MappingStep key={file.id} file={file} onChecked={setFile} />
          {file.check ? <PreviewStep file={file} onDone={setAccepted} /> : null}
          <div>
            <Button size="sm" disabled={discard.isPending} onClick={() => discard.mutate(file, { onSuccess: () => { reset(); onClose?.(); } })}>
              Discard this file
            </Button>
            {discard.isError ? <ErrorNotice error={discard.error} title="The file was not discarded." /> : null}
          </div>
        </>
      )}
    </section>
  );
}
