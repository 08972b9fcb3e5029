import { parse } from 'csv-parse/sync';
import type { z } from 'zod';
import type { Lab } from '@toneledger/common/domain/colour';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import type { csvMappingSchema, csvPreviewSchema, spotReadingInputSchema } from '@toneledger/common/schemas/measurements';
import { MeasurementSpot, Print } from '../models';
import { notFound, validationFailed } from '../errors';

type CsvMapping = z.infer<typeof csvMappingSchema>;
type CsvPreview = z.infer<typeof csvPreviewSchema>;
type SpotReadingInput = z.infer<typeof spotReadingInputSchema>;

/** A measurement spot as the CSV is matched against it. */
export interface NamedSpot {
  id: string;
  name: string;
}

export const MAX_CSV_BYTES = 5 * 1024 * 1024;
const SAMPLE_ROWS = 10;
const MAX_READINGS_PER_SPOT = 20;
const MAX_SPOTS_PER_SESSION = 50;
const MAX_REPORTED_ERRORS = 500;

/** The delimiter the header line uses most: instruments write commas, semicolons or tabs. */
function delimiterOf(text: string): string {
  const firstLine = text.slice(0, text.search(/\r?\n|$/));
  const counts = [',', ';', '\t'].map((d) => [d, firstLine.split(d).length - 1] as const);
  return counts.reduce((best, c) => (c[1] > best[1] ? c : best))[0];
}

/**
 * Reads an instrument's CSV and, with a mapping, turns it into the readings of one session:
 * rows naming the same spot are several readings of that spot (the server averages them when
 * the session is recorded; densities and reflectances given on those rows are averaged here).
 * Spot names are matched to the print's spots ignoring case and surrounding spaces. Row numbers
 * count the header as row 1. Rows with a problem are reported and left out of `readings`; the
 * client shows the problems and sends the session only when there are none. Nothing is written.
 */
export async function previewCsv(printId: string, text: string, mapping: CsvMapping | null): Promise<CsvPreview> {
  if ((await Print.count({ where: { id: printId } })) === 0) throw notFound('The print');
  const spots = await MeasurementSpot.findAll({ where: { printId }, attributes: ['id', 'name'], order: [['createdAt', 'ASC'], ['name', 'ASC']] });
  return readInstrumentCsv(text, mapping, spots.map((s) => ({ id: s.id, name: s.name })));
}

/** The preview of `previewCsv` for a print whose spots are `spots` (in the order they are listed in messages). */
export function readInstrumentCsv(text: string, mapping: CsvMapping | null, spots: readonly NamedSpot[]): CsvPreview {
  const delimiter = delimiterOf(text);
  let records: string[][];
  try {
    records = parse(text, { bom: true, delimiter, relax_column_count: true, skip_empty_lines: false, trim: false }) as string[][];
  } catch (err) {
    throw validationFailed([{ path: 'file', message: `The file is not readable as CSV: ${(err as Error).message}`, code: 'csv' }]);
  }
  if (!records.length) throw validationFailed([{ path: 'file', message: 'The file is empty', code: 'empty' }]);

  // Column names as the header gives them; blank ones get a name, repeated ones a number.
  const columns: string[] = [];
  records[0].forEach((raw, i) => {
    let name = raw.trim() || `column ${i + 1}`;
    for (let k = 2; columns.includes(name); k++) name = `${raw.trim() || `column ${i + 1}`} (${k})`;
    columns.push(name);
  });
  const rows = records
    .map((r, i) => ({ row: i + 1, cells: Object.fromEntries(columns.map((c, j) => [c, r[j] ?? ''])) as Record<string, string> }))
    .slice(1)
    .filter((r) => Object.values(r.cells).some((v) => v.trim() !== ''));
  const base = { columns, rowCount: rows.length, sample: rows.slice(0, SAMPLE_ROWS).map((r) => r.cells) };
  if (!mapping) return { ...base, readings: null, errors: [] };

  // Every mapped column must exist in the file (matched ignoring case when not exact).
  const resolve = (name: string) => columns.find((c) => c === name.trim()) ?? columns.find((c) => c.toLowerCase() === name.trim().toLowerCase());
  const mappingIssues: FieldIssue[] = [];
  const col = {} as Record<'spot' | 'L' | 'a' | 'b' | 'density' | 'reflectance', string | undefined>;
  for (const key of ['spot', 'L', 'a', 'b', 'density', 'reflectance'] as const) {
    const wanted = mapping[key];
    if (wanted === undefined || wanted === '') continue;
    col[key] = resolve(wanted);
    if (!col[key]) mappingIssues.push({ path: `mapping.${key}`, message: `The file has no column "${wanted}"`, code: 'no_column' });
  }
  if (mappingIssues.length) throw validationFailed(mappingIssues, 'The mapping names columns the file does not have.');

  const byName = new Map(spots.map((s) => [s.name.trim().toLowerCase(), s]));
  // Numbers as instruments write them; a decimal comma is read when the file is not comma-separated.
  const number = (raw: string) => {
    const v = raw.trim();
    const normal = delimiter !== ',' && /^[+-]?\d+,\d+$/.test(v) ? v.replace(',', '.') : v;
    return /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(normal) ? Number(normal) : NaN;
  };

  const errors: CsvPreview['errors'] = [];
  const groups = new Map<string, { spotId: string; readings: Lab[]; densities: number[]; reflectances: number[]; firstRow: number }>();
  for (const { row, cells } of rows) {
    const rowErrors: CsvPreview['errors'] = [];
    const problem = (column: string, message: string) => rowErrors.push({ row, column, value: cells[column] ?? null, message });
    const required = (key: 'spot' | 'L' | 'a' | 'b', label: string) => {
      const c = col[key]!;
      if ((cells[c] ?? '').trim() === '') problem(c, `${label} is empty`);
      return (cells[c] ?? '').trim();
    };
    const spotName = required('spot', 'The spot name');
    const spot = spotName ? byName.get(spotName.toLowerCase()) : undefined;
    if (spotName && !spot) problem(col.spot!, `"${spotName}" is not a measurement spot of this print (spots: ${spots.map((s) => s.name).join(', ') || 'none yet'})`);
    const lab = {} as Lab;
    for (const [key, label, min, max] of [['L', 'L*', 0, 100], ['a', 'a*', -200, 200], ['b', 'b*', -200, 200]] as const) {
      const raw = required(key, label);
      if (!raw) continue;
      const v = number(raw);
      if (Number.isNaN(v)) problem(col[key]!, `${label} must be a number`);
      else if (v < min || v > max) problem(col[key]!, `${label} is between ${min} and ${max}`);
      else lab[key] = v;
    }
    let density: number | null = null;
    if (col.density && (cells[col.density] ?? '').trim() !== '') {
      const v = number(cells[col.density]);
      if (Number.isNaN(v)) problem(col.density, 'Density must be a number');
      else if (v < 0 || v > 5) problem(col.density, 'Density is between 0 and 5');
      else density = v;
    }
    let reflectance: number | null = null;
    if (col.reflectance && (cells[col.reflectance] ?? '').trim() !== '') {
      const v = number(cells[col.reflectance]);
      const top = mapping.reflectanceIsPercent ? 100 : 1;
      if (Number.isNaN(v)) problem(col.reflectance, 'Reflectance must be a number');
      else if (!(v > 0) || v > top) problem(col.reflectance, mapping.reflectanceIsPercent ? 'Reflectance is a percentage above 0 and up to 100' : 'Reflectance is a fraction above 0 and up to 1');
      else reflectance = mapping.reflectanceIsPercent ? v / 100 : v;
    }
    if (!rowErrors.length && spot) {
      const g = groups.get(spot.id) ?? { spotId: spot.id, readings: [], densities: [], reflectances: [], firstRow: row };
      if (g.readings.length >= MAX_READINGS_PER_SPOT) {
        problem(col.spot!, `At most ${MAX_READINGS_PER_SPOT} readings of one spot per session (from row ${g.firstRow})`);
      } else {
        g.readings.push(lab);
        if (density !== null) g.densities.push(density);
        if (reflectance !== null) g.reflectances.push(reflectance);
        groups.set(spot.id, g);
      }
    }
    errors.push(...rowErrors);
    if (errors.length >= MAX_REPORTED_ERRORS) break;
  }
  if (groups.size > MAX_SPOTS_PER_SESSION) {
    errors.push({ row: 1, column: col.spot!, value: null, message: `At most ${MAX_SPOTS_PER_SESSION} spots per session; the file names ${groups.size}` });
  }
  const mean = (xs: number[]) => (xs.length ? xs.reduce((s, x) => s + x, 0) / xs.length : null);
  const readings: SpotReadingInput[] = [...groups.values()].map((g) => ({
    spotId: g.spotId, readings: g.readings, density: mean(g.densities), densityType: null, reflectance: mean(g.reflectances),
  }));
  return { ...base, readings, errors: errors.slice(0, MAX_REPORTED_ERRORS) };
}
