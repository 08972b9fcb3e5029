import { z } from 'zod';
import { id, idParamsSchema, isoDateTime } from './primitives';
export { idParamsSchema };
import { inputShape, listShape, outputShape, sortKeys } from '../fields/field';
import { PRINT_FIELDS } from '../fields/print';
import { STEP_FIELDS } from '../fields/step';
import { pageQuerySchema } from './envelope';
import {
  INGREDIENT_UNIT, LIGHT_RESPONSIVITY, LOCATION_KIND, PAPER_BASE, PAT_RESULT, PROCESS, STATUS, STEP_TYPE, SUPPORT, TONER_CLASS,
  YES_NO_UNKNOWN,
} from './vocab';

const text = (max: number) => z.string().trim().max(max, `At most ${max} characters`);
const optionalText = (max: number) =>
  z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? null : v), text(max).nullable()).optional();
const optionalId = z.preprocess((v) => (v === '' ? null : v), id.nullable()).optional();
const version = z.number({ message: 'The record version is required' }).int().min(1);

export const processSchema = z.enum(PROCESS.codes);
export const supportSchema = z.enum(SUPPORT.codes);
export const statusSchema = z.enum(STATUS.codes);
export const lightResponsivitySchema = z.enum(LIGHT_RESPONSIVITY.codes);
export const tonerClassSchema = z.enum(TONER_CLASS.codes);
export const stepTypeSchema = z.enum(STEP_TYPE.codes);

/** A warning computed from the record (see domain/compatibility). */
export const warningSchema = z.object({
  code: z.string(),
  severity: z.enum(['high', 'medium', 'low']),
  message: z.string(),
  basis: z.string(),
});
export type Warning = z.infer<typeof warningSchema>;

// ── Makers ───────────────────────────────────────────────────────────────────
export const makerInputSchema = z.object({
  name: text(300).min(1, 'Enter a name'),
  lifeDates: optionalText(100),
  notes: optionalText(5000),
});
export const makerUpdateSchema = makerInputSchema.partial().extend({ version });
export const makerSchema = z.object({
  id, name: z.string(), lifeDates: z.string().nullable(), notes: z.string().nullable(), printCount: z.number().int(), version: z.number().int(),
});
export type Maker = z.infer<typeof makerSchema>;

// ── Papers ───────────────────────────────────────────────────────────────────
export const paperInputSchema = z.object({
  manufacturer: text(200).min(1, 'Enter the manufacturer as written on the packet'),
  product: text(200).min(1, 'Enter the product name'),
  base: z.enum(PAPER_BASE.codes),
  surface: optionalText(100),
  baseTint: optionalText(100),
  weight: optionalText(100),
  opticalBrighteners: z.enum(YES_NO_UNKNOWN.codes).default('unknown'),
  madeDates: optionalText(100).describe('EDTF date or interval of manufacture'),
  notes: optionalText(5000),
});
export const paperUpdateSchema = paperInputSchema.partial().extend({ version });
export const paperSchema = z.object({
  id, label: z.string(), manufacturer: z.string(), product: z.string(), base: z.enum(PAPER_BASE.codes),
  surface: z.string().nullable(), baseTint: z.string().nullable(), weight: z.string().nullable(),
  opticalBrighteners: z.enum(YES_NO_UNKNOWN.codes), madeDates: z.string().nullable(), madeDisplay: z.string().nullable(),
  notes: z.string().nullable(), printCount: z.number().int(), version: z.number().int(),
});
export type Paper = z.infer<typeof paperSchema>;

// ── Bath recipes ─────────────────────────────────────────────────────────────
export const ingredientSchema = z.object({
  chemical: text(200).min(1, 'Name the chemical'),
  amount: z.coerce.number({ message: 'Enter an amount' }).positive('Must be more than 0'),
  unit: z.enum(INGREDIENT_UNIT.codes),
  strengthPercent: z.preprocess((v) => (v === '' ? null : v), z.coerce.number().gt(0, 'Above 0 %').max(100, 'At most 100 %').nullable()).optional(),
  densityGPerMl: z.preprocess((v) => (v === '' ? null : v), z.coerce.number().positive().max(25).nullable()).optional(),
});
export type IngredientInput = z.infer<typeof ingredientSchema>;
export const recipeInputSchema = z.object({
  name: text(200).min(1, 'Name the recipe'),
  tonerClass: tonerClassSchema.nullable().optional(),
  volumeMl: z.coerce.number({ message: 'Enter the final volume in ml' }).positive('Must be more than 0 ml').max(1_000_000),
  ingredients: z.array(ingredientSchema).min(1, 'Add at least one ingredient').max(40),
  mixingNotes: optionalText(5000),
});
export const recipeUpdateSchema = recipeInputSchema.partial().extend({ version });
export const normalisedIngredientSchema = z.object({
  chemical: z.string(), givenAs: z.string(), gramsPerLitre: z.number().nullable(), mlPerLitre: z.number().nullable(),
  pureGramsPerLitre: z.number().nullable(), note: z.string().optional(),
});
export const recipeSchema = z.object({
  id, name: z.string(), tonerClass: tonerClassSchema.nullable(), volumeMl: z.number(),
  ingredients: z.array(ingredientSchema), mixingNotes: z.string().nullable(),
  normalised: z.array(normalisedIngredientSchema),
  cautions: z.array(z.object({ code: z.string(), text: z.string() })),
  stepCount: z.number().int(), version: z.number().int(),
});
export type Recipe = z.infer<typeof recipeSchema>;

// ── Locations and enclosures ─────────────────────────────────────────────────
export const locationInputSchema = z.object({
  name: text(200).min(1, 'Name the place'),
  kind: z.enum(LOCATION_KIND.codes),
  parentId: optionalId,
  code: optionalText(50),
  notes: optionalText(2000),
});
export const locationUpdateSchema = locationInputSchema.partial().extend({ version });
export const locationSchema = z.object({
  id, name: z.string(), kind: z.enum(LOCATION_KIND.codes), parentId: z.string().uuid().nullable(), code: z.string().nullable(),
  notes: z.string().nullable(), path: z.array(z.string()), pathLabel: z.string(), depth: z.number().int(),
  /** Prints stored here and in every place inside (a room's count adds up its cabinets and drawers). */
  printCount: z.number().int(), version: z.number().int(),
});
export type Location = z.infer<typeof locationSchema>;

export const enclosureInputSchema = z.object({
  name: text(200).min(1, 'Name the enclosure type'),
  material: optionalText(300),
  alkalineBuffered: z.boolean().nullable().describe('true = buffered, false = unbuffered, null = unknown'),
  patResult: z.enum(PAT_RESULT.codes),
  notes: optionalText(2000),
});
export const enclosureUpdateSchema = enclosureInputSchema.partial().extend({ version });
export const enclosureSchema = z.object({
  id, name: z.string(), material: z.string().nullable(), alkalineBuffered: z.boolean().nullable(), patResult: z.enum(PAT_RESULT.codes),
  notes: z.string().nullable(), printCount: z.number().int(), version: z.number().int(),
});
export type Enclosure = z.infer<typeof enclosureSchema>;

export const referenceListQuerySchema = pageQuerySchema.extend({
  q: z.string().trim().max(200).optional(),
  pageSize: z.coerce.number().int().min(1).max(1000).default(200),
});

// ── Process steps ────────────────────────────────────────────────────────────
/** A step of the process history: its fields are the step field table's (fields/step.ts). */
export const processStepInputSchema = z
  .object(inputShape(STEP_FIELDS))
  .superRefine((s, ctx) => {
    if (s.type === 'toning' && !s.tonerClass) ctx.addIssue({ code: 'custom', path: ['tonerClass'], message: 'A toning step needs its toner class' });
    if (s.type !== 'toning' && (s.tonerClass || s.extent)) ctx.addIssue({ code: 'custom', path: ['tonerClass'], message: 'Toner and extent belong to toning steps' });
    if (s.type === 'residual_thiosulfate_test') {
      if (!s.method) ctx.addIssue({ code: 'custom', path: ['method'], message: 'Name the test method' });
      if (s.value != null && !s.unit) ctx.addIssue({ code: 'custom', path: ['unit'], message: 'Give the unit of the measured value' });
    } else if (s.method) ctx.addIssue({ code: 'custom', path: ['method'], message: 'A method belongs to a residual-thiosulfate test' });
  });
export type ProcessStepInput = z.infer<typeof processStepInputSchema>;
export const processStepSchema = z.object({ id, ...outputShape(STEP_FIELDS) });
export type ProcessStep = z.infer<typeof processStepSchema>;
export const stepsReplaceSchema = z.object({ version, steps: z.array(processStepInputSchema).max(60) });

// ── Prints ───────────────────────────────────────────────────────────────────
/** The fields of a print come from the print field table (fields/print.ts): label, CSV column, who may read it, input and output. */
export const printInputSchema = z.object(inputShape(PRINT_FIELDS));
export type PrintInput = z.infer<typeof printInputSchema>;
export const printUpdateSchema = printInputSchema.omit({ locationId: true }).partial().extend({ version });
export type PrintUpdate = z.infer<typeof printUpdateSchema>;

export const printSchema = z.object({
  ...outputShape(PRINT_FIELDS),
  dateDisplay: z.string().nullable(), dateEarliest: z.string().nullable(), dateLatest: z.string().nullable(),
  warnings: z.array(warningSchema),
  steps: z.array(processStepSchema),
  version: z.number().int(), createdAt: z.string().datetime(),
});
export type Print = z.infer<typeof printSchema>;

/** Sort orders of the list: the fields the table marks `sort`. */
export const PRINT_SORTS = sortKeys(PRINT_FIELDS);
export const printSortSchema = z.enum([...PRINT_SORTS, ...PRINT_SORTS.map((s) => `-${s}` as const)] as [string, ...string[]]);

export const printListQuerySchema = pageQuerySchema.extend({
  q: z.string().trim().max(200).optional(),
  sort: printSortSchema.default('accessionNumber'),
  process: processSchema.optional(),
  support: supportSchema.optional(),
  status: statusSchema.optional(),
  tonerClass: tonerClassSchema.optional(),
  lightResponsivity: lightResponsivitySchema.optional(),
  makerId: id.optional(),
  paperId: id.optional(),
  enclosureId: id.optional(),
  locationId: id.optional().describe('This place and everything inside it'),
  hasWarnings: z.enum(['true', 'false']).optional(),
  madeFrom: z.coerce.number().int().min(1800).max(2200).optional().describe('Year: made no earlier than'),
  madeTo: z.coerce.number().int().min(1800).max(2200).optional().describe('Year: made no later than'),
  /** The collection's own prints (the default), prints lent to it on a loan in, or both. */
  holding: z.enum(['collection', 'borrowed', 'all']).default('collection').describe('collection (default): borrowed prints hidden; borrowed: only those; all'),
});
export type PrintListQuery = z.infer<typeof printListQuerySchema>;

export const printListItemSchema = z.object({
  ...listShape(PRINT_FIELDS),
  makerName: z.string().nullable(), dateDisplay: z.string().nullable(), paperLabel: z.string().nullable(),
  enclosureName: z.string().nullable(), warningCodes: z.array(z.string()),
  locationLabel: z.string().nullable().optional(),
  /** The latest recto image with a thumbnail (captured last, then uploaded last), for the list's thumbnail column. */
  thumbImageId: z.string().uuid().nullable().optional(),
});
export type PrintListItem = z.infer<typeof printListItemSchema>;

/** 409 details when someone saved in between: the record as it is now, and who saved it last. */
export const staleEditDetailsSchema = z.object({
  current: z.unknown(),
  lastChangedBy: z.string().nullable(),
  lastChangedAt: z.string().datetime().nullable(),
});

// ── Movements ────────────────────────────────────────────────────────────────
export const movementInputSchema = z.object({
  toLocationId: id,
  reason: text(500).min(1, 'Say why the print moves'),
  movedAt: isoDateTime.optional(),
  version,
});
export const movementSchema = z.object({
  id, from: z.object({ id, pathLabel: z.string() }).nullable(), to: z.object({ id, pathLabel: z.string() }),
  movedAt: z.string().datetime(), movedBy: z.string().nullable(), reason: z.string(),
});
export type Movement = z.infer<typeof movementSchema>;

// ── Settings ─────────────────────────────────────────────────────────────────
export const catalogueSettingsSchema = z.object({
  accessionPattern: z.string().trim().min(1).max(200),
  institutionName: z.string().trim().min(1).max(300),
});
export type CatalogueSettings = z.infer<typeof catalogueSettingsSchema>;

// ── Imports ──────────────────────────────────────────────────────────────────
/** create_only: every row must be a new print. create_or_update: a row whose accession number is in the catalogue updates that print. */
export const importModeSchema = z.enum(['create_only', 'create_or_update']);
export type ImportMode = z.infer<typeof importModeSchema>;
/** The two files of an import: the prints, and (optionally) their process histories, one step per row. */
export const importFileSchema = z.enum(['prints', 'steps']);
export const importStatusSchema = z.enum(['validating', 'ready', 'invalid', 'committing', 'committed', 'failed']);
export const importIssueSchema = z.object({
  file: importFileSchema, row: z.number().int(), column: z.string(), value: z.string().nullable(), message: z.string(),
});
export const importSchema = z.object({
  id, fileName: z.string(), stepsFileName: z.string().nullable(), status: importStatusSchema,
  totalRows: z.number().int(), processedRows: z.number().int(), stepRows: z.number().int(),
  errorCount: z.number().int(), errors: z.array(importIssueSchema), newMakers: z.array(z.string()),
  /** What the checked file would do: rows that create a print, update one, or match one exactly. */
  toCreate: z.number().int(), toUpdate: z.number().int(), unchanged: z.number().int(),
  /** Columns read but not imported: computed or kept by the server (see the data dictionary). */
  ignoredColumns: z.array(z.string()),
  /** The mode chosen when the import was confirmed. */
  mode: importModeSchema.nullable(),
  createdPrints: z.number().int(), updatedPrints: z.number().int(),
  message: z.string().nullable(), createdAt: z.string().datetime(), finishedAt: z.string().datetime().nullable(),
});
export type ImportJob = z.infer<typeof importSchema>;

export const importRowActionSchema = z.enum(['create', 'update', 'unchanged']);
export const importChangeSchema = z.object({ field: z.string(), label: z.string(), before: z.string(), after: z.string() });
/** One row of a checked file: what it does, and for an update each field that changes (as CSV text). */
export const importRowSchema = z.object({
  row: z.number().int(), accessionNumber: z.string(), action: importRowActionSchema, changes: z.array(importChangeSchema),
});
export type ImportRow = z.infer<typeof importRowSchema>;
export const importRowsQuerySchema = pageQuerySchema.extend({ action: importRowActionSchema.optional() });
export type ImportRowsQuery = z.infer<typeof importRowsQuerySchema>;
export const importCommitSchema = z.object({ mode: importModeSchema.default('create_only') });
export const importTemplateQuerySchema = z.object({ file: importFileSchema.default('prints') });

export const historyEventSchema = z.object({
  id: z.string(), at: z.string().datetime(), actorName: z.string().nullable(), action: z.string(),
  summary: z.string(), changes: z.array(z.object({ field: z.string(), before: z.unknown(), after: z.unknown() })),
});
export type HistoryEvent = z.infer<typeof historyEventSchema>;
