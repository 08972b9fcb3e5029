import type { Print, PrintInput } from '@toneledger/common/schemas/catalogue';
import type { Role } from '@toneledger/common/domain/roles';
import { mayRead, toCell } from '@toneledger/common/fields/field';
import { ENTERED_PRINT_FIELDS, labelOf, printField } from '@toneledger/common/fields/print';
import { fieldList } from '@/lib/forms/stale-edit';

/**
 * The print form's fields, labels, defaults and values, read from the print field table
 * (common/src/fields/print.ts): a field added there is in the form's state, its stale-edit review and
 * its defaults without a change here. The form's controls are laid out by hand in print-form-fields.tsx.
 */

/** A field the form edits, by its input key (location is set on create, and moved afterwards). */
export type PrintField = Exclude<keyof PrintInput, 'locationId'>;

/** The fields of a print that the form edits, in table order. */
export const PRINT_FIELDS = ENTERED_PRINT_FIELDS.filter((f) => !f.createOnly).map((f) => f.inputKey as PrintField);

/** What the form holds: every field as the text in its control. */
export type PrintFormValues = Record<PrintField | 'locationId', string>;

/** Labels as people read them, with units: "Image width (mm)". */
/** The form's labels, from the print field table (label and unit), so every screen names a field alike. */
export const FIELD_LABELS = Object.fromEntries([...PRINT_FIELDS, 'locationId'].map((key) => [key, labelOf(key)])) as Record<PrintField | 'locationId', string>;

/** The edited fields with their labels, in form order (for the stale-edit review). */
export const PRINT_FORM_FIELDS = fieldList(Object.fromEntries(PRINT_FIELDS.map((f) => [f, FIELD_LABELS[f]])) as Record<PrintField, string>);

/** A new print: every field at the table's default (a process and a status; nothing else). */
export function emptyPrintValues(): PrintFormValues {
  return Object.fromEntries(ENTERED_PRINT_FIELDS.map((f) => [f.inputKey, f.default ?? ''])) as PrintFormValues;
}

/** A saved print as the form's text: a reference by its id, everything else as its CSV cell reads. */
export function printToValues(print: Print): PrintFormValues {
  const record = print as unknown as Record<string, unknown>;
  return Object.fromEntries(
    ENTERED_PRINT_FIELDS.map((f) => [f.inputKey, f.type.kind === 'reference' ? ((record[f.key] as { id: string } | null | undefined)?.id ?? '') : toCell(record[f.key])]),
  ) as PrintFormValues;
}

/**
 * The form's values as the request body. Typed fields go as typed (the schema trims them, reads
 * numbers and turns empty text into null); an empty choice in a list that may be empty is null, and
 * in a list that must be answered (process, status) it is left out, so the schema says so.
 */
export function printValuesToBody(values: PrintFormValues): Record<string, unknown> {
  const body: Record<string, unknown> = { ...values };
  for (const f of ENTERED_PRINT_FIELDS) {
    if (f.type.kind !== 'code' || values[f.inputKey as PrintField] !== '') continue;
    if (f.default) delete body[f.inputKey];
    else body[f.inputKey] = null;
  }
  return body;
}

/**
 * The body without the fields the role may not read (a valuation, for a role without
 * `valuation.read`): the form has no control for them, and saving never sends, so never blanks, them.
 */
export function readableBody(body: Record<string, unknown>, role: Role | null | undefined): Record<string, unknown> {
  const out = { ...body };
  for (const f of ENTERED_PRINT_FIELDS) if (!mayRead(role, f)) delete out[f.inputKey];
  return out;
}

/** How a code field of the form reads to a person: its label. */
export function describeCode(field: PrintField, value: string): string {
  const type = printField(field)?.type;
  return type?.kind === 'code' ? (type.labels[value] ?? value) : value;
}
