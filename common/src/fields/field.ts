import { z } from 'zod';
import { CURRENCY_CODES } from '../domain/currencies';
import { canonicalRights, RIGHTS_MESSAGE } from '../domain/rights';
import { can, rolesWith, type Role } from '../domain/roles';
import { id } from '../schemas/primitives';

/**
 * A record's fields described once: what people call each one, its CSV column, its type and unit,
 * who may read it, what an import does when it is missing, an example and a description. The
 * contract's schemas, the presenter, the CSV import and export, the template, the data dictionary
 * and the forms' labels are all read from a table of these (see `print.ts`).
 */

/** A controlled list as `schemas/vocab.ts` declares it. */
export interface Vocabulary<C extends string = string> {
  codes: readonly C[];
  labels: Record<C, string>;
}

/** Records a field can point at; an import matches them by name. */
export type ReferenceTo = 'maker' | 'paper' | 'location' | 'enclosure' | 'recipe';

export type FieldType =
  | { kind: 'text'; max: number }
  | { kind: 'long_text'; max: number }
  | { kind: 'number'; min: number; max: number; integer?: boolean }
  | { kind: 'edtf' }
  | { kind: 'code'; vocabulary: string; codes: readonly string[]; labels: Record<string, string> }
  | { kind: 'codes'; vocabulary: string; codes: readonly string[]; labels: Record<string, string> }
  | { kind: 'reference'; to: ReferenceTo; matchedBy: string }
  | { kind: 'currency' }
  | { kind: 'rights' }
  | { kind: 'yes_no' }
  | { kind: 'duration' }
  | { kind: 'id' }
  | { kind: 'timestamp' };

/** entered: typed by a person; computed: derived from other fields; system: kept by the server. */
export type Origin = 'entered' | 'computed' | 'system';

/**
 * The permission that lets a role read a field (the rest of the record needs `catalogue.read`):
 * `catalogue.read_restricted` for staff-only fields, `valuation.read` for insurance valuations.
 */
export type ReadPermission = 'catalogue.read' | 'catalogue.read_restricted' | 'valuation.read';

export interface FieldSpec {
  /** The key in the contract's record (`printSchema`), e.g. `accessionNumber`, `maker`. */
  key: string;
  /** The key in the contract's input (`printInputSchema`) when it differs or exists: `makerId`. Absent for computed and system fields. */
  inputKey?: string;
  /** As people read it, without the unit. */
  label: string;
  /** CSV column, snake_case. */
  column: string;
  type: FieldType;
  /** Unit of a number, shown beside the label. */
  unit?: string;
  read: ReadPermission;
  origin: Origin;
  /** An import refuses a row without it. */
  required: boolean;
  /** What a new record gets when the value is left out (a CSV cell, as written), as the form starts. */
  default: string | null;
  /** A CSV cell that passes the checks. */
  example: string;
  description: string;
  /** What an import does with a computed or system column, or a rule particular to this field. */
  importNote?: string;
  /** Set when the record is created; changed afterwards through its own action (a location: a movement). */
  createOnly?: boolean;
  /** The catalogue list carries it under the same key. */
  list?: boolean;
  /** The catalogue list sorts by it (`sort=key` / `sort=-key`). */
  sort?: boolean;
  /** The contract's input schema of the field. */
  input?: z.ZodType;
  /** The contract's output schema of the field (made optional for restricted fields). */
  output?: z.ZodType;
}

// ── Input and output schemas by kind ─────────────────────────────────────────

const trimmed = (max: number) => z.string().trim().max(max, `At most ${max} characters`);
/** An empty text (or only spaces) is no value. */
export const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);
export const optionalTextInput = (max: number) => z.preprocess(blankToNull, trimmed(max).nullable()).optional();
export const optionalIdInput = z.preprocess((v) => (v === '' ? null : v), id.nullable()).optional();

/** Text that must be given. */
export function requiredText(max: number, message: string) {
  return { type: { kind: 'text', max } as const, required: true, default: null, input: trimmed(max).min(1, message), output: z.string() };
}

/** One line of text, optional. */
export function text(max: number) {
  return { type: { kind: 'text', max } as const, required: false, default: null, input: optionalTextInput(max), output: z.string().nullable() };
}

/** Paragraphs, optional. */
export function longText(max: number) {
  return { type: { kind: 'long_text', max } as const, required: false, default: null, input: optionalTextInput(max), output: z.string().nullable() };
}

/** A date or a range in EDTF (ISO 8601-2), as catalogued. */
export function edtf(describe: string) {
  return { type: { kind: 'edtf' } as const, required: false, default: null, input: optionalTextInput(100).describe(describe), output: z.string().nullable() };
}

/** A length in millimetres, optional. */
export function millimetres() {
  return {
    type: { kind: 'number', min: 0, max: 5000 } as const, unit: 'mm', required: false, default: null,
    input: z.preprocess(
      (v) => (v === '' ? null : v),
      z.coerce.number({ message: 'Enter a number of millimetres' }).positive('Must be more than 0 mm').max(5000, 'At most 5000 mm').nullable(),
    ).optional(),
    output: z.number().nullable(),
  };
}

/** An amount of money, optional. */
export function amount() {
  return {
    type: { kind: 'number', min: 0, max: 1e12 } as const, required: false, default: null,
    input: z.preprocess((v) => (v === '' ? null : v), z.coerce.number().min(0).max(1e12).nullable()).optional(),
    output: z.number().nullable(),
  };
}

/**
 * An ISO 4217 currency code from the list in `domain/currencies.ts`, optional. A code is read in any
 * case and kept in capitals ("gbp" is GBP: the letters of a code carry no meaning in their case);
 * anything else, "POU" or "pounds" or XXX ("no currency"), is refused, never guessed at.
 */
export function currency() {
  return {
    type: { kind: 'currency' } as const, required: false, default: null,
    input: z.preprocess(
      (v) => (typeof v === 'string' ? (v.trim() === '' ? null : v.trim().toUpperCase()) : v),
      z.enum(CURRENCY_CODES, { error: (issue) => `${JSON.stringify(issue.input)} is not an ISO 4217 currency code (such as GBP, EUR or USD)` }).nullable(),
    ).optional(),
    output: z.string().nullable(),
  };
}

/**
 * A rights statement as IIIF Presentation 3.0 takes it in `rights`: one URI of a Creative Commons
 * licence or public-domain tool, or a RightsStatements.org statement (`domain/rights.ts`), optional.
 * A value is kept in its canonical form (http, closing slash: an https address or a deed page is the
 * same licence); anything else, a sentence or another site's address, is refused, never guessed at.
 */
export function rights() {
  return {
    type: { kind: 'rights' } as const, required: false, default: null,
    input: z.preprocess(
      (v) => (typeof v === 'string' ? (v.trim() === '' ? null : canonicalRights(v) ?? v.trim()) : v),
      z.string().max(200, 'At most 200 characters').refine((v) => canonicalRights(v) === v, RIGHTS_MESSAGE).nullable(),
    ).optional(),
    output: z.string().nullable(),
  };
}

const codeType = <C extends string>(vocabulary: string, list: Vocabulary<C>) =>
  ({ kind: 'code', vocabulary, codes: list.codes, labels: list.labels as Record<string, string> }) as const;

/** One code of a controlled list, optional. */
export function code<const C extends readonly [string, ...string[]]>(vocabulary: string, list: Vocabulary<C[number]> & { codes: C }) {
  return {
    type: codeType(vocabulary, list), required: false, default: null,
    input: z.enum(list.codes).nullable().optional(), output: z.enum(list.codes).nullable(),
  };
}

/** One code of a controlled list, never empty: a record left without it gets `fallback`. */
export function codeWithDefault<const C extends readonly [string, ...string[]]>(vocabulary: string, list: Vocabulary<C[number]> & { codes: C }, fallback: C[number]) {
  return {
    type: codeType(vocabulary, list), required: false, default: fallback as string,
    input: z.enum(list.codes).default(fallback as never), output: z.enum(list.codes),
  };
}

/**
 * One code of a controlled list, never empty, that the API asks for every time; the form and an
 * import start from `fallback`.
 */
export function codeAsked<const C extends readonly [string, ...string[]]>(vocabulary: string, list: Vocabulary<C[number]> & { codes: C }, fallback: C[number]) {
  return { type: codeType(vocabulary, list), required: false, default: fallback as string, input: z.enum(list.codes), output: z.enum(list.codes) };
}

/** One code of a controlled list that must be given. */
export function requiredCode<const C extends readonly [string, ...string[]]>(vocabulary: string, list: Vocabulary<C[number]> & { codes: C }) {
  return { type: codeType(vocabulary, list), required: true, default: null, input: z.enum(list.codes), output: z.enum(list.codes) };
}

/** A list of codes (a CSV cell separates them with `;`), computed. */
export function codes<const C extends readonly [string, ...string[]]>(vocabulary: string, list: Vocabulary<C[number]> & { codes: C }) {
  return {
    type: { kind: 'codes', vocabulary, codes: list.codes, labels: list.labels as Record<string, string> } as const,
    required: false, default: null, output: z.array(z.enum(list.codes)),
  };
}

/** Another record, chosen in the form by id and matched by name in a CSV file. */
export function reference<S extends z.ZodType>(to: ReferenceTo, matchedBy: string, output: S) {
  return { type: { kind: 'reference', to, matchedBy } as const, required: false, default: null, input: optionalIdInput, output: output.nullable() };
}

// ── Shapes for the contract ──────────────────────────────────────────────────

/** The input schema's shape: `inputKey → input` of every field that has an input. */
export type InputShape<F extends readonly FieldSpec[]> = {
  [E in F[number] as E extends { inputKey: infer K extends string; input: z.ZodType } ? K : never]: E extends { input: infer S } ? S : never;
};

type Out<E> = E extends { output: infer S extends z.ZodType; read: infer R } ? (R extends 'catalogue.read' ? S : z.ZodOptional<S>) : never;
/** The output schema's shape: `key → output`; fields not every reader may read are optional (left out for roles that may not read them). */
export type OutputShape<F extends readonly FieldSpec[]> = {
  [E in F[number] as E extends { output: z.ZodType } ? E['key'] : never]: Out<E>;
};
/** The catalogue list's shape: the fields marked `list`. */
export type ListShape<F extends readonly FieldSpec[]> = {
  [E in F[number] as E extends { output: z.ZodType; list: true } ? E['key'] : never]: Out<E>;
};

export function inputShape<const F extends readonly FieldSpec[]>(fields: F): InputShape<F> {
  return Object.fromEntries(fields.flatMap((f) => (f.inputKey && f.input ? [[f.inputKey, f.input]] : []))) as InputShape<F>;
}

const outputOf = (f: FieldSpec) => (f.read === 'catalogue.read' ? f.output! : f.output!.optional());

export function outputShape<const F extends readonly FieldSpec[]>(fields: F): OutputShape<F> {
  return Object.fromEntries(fields.flatMap((f) => (f.output ? [[f.key, outputOf(f)]] : []))) as OutputShape<F>;
}

export function listShape<const F extends readonly FieldSpec[]>(fields: F): ListShape<F> {
  return Object.fromEntries(fields.flatMap((f) => (f.output && f.list ? [[f.key, outputOf(f)]] : []))) as ListShape<F>;
}

type SortKey<E> = E extends { sort: true; key: infer K extends string } ? K : never;
/** Keys the list sorts by, in table order. */
export function sortKeys<const F extends readonly FieldSpec[]>(fields: F): SortKey<F[number]>[] {
  return fields.filter((f) => f.sort).map((f) => f.key) as SortKey<F[number]>[];
}

type Nullable<E> = E extends { key: infer K extends string; output: z.ZodNullable<z.ZodType>; read: 'catalogue.read' } ? K : never;
/** Every public field that may be empty, as null: the base of a whole record built by hand (test fixtures). */
export function blankValues<const F extends readonly FieldSpec[]>(fields: F): { [K in Nullable<F[number]>]: null } {
  return Object.fromEntries(fields.filter((f) => f.output instanceof z.ZodNullable && f.read === 'catalogue.read').map((f) => [f.key, null])) as never;
}

// ── Reading the table ────────────────────────────────────────────────────────

/** A field a person enters: it has an input under `inputKey`. */
export type EnteredField = FieldSpec & { origin: 'entered'; inputKey: string; input: z.ZodType; output: z.ZodType };

/** The fields of a table that a person enters (the form, the import), in table order. */
export function enteredFields(fields: readonly FieldSpec[]): readonly EnteredField[] {
  return fields.filter((f): f is EnteredField => f.origin === 'entered' && Boolean(f.inputKey && f.input && f.output));
}

/** May this role read the field? */
export function mayRead(role: Role | null | undefined, field: Pick<FieldSpec, 'read'>): boolean {
  return can(role, field.read);
}

/** Roles that may read the field. */
export function readersOf(field: Pick<FieldSpec, 'read'>): Role[] {
  return rolesWith(field.read);
}

/** The label with its unit, as a form or a column header shows it: "Image width (mm)". */
export function labelWithUnit(field: Pick<FieldSpec, 'label' | 'unit'>): string {
  return field.unit ? `${field.label} (${field.unit})` : field.label;
}

/** A lookup of labels by record key, input key or CSV column; an unknown key reads as itself. */
export function labeller(fields: readonly FieldSpec[], extra: Record<string, string> = {}): (key: string) => string {
  const byKey = new Map<string, string>(Object.entries(extra));
  for (const f of fields) {
    const label = labelWithUnit(f);
    byKey.set(f.key, label);
    if (f.inputKey) byKey.set(f.inputKey, label);
    byKey.set(f.column, label);
  }
  return (key) => byKey.get(key) ?? key;
}

/** What a value reads as in a CSV cell: '' for none, codes joined by `;`, yes/no, numbers as written. */
export function toCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (Array.isArray(value)) return value.map(toCell).join(';');
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (value instanceof Date) return value.toISOString();
  return String(value);
}

/** The code for a cell written as a code or as its label (any case); null for an empty cell, undefined when it is neither. */
export function readCode(list: { codes: readonly string[]; labels: Record<string, string> }, cell: string): string | null | undefined {
  const v = cell.trim().toLowerCase();
  if (!v) return null;
  return list.codes.find((c) => c.toLowerCase() === v || list.labels[c]?.toLowerCase() === v);
}

/** A yes/no cell: yes, no, true, false, 1, 0 (any case); null for an empty cell, undefined when it is neither. */
export function readYesNo(cell: string): boolean | null | undefined {
  const v = cell.trim().toLowerCase();
  if (!v) return null;
  if (['yes', 'true', '1', 'y'].includes(v)) return true;
  if (['no', 'false', '0', 'n'].includes(v)) return false;
  return undefined;
}

/** How a type reads in the data dictionary. */
export function typeLabel(type: FieldType): string {
  switch (type.kind) {
    case 'text': return `Text, one line (at most ${type.max} characters)`;
    case 'long_text': return `Text, paragraphs (at most ${type.max} characters)`;
    case 'number': return type.integer ? 'Whole number' : 'Number';
    case 'edtf': return 'Date (EDTF: a year, a month, a day, approximate or uncertain, or a range)';
    case 'code': return `One code from ${type.vocabulary}`;
    case 'codes': return `Codes from ${type.vocabulary}, separated by ;`;
    case 'reference': return `A ${type.to} in the catalogue, by ${type.matchedBy}`;
    case 'currency': return 'Currency code (ISO 4217, three letters, e.g. GBP, EUR, USD)';
    case 'rights': return 'A rights statement URI (a Creative Commons licence or public-domain tool, or a RightsStatements.org statement)';
    case 'yes_no': return 'yes, no, or empty for unknown';
    case 'duration': return 'Seconds, or minutes and seconds as m:ss';
    case 'id': return 'Record id (UUID)';
    case 'timestamp': return 'Date and time (ISO 8601, UTC)';
  }
}
