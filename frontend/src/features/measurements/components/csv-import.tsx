import { useId, useState } from 'react';
import { csvMappingSchema, type SpotAnalysis } from '@toneledger/common/schemas/measurements';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { TableHead } from '@/components/ui/table-head';
import { issuesToFieldErrors } from '@/lib/forms/field-errors';
import { usePreviewCsv, type CsvPreview } from '@/features/measurements/api/preview-csv';
import {
  MAPPING_LABELS,
  OPTIONAL_MAPPING,
  REQUIRED_MAPPING,
  guessMapping,
  toCsvMapping,
  type MappingField,
  type MappingValues,
} from '@/features/measurements/utils/csv-mapping';
import { formatNumber } from '@/features/measurements/utils/format';

export type CsvReadings = NonNullable<CsvPreview['readings']>;

export interface CsvImportProps {
  printId: string;
  spots: SpotAnalysis['spot'][];
  /** Puts the checked readings into the session form. */
  onUse: (readings: CsvReadings) => void;
}

/**
 * Readings from an instrument's CSV file: the file is read by the server, the person says which
 * column holds what, and the server checks every row. Nothing is stored by a preview; clean
 * readings go into the session form, which is saved as usual.
 */
export function CsvImport({ printId, spots, onUse }: CsvImportProps) {
  const fileId = useId();
  const [file, setFile] = useState<File | null>(null);
  const [columns, setColumns] = useState<CsvPreview | null>(null);
  const [mapping, setMapping] = useState<MappingValues | null>(null);
  const [mappingErrors, setMappingErrors] = useState<Partial<Record<MappingField, string>>>({});
  const [checked, setChecked] = useState<CsvPreview | null>(null);
  const [used, setUsed] = useState<string | null>(null);
  const read = usePreviewCsv();
  const check = usePreviewCsv();

  function choose(next: File | null) {
    setFile(next);
    setColumns(null);
    setMapping(null);
    setChecked(null);
    setUsed(null);
    setMappingErrors({});
    check.reset();
    if (!next) return;
    read.mutate(
      { printId, file: next },
      {
        onSuccess: (preview) => {
          setColumns(preview);
          setMapping(guessMapping(preview.columns));
        },
      },
    );
  }

  function runCheck() {
    if (!file || !mapping) return;
    setChecked(null);
    setUsed(null);
    const parsed = csvMappingSchema.safeParse(toCsvMapping(mapping));
    if (!parsed.success) {
      setMappingErrors(issuesToFieldErrors(parsed.error.issues) as Partial<Record<MappingField, string>>);
      return;
    }
    setMappingErrors({});
    check.mutate({ printId, file, mapping: toCsvMapping(mapping) }, { onSuccess: setChecked });
  }

  const spotName = (id: string) => spots.find((s) => s.id === id)?.name ?? id;
  const clean = checked !== null && checked.errors.length === 0 && checked.readings !== null && checked.readings.length > 0;

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-1">
        <label htmlFor={fileId} className="text-xs font-semibold tracking-wide text-ink-700 uppercase">
          CSV file from the instrument
        </label>
        <input
          id={fileId}
          type="file"
          accept=".csv,text/csv"
          onChange={(e) => choose(e.target.files?.[0] ?? null)}
          className="text-sm file:mr-3 file:rounded file:border file:border-paper-400 file:bg-white file:px-3 file:py-1.5 file:text-sm"
        />
        <p className="text-xs text-ink-700">Nothing is stored from the file until the session itself is saved.</p>
      </div>
      {read.isPending ? <p role="status" className="text-sm text-ink-700">Reading the file…</p> : null}
      {read.isError ? <ErrorNotice error={read.error} title="The file could not be read." /> : null}

      {columns && mapping ? (
        <>
          <p className="num text-sm">
            {columns.rowCount} {columns.rowCount === 1 ? 'row' : 'rows'} in {columns.columns.length} columns. Say which column holds what.
          </p>
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3 [&_label]:normal-case">
            {[...REQUIRED_MAPPING, ...OPTIONAL_MAPPING].map((field) => (
              <SelectField
                key={field}
                label={MAPPING_LABELS[field]}
                value={mapping[field]}
                onChange={(e) => setMapping({ ...mapping, [field]: e.target.value })}
                error={mappingErrors[field]}
              >
                <option value="">{REQUIRED_MAPPING.includes(field) ? 'Choose…' : 'None'}</option>
                {columns.columns.map((c) => (
                  <option key={c} value={c}>
                    {c}
                  </option>
                ))}
              </SelectField>
            ))}
          </div>
          {mapping.reflectance ? (
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={mapping.reflectanceIsPercent} onChange={(e) => setMapping({ ...mapping, reflectanceIsPercent: e.target.checked })} />
              Reflectance is given in percent
            </label>
          ) : null}
          {columns.sample.length > 0 ? (
            <div className="overflow-x-auto rounded border border-paper-300 bg-white">
              <table className="w-full text-left text-xs">
                <caption className="px-2 py-1 text-left text-ink-700">First rows of the file</caption>
                <TableHead variant="plain" columns={columns.columns} />
                <tbody>
                  {columns.sample.map((row, i) => (
                    <tr key={i} className="border-t border-paper-200">
                      {columns.columns.map((c) => (
                        <td key={c} className="px-2 py-1">
                          {row[c] ?? ''}
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ) : null}
          <div>
            <Button onClick={runCheck} disabled={check.isPending}>
              {check.isPending ? 'Checking…' : 'Check the readings'}
            </Button>
          </div>
        </>
      ) : null}

      {check.isError ? <ErrorNotice error={check.error} title="The readings could not be checked." /> : null}
      {checked && checked.errors.length > 0 ? (
        <div className="flex flex-col gap-2">
          <Notice tone="error" role="alert" title={`${checked.errors.length} ${checked.errors.length === 1 ? 'problem' : 'problems'} in the file. Nothing was used.`}>
            <p>Correct the file (or the column choices) and check again.</p>
          </Notice>
          <div className="overflow-x-auto rounded border border-paper-300 bg-white">
            <table className="w-full text-left text-sm">
              <caption className="sr-only">Problems in the file, by row and column</caption>
              <TableHead variant="plain" columns={['Row', 'Column', 'Value', 'Problem']} />
              <tbody>
                {checked.errors.map((e, i) => (
                  <tr key={`${e.row}-${e.column}-${i}`} className="border-t border-paper-200">
                    <td className="num px-2 py-1">{e.row}</td>
                    <td className="px-2 py-1">{e.column}</td>
                    <td className="mono px-2 py-1">{e.value ?? <span className="text-ink-600">empty</span>}</td>
                    <td className="px-2 py-1">{e.message}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </div>
      ) : null}
      {checked && checked.errors.length === 0 && !clean ? <Notice tone="warning">The file holds no readings for this print’s spots.</Notice> : null}
      {clean ? (
        <div className="flex flex-col gap-2">
          <Notice tone="success" role="status" title="Every row reads cleanly.">
            <ul className="num mt-1 list-disc pl-5">
              {checked.readings!.map((r) => (
                <li key={r.spotId}>
                  {spotName(r.spotId)}: {r.readings.length} {r.readings.length === 1 ? 'reading' : 'readings'}
                  {r.density != null ? `, density ${formatNumber(Number(r.density), 3)}` : ''}
                  {r.reflectance != null ? `, reflectance ${formatNumber(Number(r.reflectance), 3)}` : ''}
                </li>
              ))}
            </ul>
          </Notice>
          <div>
            <Button
              variant="primary"
              onClick={() => {
                onUse(checked.readings!);
                setUsed(`Readings for ${checked.readings!.length} ${checked.readings!.length === 1 ? 'spot' : 'spots'} are in the form below. Check them, then save the session.`);
              }}
            >
              Use these readings
            </Button>
          </div>
        </div>
      ) : null}
      {used ? (
        <p role="status" className="text-sm text-ok-700">
          {used}
        </p>
      ) : null}
    </div>
  );
}
