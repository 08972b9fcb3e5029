import { z } from 'zod';
import { id, isoDate } from './primitives';

/** Colour and density measurements at registered spots of a print, over the years. */
export const SPOT_PURPOSES = ['dmax', 'mid_tone', 'highlight', 'paper_base'] as const;
export const SPOT_PURPOSE_LABELS: Record<(typeof SPOT_PURPOSES)[number], string> = {
  dmax: 'Maximum density area', mid_tone: 'Mid-tone', highlight: 'Highlight', paper_base: 'Paper base (margin)',
};
export const ILLUMINANTS = ['D50', 'D65'] as const;
export const OBSERVERS = ['2', '10'] as const;
export const GEOMETRIES = ['45/0', '0/45', 'd/8'] as const;
export const MEASUREMENT_CONDITIONS = ['M0', 'M1', 'M2', 'M3'] as const;
export const DENSITY_TYPES = ['visual', 'status_a'] as const;

const optionalText = (max: number) => z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? null : v), z.string().trim().max(max).nullable()).optional();
const n = (message: string) => z.number({ message });
/**
 * Accepts a number, or a string holding one (forms and CSV cells send strings). Unlike
 * z.coerce.number, an empty string, null or a boolean is refused rather than read as 0 or 1.
 */
const fromText = <T extends z.ZodType>(schema: T) =>
  z.preprocess((v) => (typeof v === 'string' && v.trim() !== '' ? Number(v.trim()) : v), schema);

export const labReadingSchema = z.object({
  L: fromText(n('L* must be a number').min(0, 'L* is between 0 and 100').max(100, 'L* is between 0 and 100')),
  a: fromText(n('a* must be a number').min(-200, 'a* is between −200 and 200').max(200, 'a* is between −200 and 200')),
  b: fromText(n('b* must be a number').min(-200, 'b* is between −200 and 200').max(200, 'b* is between −200 and 200')),
});
export type LabReading = z.infer<typeof labReadingSchema>;

export const spotInputSchema = z.object({
  name: z.string().trim().min(1, 'Name the spot').max(100),
  purpose: z.enum(SPOT_PURPOSES),
  /** Where the spot is, on one of the print's images, in coordinates normalised to 0–1. */
  point: z.object({ imageId: id, x: z.number().min(0).max(1), y: z.number().min(0).max(1) }).nullable().optional(),
  notes: optionalText(2000),
});
export const spotUpdateSchema = spotInputSchema.partial().extend({ version: z.number().int().min(1) });
export const baselineChoiceSchema = z.object({ sessionId: id.nullable(), reason: z.string().trim().min(3, 'Say why this session is the baseline').max(500), version: z.number().int().min(1) });

export const spotSchema = z.object({
  id, printId: id, name: z.string(), purpose: z.enum(SPOT_PURPOSES), point: z.object({ imageId: id, x: z.number(), y: z.number() }).nullable(),
  notes: z.string().nullable(),
  /** null = the first comparable session is the baseline. */
  baseline: z.object({ sessionId: id, chosenBy: z.string().nullable(), chosenAt: z.string().datetime(), reason: z.string() }).nullable(),
  version: z.number().int(),
});
export type Spot = z.infer<typeof spotSchema>;

export const spotReadingInputSchema = z.object({
  spotId: id,
  readings: z.array(labReadingSchema).min(1, 'At least one L*a*b* reading').max(20),
  density: z.preprocess((v) => (v === '' ? null : v), fromText(n('Density must be a number').min(0, 'Density is 0 or more').max(5, 'Density is at most 5')).nullable()).optional(),
  densityType: z.enum(DENSITY_TYPES).nullable().optional(),
  /** Reflectance as a fraction (0–1]; density is computed from it when no density is given. */
  reflectance: z.preprocess((v) => (v === '' ? null : v), fromText(n('Reflectance must be a number').gt(0, 'Reflectance is above 0').max(1, 'Reflectance is a fraction up to 1')).nullable()).optional(),
});

export const sessionInputSchema = z.object({
  measuredOn: isoDate,
  instrument: z.string().trim().min(1, 'Name the instrument (make and model)').max(200),
  serial: optionalText(100),
  illuminant: z.enum(ILLUMINANTS).default('D50'),
  observer: z.enum(OBSERVERS).default('2'),
  geometry: z.enum(GEOMETRIES),
  condition: z.enum(MEASUREMENT_CONDITIONS).nullable().optional(),
  aperture: optionalText(50),
  backing: optionalText(100),
  notes: optionalText(5000),
  readings: z.array(spotReadingInputSchema).min(1, 'Record at least one spot').max(50),
});
export type SessionInput = z.infer<typeof sessionInputSchema>;

export const sessionSchema = z.object({
  id, printId: id, measuredOn: isoDate, measuredBy: z.string().nullable(), instrument: z.string(), serial: z.string().nullable(),
  illuminant: z.enum(ILLUMINANTS), observer: z.enum(OBSERVERS), geometry: z.enum(GEOMETRIES), condition: z.enum(MEASUREMENT_CONDITIONS).nullable(),
  aperture: z.string().nullable(), backing: z.string().nullable(), notes: z.string().nullable(),
  readings: z.array(z.object({
    spotId: id, spotName: z.string(), mean: labReadingSchema, n: z.number().int(), sd: labReadingSchema.nullable(), maxPairwiseDeltaE00: z.number().nullable(),
    density: z.number().nullable(), densityType: z.enum(DENSITY_TYPES).nullable(), reflectance: z.number().nullable(),
  })),
  createdAt: z.string().datetime(),
  /** A session voided by a conservator: kept and shown struck through, left out of every analysis. */
  voided: z.object({ at: z.string().datetime(), by: z.string(), reason: z.string() }).nullable().optional(),
});
export type MeasurementSession = z.infer<typeof sessionSchema>;

const rateSchema = z.union([
  z.object({ ok: z.literal(true), slopePerYear: z.number(), intercept: z.number(), standardError: z.number(), ci95: z.tuple([z.number(), z.number()]), n: z.number().int(), spanYears: z.number(), r2: z.number() }),
  z.object({ ok: z.literal(false), reason: z.enum(['not_enough_sessions', 'span_too_short']), message: z.string() }),
]);

export const projectionSchema = z.union([
  z.object({ reached: z.literal(true), alreadyReached: z.literal(false), threshold: z.number(), date: z.string().datetime(), interval: z.object({ earliest: z.string().datetime(), latest: z.string().datetime().nullable() }) }),
  z.object({ reached: z.literal(true), alreadyReached: z.literal(true), threshold: z.number(), firstDate: z.string().datetime() }),
  z.object({ reached: z.literal(false), threshold: z.number(), reason: z.string() }),
]);

/** One spot's change against its baseline, session by session, with its rate and projection. */
export const spotAnalysisSchema = z.object({
  spot: spotSchema,
  baseline: z.object({ sessionId: id, measuredOn: isoDate, lab: labReadingSchema, density: z.number().nullable(), chosen: z.boolean() }).nullable(),
  points: z.array(z.object({
    sessionId: id, measuredOn: isoDate, lab: labReadingSchema, comparable: z.boolean(), reason: z.string().nullable(),
    dE00: z.number().nullable(), dE76: z.number().nullable(), dL: z.number().nullable(), dC: z.number().nullable(), dH: z.number().nullable(),
    /** CIEDE2000's ΔL′, ΔC′, ΔH′ (dL, dC, dH are CIELAB's ΔL*, ΔC*ab, ΔH*ab). */
    dLPrime: z.number().nullable(), dCPrime: z.number().nullable(), dHPrime: z.number().nullable(),
    dominant: z.string().nullable(), density: z.number().nullable(), dD: z.number().nullable(), densityLossPercent: z.number().nullable(),
  })),
  /** ΔE00 per year. */
  rate: rateSchema.nullable(),
  /** Density change in D per year (ΔD = D − D0 fitted; negative while the density falls). */
  densityChangeRate: rateSchema.nullable(),
  /** Density lost in % of the baseline density per year (positive while the density falls). */
  densityLossRate: rateSchema.nullable(),
  projection: projectionSchema.nullable(),
});
export type SpotAnalysis = z.infer<typeof spotAnalysisSchema>;

export const printMeasurementsSchema = z.object({
  threshold: z.number(), thresholdGuidance: z.string(), spots: z.array(spotAnalysisSchema), sessions: z.array(sessionSchema),
});
export type PrintMeasurements = z.infer<typeof printMeasurementsSchema>;

export const measurementSettingsSchema = z.object({ noticeableDeltaE: z.number().min(0.1).max(20) });

export const leadersQuerySchema = z.object({
  process: z.string().max(60).optional(),
  tonerClass: z.string().max(60).optional(),
  sort: z.enum(['rate', 'change']).default('rate'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export const leaderSchema = z.object({
  printId: id, accessionNumber: z.string(), title: z.string(), process: z.string(), tonerClasses: z.array(z.string()),
  spotId: id, spotName: z.string(), latestDeltaE00: z.number().nullable(), ratePerYear: z.number().nullable(), rateCi95: z.tuple([z.number(), z.number()]).nullable(),
  sessions: z.number().int(), projectedDate: z.string().datetime().nullable(), lastMeasuredOn: isoDate,
});

/** CSV from an instrument: which column holds what. Spot names are matched to the print's spots. */
export const csvMappingSchema = z.object({
  spot: z.string().min(1, 'Choose the column with the spot name'),
  L: z.string().min(1, 'Choose the L* column'),
  a: z.string().min(1, 'Choose the a* column'),
  b: z.string().min(1, 'Choose the b* column'),
  density: z.string().optional(),
  reflectance: z.string().optional(),
  reflectanceIsPercent: z.boolean().default(false),
});
export const csvPreviewSchema = z.object({
  columns: z.array(z.string()),
  rowCount: z.number().int(),
  sample: z.array(z.record(z.string(), z.string())),
  /** With a mapping: the readings grouped by spot, ready to send as a session, and every problem by row and column. */
  readings: z.array(spotReadingInputSchema).nullable(),
  errors: z.array(z.object({ row: z.number().int(), column: z.string(), value: z.string().nullable(), message: z.string() })),
});

/** The multipart text field `mapping` of a CSV preview: JSON per csvMappingSchema, problems named by their path inside it. */
export const csvPreviewFieldsSchema = z.object({
  mapping: z
    .string()
    .optional()
    .transform((s, ctx) => {
      if (s === undefined || s.trim() === '') return undefined;
      try {
        return JSON.parse(s) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message: 'The mapping is not valid JSON' });
        return z.NEVER;
      }
    })
    .pipe(csvMappingSchema.optional()),
});
