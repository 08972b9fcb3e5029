import { stringify } from 'csv-stringify/sync';
import { toCell } from '@toneledger/common/fields/field';

/**
 * Every CSV file the product writes goes through `toCsv`, and the import reads cells back with
 * `fromCsvCell`.
 *
 * A spreadsheet runs a cell that starts with = + - @ (or a tab, a carriage return, or a full-width
 * ＝ ＋ － ＠) as a formula, so text that starts like that is written with a single quote in front
 * (`=SUM(A1)` → `'=SUM(A1)`), which a spreadsheet shows as text. Numbers are written as they are (`-2` stays `-2`).
 *
 * So that every text reads back as it was, text that already starts with quotes followed by one of
 * those characters gets one more (`'=x` → `''=x`); reading takes one quote off a cell that starts
 * with quotes followed by one of those characters, and leaves every other cell as it is (`'plain`
 * stays `'plain`). A person who types a leading `'=` into an import file and means to keep it
 * writes `''=`.
 */

/** What a cell holds: text (escaped when a spreadsheet would run it), a number (never escaped), or nothing. */
export type CsvCell = string | number | null | undefined;

// = + - @, tab and carriage return, and the full-width = + - @ that some spreadsheets read as the plain ones.
const RUNS_AS_FORMULA = /^'*[=+\-@\t\r\uFF1D\uFF0B\uFF0D\uFF20]/;
const ESCAPED = /^'+[=+\-@\t\r\uFF1D\uFF0B\uFF0D\uFF20]/;

/** Text as written to a CSV cell: a leading ' when a spreadsheet would run it as a formula. */
export function toCsvText(text: string): string {
  return RUNS_AS_FORMULA.test(text) ? `'${text}` : text;
}

/** A cell of a CSV file as the text it stands for (the inverse of `toCsvText`). */
export function fromCsvCell(cell: string): string {
  return ESCAPED.test(cell) ? cell.slice(1) : cell;
}

/** Rows as CSV text (RFC 4180): numbers as written, text neutralised by `toCsvText`. */
export function toCsv(rows: readonly (readonly CsvCell[])[], options: { recordDelimiter?: 'unix' | 'windows' } = {}): string {
  const cells = rows.map((row) => row.map((c) => (typeof c === 'number' ? toCell(c) : c === null || c === undefined ? '' : toCsvText(c))));
  // A cell with a line break is always quoted (csv-stringify leaves a lone \n unquoted when records end in \r\n).
  return stringify(cells, { record_delimiter: options.recordDelimiter ?? 'unix', quoted_match: /[\r\n]/ });
}
