import { z } from 'zod';
import { loanConditionsOutputSchema } from './loans';
import { id, isoDate } from './primitives';

/** Contexts in which a print's condition is checked. */
export const CONDITION_CONTEXTS = ['routine', 'incoming', 'outgoing_loan', 'returning_loan', 'before_display', 'after_display', 'after_treatment', 'survey'] as const;
export const CONDITION_CONTEXT_LABELS: Record<(typeof CONDITION_CONTEXTS)[number], string> = {
  routine: 'Routine check', incoming: 'Incoming (acquisition or entry)', outgoing_loan: 'Outgoing loan', returning_loan: 'Returning loan',
  before_display: 'Before display', after_display: 'After display', after_treatment: 'After treatment', survey: 'Collection survey',
};

/** The trade's four-level overall scale. Each level has a written definition, shown in the form (settings can edit them). */
export const GRADES = ['good', 'fair', 'poor', 'unacceptable'] as const;
export type Grade = (typeof GRADES)[number];
export const GRADE_LABELS: Record<Grade, string> = { good: 'Good', fair: 'Fair', poor: 'Poor', unacceptable: 'Unacceptable' };
export const DEFAULT_GRADE_DEFINITIONS: Record<Grade, string> = {
  good: 'Stable. No active deterioration; any old damage is slight and does not change how the image reads. Safe to handle, display and lend.',
  fair: 'Stable, with damage or deterioration that can be seen but does not threaten the object. Can be displayed or lent with care; watch at the next check.',
  poor: 'Damage or active deterioration affects the image or its support, and handling risks further loss. Treat before display or loan.',
  unacceptable: 'Unstable or severely damaged: handling or exposure is likely to cause loss. Withdraw from use; treatment is urgent.',
};

export const ZONE_SIDES = ['recto', 'verso'] as const;
export const ZONE_AREAS = ['image', 'margin', 'edge', 'corner', 'overall'] as const;
export const EXTENTS = ['localised', 'scattered', 'overall', 'percentage'] as const;
export const SEVERITIES = ['slight', 'moderate', 'severe'] as const;

const optionalText = (max: number) => z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? null : v), z.string().trim().max(max).nullable()).optional();

export const conditionTermSchema = z.object({
  code: z.string(), label: z.string(), description: z.string().nullable(), active: z.boolean(), builtIn: z.boolean(),
});
export type ConditionTerm = z.infer<typeof conditionTermSchema>;
export const conditionTermInputSchema = z.object({
  code: z.string().trim().regex(/^[a-z][a-z0-9_]{1,49}$/, 'Lower-case letters, digits and _ (2–50)'),
  label: z.string().trim().min(1).max(100),
  description: optionalText(1000),
});
export const conditionTermUpdateSchema = z.object({ label: z.string().trim().min(1).max(100).optional(), description: optionalText(1000), active: z.boolean().optional() });

export const gradeDefinitionsSchema = z.object(Object.fromEntries(GRADES.map((g) => [g, z.string().trim().min(10).max(1000)])) as Record<Grade, z.ZodString>);
export type GradeDefinitions = z.infer<typeof gradeDefinitionsSchema>;

/** A region drawn on an image, in coordinates normalised to 0–1 of the image's width and height. */
export const regionSchema = z
  .object({
    imageId: id,
    shape: z.enum(['rect', 'polygon']),
    points: z.array(z.tuple([z.number().min(0).max(1), z.number().min(0).max(1)])).min(2).max(200),
  })
  .refine((r) => (r.shape === 'rect' ? r.points.length === 2 : r.points.length >= 3), { message: 'A rectangle has 2 corner points; a polygon at least 3', path: ['points'] });
export type Region = z.infer<typeof regionSchema>;

export const observationInputSchema = z
  .object({
    termCode: z.string().min(1, 'Choose what was observed'),
    side: z.enum(ZONE_SIDES),
    area: z.enum(ZONE_AREAS),
    extent: z.enum(EXTENTS),
    extentPercent: z.preprocess((v) => (v === '' ? null : v), z.coerce.number().min(0).max(100).nullable()).optional(),
    severity: z.enum(SEVERITIES),
    notes: optionalText(2000),
    region: regionSchema.nullable().optional(),
  })
  .superRefine((o, ctx) => {
    if (o.extent === 'percentage' && o.extentPercent == null) ctx.addIssue({ code: 'custom', path: ['extentPercent'], message: 'Give the percentage affected' });
  });
export type ObservationInput = z.infer<typeof observationInputSchema>;

export const observationSchema = z.object({
  id, position: z.number().int(), termCode: z.string(), termLabel: z.string(), side: z.enum(ZONE_SIDES), area: z.enum(ZONE_AREAS),
  extent: z.enum(EXTENTS), extentPercent: z.number().nullable(), severity: z.enum(SEVERITIES), notes: z.string().nullable(), region: regionSchema.nullable(),
});
export type Observation = z.infer<typeof observationSchema>;

export const reportInputSchema = z.object({
  examinedOn: isoDate,
  context: z.enum(CONDITION_CONTEXTS),
  grade: z.enum(GRADES).nullable().optional(),
  summary: optionalText(10000),
  recommendations: optionalText(10000),
  nextCheckOn: isoDate.nullable().optional(),
  observations: z.array(observationInputSchema).max(200).default([]),
  /** The loan the report is made for (outgoing, incoming or returning); the print must be on it. */
  loanId: z.preprocess((v) => (v === '' ? null : v), id.nullable()).optional(),
});
export type ReportInput = z.infer<typeof reportInputSchema>;
/** A partial edit: fields left out stay as they are (observations too: no default here, unlike on create). */
export const reportUpdateSchema = reportInputSchema
  .partial()
  .extend({ observations: z.array(observationInputSchema).max(200).optional(), version: z.number().int().min(1) });

export const addendumInputSchema = z.object({ text: z.string().trim().min(1, 'Write the correction or addition').max(10000) });
export const addendumSchema = z.object({ id, writtenAt: z.string().datetime(), authorName: z.string(), text: z.string() });

/** What a condition report made for a loan prints: who lends, who borrows, where, when, and the agreed conditions. */
export const reportLoanSchema = z.object({
  id, reference: z.string(), direction: z.enum(['out', 'in']), otherInstitution: z.string(), venue: z.string().nullable(),
  lender: z.string(), borrower: z.string(),
  dispatchOn: isoDate.nullable(), opensOn: isoDate.nullable(), closesOn: isoDate.nullable(), returnOn: isoDate.nullable(),
  conditions: loanConditionsOutputSchema,
});
export type ReportLoan = z.infer<typeof reportLoanSchema>;

export const reportSchema = z.object({
  id, printId: id, accessionNumber: z.string(), printTitle: z.string(),
  examinedOn: isoDate, examinerId: id.nullable(), examinerName: z.string(), context: z.enum(CONDITION_CONTEXTS), grade: z.enum(GRADES).nullable(),
  summary: z.string().nullable(), recommendations: z.string().nullable(), nextCheckOn: isoDate.nullable(),
  status: z.enum(['draft', 'signed']), signedAt: z.string().datetime().nullable(),
  observations: z.array(observationSchema), addenda: z.array(addendumSchema),
  /** The loan the report was made for, with what the printed loan report fills in; null for any other report. */
  loan: reportLoanSchema.nullable(),
  version: z.number().int(), createdAt: z.string().datetime(), updatedAt: z.string().datetime(),
});
export type ConditionReport = z.infer<typeof reportSchema>;

/** One report as a line of a work list: no observations or addenda. */
export const reportSummarySchema = reportSchema.pick({
  id: true, printId: true, accessionNumber: true, printTitle: true, examinedOn: true, examinerName: true, context: true, grade: true,
  status: true, signedAt: true, updatedAt: true,
});
export type ReportSummary = z.infer<typeof reportSummarySchema>;

/** What the condition area opens on: the signed-in person's drafts and signed reports, and the latest reports by anyone. */
export const conditionWorkSchema = z.object({
  myDrafts: z.array(reportSummarySchema),
  mySigned: z.array(reportSummarySchema),
  recent: z.array(reportSummarySchema),
});
export type ConditionWork = z.infer<typeof conditionWorkSchema>;

/** The condition settings: the written definition of each overall grade. */
export const conditionSettingsSchema = z.object({ grades: gradeDefinitionsSchema });
