import { z } from 'zod';
import { id, isoDate } from './primitives';
import { LIGHT_RESPONSIVITY, PROCESS, TONER_CLASS } from './vocab';

/**
 * Light dose: each print's responsivity category (a default from its process and toner, or a
 * conservator's override with a reason), its exposure in lux-hours from every display period, the
 * budget of its category, and — where measurements allow — what light has cost it in ΔE00.
 * The computations are `domain/light-dose.ts` and `domain/light-cost.ts`.
 */

const categorySchema = z.enum(LIGHT_RESPONSIVITY.codes);
const budgetSchema = z.object({
  /** Highest illuminance on the object, lux; null: no limit. */
  maxLux: z.number().min(0).max(100000).nullable(),
  /** Exposure allowed in any 12 months (the rolling 365 days, so a display across New Year cannot use two years), lux-hours; null: no limit. */
  annualLuxHours: z.number().min(0).max(100_000_000).nullable(),
});

/** One rule of the default category: the first rule whose process and toner class match wins. */
export const responsivityRuleSchema = z.object({
  /** Matches any process when absent. */
  process: z.enum(PROCESS.codes).nullable().optional(),
  /** Matches when the print's toning includes this class; any toning when absent. */
  tonerClass: z.enum(TONER_CLASS.codes).nullable().optional(),
  category: categorySchema,
});

/** The light settings (administrators): budgets per category and the default category rules. */
export const lightSettingsSchema = z.object({
  budgets: z.object({ irresponsive: budgetSchema, low: budgetSchema, medium: budgetSchema, high: budgetSchema }),
  /** Where the budget values come from, shown beside them. */
  budgetSource: z.string().trim().min(1).max(1000),
  rules: z.array(responsivityRuleSchema).min(1).max(100),
  /** The category of a print no rule matches. */
  fallbackCategory: categorySchema,
});
export type LightSettings = z.infer<typeof lightSettingsSchema>;

/** A conservator's override of the default category, with a reason; `category: null` returns to the default. */
export const responsivityOverrideInputSchema = z
  .object({
    category: categorySchema.nullable(),
    reason: z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? null : v), z.string().trim().max(2000).nullable()).optional(),
    version: z.number().int().min(1),
  })
  .refine((v) => v.category === null || (v.reason ?? '').length > 0, { path: ['reason'], message: 'Say why this print differs from its default' });

const warningSchema = z.object({ code: z.string(), message: z.string() });

export const lightCostSchema = z.discriminatedUnion('status', [
  z.object({
    status: z.literal('ok'),
    spotLabel: z.string(),
    /** ΔE00 per million lux-hours, least squares through the baseline. */
    slopePerMlxh: z.number(),
    ci95: z.tuple([z.number(), z.number()]),
    n: z.number().int(),
    points: z.array(z.object({ date: isoDate, megaLuxHours: z.number(), deltaE00: z.number() })),
    assumptions: z.array(z.string()),
  }),
  z.object({ status: z.literal('not_enough_data'), reason: z.string() }),
]);

export const printLightSchema = z.object({
  printId: id,
  category: categorySchema,
  /** default: from process and toner by the settings' rules; override: a conservator's choice. */
  categorySource: z.enum(['default', 'override']),
  defaultCategory: categorySchema,
  overrideReason: z.string().nullable(),
  overriddenBy: z.object({ id, name: z.string() }).nullable(),
  budget: budgetSchema,
  budgetSource: z.string(),
  asOf: isoDate,
  usedThisYear: z.number(),
  usedLast12Months: z.number(),
  total: z.number(),
  /** Lux-hours of displays not yet ended (from today on). */
  planned: z.number(),
  byYear: z.array(z.object({ year: z.number().int(), luxHours: z.number() })),
  /** Cumulative lux-hours over time, for the chart. */
  series: z.array(z.object({ date: isoDate, luxHours: z.number() })),
  displays: z.array(z.object({
    id, exhibitionId: id, exhibitionTitle: z.string(), startsOn: isoDate, endsOn: isoDate, lux: z.number(), hoursPerDay: z.number(), luxHours: z.number(),
  })),
  rest: z.object({ owedUntil: isoDate.nullable(), explanation: z.string() }),
  warnings: z.array(warningSchema),
  cost: lightCostSchema,
  version: z.number().int(),
});
export type PrintLight = z.infer<typeof printLightSchema>;

/** A print whose displays, as planned, would take it past its budget or its maximum illuminance. */
export const overBudgetItemSchema = z.object({
  printId: id, accessionNumber: z.string(), printTitle: z.string(), category: categorySchema,
  annualLuxHours: z.number().nullable(), usedThisYear: z.number(), planned: z.number(), warnings: z.array(warningSchema),
});

/**
 * The recompute of every print's category and light warning that a change of the light settings
 * starts (a background job, in batches): running or done, prints done of the total counted when it
 * started. A newer change starts it again from the first print.
 */
export const lightRecomputeSchema = z.object({
  status: z.enum(['running', 'done']),
  done: z.number().int(),
  total: z.number().int(),
  startedAt: z.string(),
  finishedAt: z.string().nullable(),
});
export type LightRecompute = z.infer<typeof lightRecomputeSchema>;
