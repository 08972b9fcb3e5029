import { toCell, type FieldSpec, type ReferenceTo } from '@toneledger/common/fields/field';
import type { CsvCell } from './csv-cells';

/**
 * Prints and steps as CSV cells, read from database rows by the field tables (common/src/fields):
 * the export writes these cells, and an import compares a file's cells with them to show what an
 * update changes. A field's column is its key in snake_case (the model is `underscored`); references
 * read the name the row carries, and the two computed columns have their own names.
 */

/** Rows of prints with the names their references are read by. */
export const PRINT_ROWS_SQL = `SELECT p.*, e.name AS enclosure_name, l.path_label AS location_label
  FROM prints p LEFT JOIN enclosure_types e ON e.id = p.enclosure_id LEFT JOIN locations l ON l.id = p.location_id`;

/** Rows of steps with their print's accession number and their recipe's name. */
export const STEP_ROWS_SQL = `SELECT s.*, p.accession_number, r.name AS recipe_name
  FROM process_steps s JOIN prints p ON p.id = s.print_id LEFT JOIN bath_recipes r ON r.id = s.recipe_id`;

export type DbRow = Record<string, unknown>;

const REFERENCE_NAME: Record<ReferenceTo, string> = {
  maker: 'maker_name', paper: 'paper_label', location: 'location_label', enclosure: 'enclosure_name', recipe: 'recipe_name',
};
const COLUMN_OF: Record<string, string> = { tonerClasses: 'toner_classes', warnings: 'warning_codes' };

export const snakeCase = (key: string) => key.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`);

/** The value of a field in a database row (numbers as numbers, times as ISO text, references as names). */
export function valueInRow(field: FieldSpec, row: DbRow): unknown {
  const raw = field.type.kind === 'reference' ? row[REFERENCE_NAME[field.type.to]] : row[COLUMN_OF[field.key] ?? snakeCase(field.key)];
  if (raw === null || raw === undefined) return null;
  if (field.type.kind === 'number' || field.type.kind === 'duration') return Number(raw);
  if (field.type.kind === 'timestamp') return new Date(raw as string).toISOString();
  return raw;
}

/** The CSV cell of a field in a database row. */
export function cellInRow(field: FieldSpec, row: DbRow): string {
  return toCell(valueInRow(field, row));
}

/** The cell an export writes (through `toCsv`): a number stays a number, so it is never escaped as text. */
export function exportCellInRow(field: FieldSpec, row: DbRow): CsvCell {
  const value = valueInRow(field, row);
  return typeof value === 'number' ? value : toCell(value);
}
