import { z } from 'zod';
import { pageQuerySchema } from './envelope';
import { id, isoDate } from './primitives';

/**
 * Exhibitions and the periods a print spends on display. Every display period belongs to one
 * exhibition (an in-house rotation is an exhibition too, and a loan out for display names the
 * borrower's exhibition), so the light a print receives is summed from one table.
 */

const text = (max: number) => z.string().trim().max(max, `At most ${max} characters`);
const optionalText = (max: number) =>
  z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? null : v), text(max).nullable()).optional();
const version = z.number({ message: 'The record version is required' }).int().min(1);
const userRef = z.object({ id, name: z.string() });

/** ISO weekdays, 1 = Monday … 7 = Sunday. */
export const WEEKDAYS = [1, 2, 3, 4, 5, 6, 7] as const;
export const WEEKDAY_LABELS: Record<number, string> = { 1: 'Mon', 2: 'Tue', 3: 'Wed', 4: 'Thu', 5: 'Fri', 6: 'Sat', 7: 'Sun' };

// ── Exhibitions and venues ───────────────────────────────────────────────────
export const venueInputSchema = z
  .object({
    /** Kept when editing an existing venue, absent for a new one. */
    id: id.optional(),
    name: text(300).min(1, 'Name the venue'),
    place: optionalText(300),
    opensOn: isoDate,
    closesOn: isoDate,
  })
  .refine((v) => v.closesOn >= v.opensOn, { path: ['closesOn'], message: 'The venue closes on or after the day it opens' });
export const venueSchema = z.object({ id, name: z.string(), place: z.string().nullable(), opensOn: isoDate, closesOn: isoDate });

export const exhibitionInputSchema = z.object({
  title: text(500).min(1, 'Give the exhibition a title'),
  organiser: optionalText(300),
  summary: optionalText(5000),
  /** A touring show has several venues, in order; the list replaces the previous one on edit. */
  venues: z.array(venueInputSchema).min(1, 'Add at least one venue with its dates').max(30),
});
export const exhibitionUpdateSchema = exhibitionInputSchema.partial().extend({ version });

export const APPROVAL = ['pending', 'approved', 'refused'] as const;
export const APPROVAL_LABELS: Record<(typeof APPROVAL)[number], string> = {
  pending: 'Waiting for a conservator', approved: 'Approved for display', refused: 'Refused for display',
};

// ── Display periods ──────────────────────────────────────────────────────────
const displayConditionsShape = {
  /** Illuminance on the object, lux. */
  lux: z.number().min(0, 'Illuminance cannot be negative').max(100000, 'At most 100,000 lux'),
  hoursPerDay: z.number().gt(0, 'More than 0 hours a day').max(24, 'At most 24 hours a day'),
  /** The days of the week the room is open (ISO weekdays); all seven when absent. */
  daysOpen: z.array(z.number().int().min(1).max(7)).min(1, 'Open at least one day a week').max(7).optional(),
  /** Extra closed days inside the period (holidays). */
  closedDates: z.array(isoDate).max(400).optional(),
  /** Ultraviolet content of the light, µW/lm, when measured. */
  uvMicrowattsPerLumen: z.number().min(0).max(10000).nullable().optional(),
  caseOrFrame: optionalText(300),
  mountNotes: optionalText(2000),
};

export const displayInputSchema = z
  .object({
    printId: id,
    venueId: id.nullable().optional(),
    startsOn: isoDate,
    endsOn: isoDate,
    ...displayConditionsShape,
  })
  .refine((v) => v.endsOn >= v.startsOn, { path: ['endsOn'], message: 'The display ends on or after the day it starts' });
export const displayUpdateSchema = z
  .object({ venueId: id.nullable(), startsOn: isoDate, endsOn: isoDate, ...displayConditionsShape })
  .partial()
  .extend({ version })
  .refine((v) => !v.startsOn || !v.endsOn || v.endsOn >= v.startsOn, { path: ['endsOn'], message: 'The display ends on or after the day it starts' });

export const displaySchema = z.object({
  id, printId: id, accessionNumber: z.string(), printTitle: z.string(),
  exhibitionId: id, exhibitionTitle: z.string(), venueId: id.nullable(), venueName: z.string().nullable(),
  startsOn: isoDate, endsOn: isoDate, lux: z.number(), hoursPerDay: z.number(), daysOpen: z.array(z.number().int()),
  closedDates: z.array(isoDate), uvMicrowattsPerLumen: z.number().nullable(), caseOrFrame: z.string().nullable(), mountNotes: z.string().nullable(),
  /** Lux-hours of the whole period. */
  luxHours: z.number(),
  version: z.number().int(),
});
export type Display = z.infer<typeof displaySchema>;

/** A print on an exhibition's object list, with the conservator's decision and its light figures. */
export const exhibitionObjectSchema = z.object({
  printId: id, accessionNumber: z.string(), printTitle: z.string(), thumbnailUrl: z.string().nullable(),
  lightResponsivity: z.string(),
  approval: z.enum(APPROVAL), approvalReason: z.string().nullable(), approvedBy: userRef.nullable(), approvedAt: z.string().datetime().nullable(),
  displays: z.array(displaySchema),
  /** Lux-hours this exhibition gives the print. */
  luxHours: z.number(),
  /** What is left of the print's annual budget for the year the exhibition opens, after it (null: no budget for the category). */
  budgetLeftLuxHours: z.number().nullable(),
  /** The ΔE00 the exhibition is expected to add, from the print's light-cost fit, when it has one. */
  expectedDeltaE00: z.number().nullable(),
  warnings: z.array(z.object({ code: z.string(), message: z.string() })),
});

export const exhibitionSchema = z.object({
  id, title: z.string(), organiser: z.string().nullable(), summary: z.string().nullable(),
  venues: z.array(venueSchema), opensOn: isoDate, closesOn: isoDate,
  objectCount: z.number().int(),
  version: z.number().int(), createdAt: z.string().datetime(), updatedAt: z.string().datetime(),
});
export type Exhibition = z.infer<typeof exhibitionSchema>;
export const exhibitionDetailSchema = exhibitionSchema.extend({ objects: z.array(exhibitionObjectSchema) });
export type ExhibitionDetail = z.infer<typeof exhibitionDetailSchema>;

export const exhibitionListQuerySchema = pageQuerySchema.extend({
  q: z.string().trim().max(200).optional(),
  /** current: open today; coming: opens after today; past: closed before today. */
  when: z.enum(['current', 'coming', 'past']).optional(),
});

export const exhibitionObjectInputSchema = z.object({ printIds: z.array(id).min(1, 'Choose at least one print').max(500), version });
export const approvalInputSchema = z
  .object({ decision: z.enum(['approved', 'refused']), reason: optionalText(2000) })
  .refine((v) => v.decision === 'approved' || (v.reason ?? '').length > 0, { path: ['reason'], message: 'Say why the print may not be shown' });
