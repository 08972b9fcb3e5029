import type { Writable } from 'node:stream';
import type { DictionaryEntry } from '@toneledger/common/schemas/exports';
import { toCsv, type CsvCell } from '../csv-cells';

/**
 * The columns of an export, listed once: the CSV header, each cell and the data dictionary all come
 * from the same list, so the dictionary cannot drift from the file it describes.
 */
export type ColumnType = 'text' | 'number' | 'integer' | 'date' | 'date-time' | 'code' | 'yes/no' | 'id';

export interface ExportColumn<R> {
  /** The CSV column, snake_case. */
  name: string;
  /** What the column holds, in a sentence. */
  meaning: string;
  type: ColumnType;
  unit?: string;
  /** Where the value comes from: the record and field it is read from, or how it is computed. */
  source: string;
  /** The cell of one row (numbers stay numbers; text goes through the formula rule of csv-cells.ts). */
  cell: (row: R) => CsvCell;
}

/** The byte-order mark every exported CSV starts with, so a spreadsheet opened by double-click reads UTF-8. */
export const BOM = '\uFEFF';

/** The data dictionary of a column list: one entry per column, in the file's order. */
export function dictionaryOf(columns: readonly ExportColumn<never>[]): DictionaryEntry[] {
  return columns.map((c) => ({ column: c.name, meaning: c.meaning, type: c.type, unit: c.unit ?? null, source: c.source }));
}

const DICTIONARY_HEADER = ['column', 'meaning', 'type', 'unit', 'source'] as const;

/** The data dictionary as CSV (BOM, one row per column of the export). */
export function dictionaryCsv(columns: readonly ExportColumn<never>[]): string {
  return BOM + toCsv([[...DICTIONARY_HEADER], ...dictionaryOf(columns).map((e) => DICTIONARY_HEADER.map((k) => e[k]))]);
}

/** Writes text, waiting for the socket to drain when its buffer is full (memory stays flat). */
export async function writeOut(out: Writable, text: string): Promise<void> {
  if (!out.write(text)) await new Promise((resolve) => out.once('drain', resolve));
}

/** Streams a CSV: BOM and header, then each batch of rows as it comes. Returns the number of rows. */
export async function streamCsv<R>(out: Writable, columns: readonly ExportColumn<R>[], batches: AsyncIterable<readonly R[]> | Iterable<readonly R[]>): Promise<number> {
  await writeOut(out, BOM + toCsv([columns.map((c) => c.name)]));
  let n = 0;
  for await (const batch of batches) {
    if (!batch.length) continue;
    await writeOut(out, toCsv(batch.map((r) => columns.map((c) => c.cell(r)))));
    n += batch.length;
  }
  return n;
}

/** Streams a JSON document `{ ...head, [key]: [ item, item, … ] }`, one batch of items at a time. */
export async function streamJsonArray(out: Writable, head: Record<string, unknown>, key: string, batches: AsyncIterable<readonly unknown[]> | Iterable<readonly unknown[]>): Promise<number> {
  const opening = JSON.stringify({ ...head, [key]: [] });
  await writeOut(out, opening.slice(0, -2));
  let n = 0;
  for await (const batch of batches) {
    for (const item of batch) {
      await writeOut(out, (n ? ',' : '') + JSON.stringify(item));
      n++;
    }
  }
  await writeOut(out, ']}');
  return n;
}

/** A calendar date or a moment as ISO 8601: `YYYY-MM-DD` stays as it is, a Date becomes `…Z`. */
export function isoCell(value: string | Date | null | undefined): string | null {
  if (value === null || value === undefined) return null;
  return typeof value === 'string' ? value : value.toISOString();
}

/** Yes/no as the print CSV writes it. */
export function yesNo(value: boolean | null | undefined): string | null {
  return value === null || value === undefined ? null : value ? 'yes' : 'no';
}

/** A file name part from a record's label (accession numbers hold dots and slashes). */
export function fileSafe(text: string): string {
  return text.replace(/[^A-Za-z0-9._-]/g, '_');
}
