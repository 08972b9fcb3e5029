import { parse } from 'csv-parse/sync';
import { readersOf, typeLabel, type FieldSpec } from '@toneledger/common/fields/field';
import { PRINT_FIELDS } from '@toneledger/common/fields/print';
import { STEP_FIELDS } from '@toneledger/common/fields/step';
import { ROLE_LABELS } from '@toneledger/common/domain/roles';
import { RIGHTS_CHOICES } from '@toneledger/common/domain/rights';
import { validationFailed } from '../errors';
import { fromCsvCell, toCsv, type CsvCell } from './csv-cells';

/**
 * The two CSV files of an import as text: reading them (header, rows, note lines) and writing the
 * templates. Both files are read by their field tables (common/src/fields): a column is known when
 * a field names it.
 *
 * Lines above the header whose first cell starts with `#` are notes (the templates carry one per
 * column) and are skipped; below the header every line is data. A data cell written with a leading '
 * because it starts like a formula is read as the text it stands for (csv-cells.ts).
 */

export const MAX_IMPORT_ROWS = 100_000;

export type ImportFile = 'prints' | 'steps';

export interface CsvRow {
  /** The row's number in the file as a spreadsheet counts it (notes and header included). */
  row: number;
  cells: Record<string, string>;
}

export interface CsvIssue {
  file: ImportFile;
  row: number;
  column: string;
  value: string | null;
  message: string;
}

export interface ReadFile {
  header: string[];
  rows: CsvRow[];
  /** Rows that have a different number of cells than the header. */
  issues: CsvIssue[];
}

const FIELDS: Record<ImportFile, readonly FieldSpec[]> = { prints: PRINT_FIELDS, steps: STEP_FIELDS };
const WHAT: Record<ImportFile, string> = { prints: 'prints file', steps: 'steps file' };

/** Columns of a file that an import writes from (entered fields, and the steps file's keys). */
export function importedColumns(file: ImportFile): string[] {
  return FIELDS[file].filter((f) => f.origin === 'entered' || file === 'steps').map((f) => f.column);
}

/**
 * Reads one file: refuses it as a whole (400 on `file`/`steps`) when it is empty, names an unknown
 * column, lacks a required column or has too many rows. Known computed and system columns are accepted.
 */
export function readCsv(source: string, file: ImportFile): ReadFile {
  const field = file === 'prints' ? 'file' : 'steps';
  let records: string[][];
  try {
    records = parse(source, { bom: true, skip_empty_lines: true, relax_column_count: true, trim: false }) as string[][];
  } catch (err) {
    throw validationFailed([{ path: field, message: `The ${WHAT[file]} could not be read as CSV: ${(err as Error).message}`, code: 'csv' }], `The ${WHAT[file]} cannot be imported.`);
  }
  let start = 0;
  while (start < records.length && /^\s*#/.test(records[start][0] ?? '') && records[start].slice(1).every((c) => c.trim() === '')) start++;
  if (start >= records.length) throw validationFailed([{ path: field, message: `The ${WHAT[file]} is empty`, code: 'empty' }], `The ${WHAT[file]} cannot be imported.`);
  const header = records[start].map((h) => h.trim().toLowerCase());
  const known = FIELDS[file].map((f) => f.column);
  const issues = [];
  const unknown = header.filter((h) => !known.includes(h));
  if (unknown.length) issues.push({ path: field, message: `Unknown columns: ${unknown.join(', ')} (in the ${WHAT[file]}). Known: ${known.join(', ')}`, code: 'columns' });
  const repeated = header.filter((h, i) => header.indexOf(h) !== i);
  if (repeated.length) issues.push({ path: field, message: `Columns named twice in the ${WHAT[file]}: ${[...new Set(repeated)].join(', ')}`, code: 'columns' });
  const needed = file === 'prints' ? ['accession_number'] : FIELDS.steps.filter((f) => f.required).map((f) => f.column);
  for (const need of needed) if (!header.includes(need)) issues.push({ path: field, message: `The ${WHAT[file]} needs the column ${need}`, code: 'columns' });
  if (records.length - start - 1 > MAX_IMPORT_ROWS) issues.push({ path: field, message: `At most ${MAX_IMPORT_ROWS} rows per file`, code: 'too_many' });
  if (issues.length) throw validationFailed(issues, `The ${WHAT[file]} cannot be imported.`);

  const rows: CsvRow[] = [];
  const rowIssues: CsvIssue[] = [];
  for (let i = start + 1; i < records.length; i++) {
    const cells = records[i];
    if (cells.every((c) => c.trim() === '')) continue;
    const row = i + 1;
    if (cells.length !== header.length && cells.slice(header.length).some((c) => c.trim() !== '')) {
      rowIssues.push({ file, row, column: '', value: null, message: `This row has ${cells.length} cells; the header has ${header.length}` });
      continue;
    }
    rows.push({ row, cells: Object.fromEntries(header.map((h, k) => [h, fromCsvCell(cells[k] ?? '')])) });
  }
  return { header, rows, issues: rowIssues };
}

// ── Templates ────────────────────────────────────────────────────────────────

const plain = (text: string) => text.replace(/\s+/g, ' ').trim();

function noteFor(f: FieldSpec): string {
  const parts = [`# ${f.column}: ${f.label}${f.unit ? ` (${f.unit})` : ''}.`, f.required ? 'Required.' : 'Optional.', `${typeLabel(f.type)}.`];
  if (f.type.kind === 'code' || f.type.kind === 'codes') parts.push(`Codes: ${f.type.codes.join(' | ')}.`);
  if (f.type.kind === 'rights') parts.push(`Common choices: ${RIGHTS_CHOICES.map((c) => c.uri).join(' | ')}.`);
  if (f.default) parts.push(`Empty: ${f.default}.`);
  if (f.read !== 'catalogue.read') parts.push(`Read only by: ${readersOf(f).map((r) => ROLE_LABELS[r]).join(' | ')}.`);
  parts.push(plain(f.description));
  if (f.importNote) parts.push(plain(f.importNote));
  return parts.join(' ');
}

const INTRO: Record<ImportFile, string[]> = {
  prints: [
    '# Toneledger prints import template. Lines above the header that start with # are notes; an import skips them.',
    '# One row per print. A row whose accession number is already in the catalogue updates that print (choose "create or update" before importing).',
    '# On a new print an empty or missing column takes its default. On an update a missing column leaves the field as it is and an empty cell clears it (or sets the default).',
    '# Process histories go in a second file (the steps template) with one row per step.',
  ],
  steps: [
    '# Toneledger process history template (the steps file). Lines above the header that start with # are notes; an import skips them.',
    '# One row per step: the print by accession number, the step by its place (1, 2, 3…). Each print in the prints file with rows here gets exactly these steps, replacing what it had; a print with no rows here keeps its history.',
  ],
};

/** A field's example as a cell: a number for a numeric field, so it is written as a number. */
function exampleCell(f: FieldSpec): CsvCell {
  const numeric = f.type.kind === 'number' || f.type.kind === 'duration';
  return numeric && f.example.trim() !== '' && Number.isFinite(Number(f.example)) ? Number(f.example) : f.example;
}

/** A template: notes on every column (type, codes, default, who may read it), the header, and an example row. */
export function templateCsv(file: ImportFile): string {
  const fields = FIELDS[file].filter((f) => f.origin === 'entered' || file === 'steps');
  const notes = [...INTRO[file], ...fields.map(noteFor)].map((line) => [line]);
  return toCsv([...notes, fields.map((f) => f.column), fields.map(exampleCell)], { recordDelimiter: 'windows' });
}
