import { z } from 'zod';
import { COHORT_FACTORS, COHORT_FACTOR_CODES, type CohortFactorCode } from '../fields/cohort';
import { GRADES } from './condition';
import { pageQuerySchema } from './envelope';
import { id, isoDateTime } from './primitives';

/**
 * Longevity research: a cohort query (filters over the factors of `fields/cohort.ts`, one or two
 * factors to group by, the event that ends a print's "survival", the time origin, the Cox model's
 * factors) and what it answers per group: fading rates, Kaplan–Meier curves, the log-rank test,
 * a Cox proportional-hazards model, incidence of deterioration terms. The statistics are pure
 * functions in `domain/survival.ts`, `domain/cox.ts` and `domain/distribution.ts`.
 */

const factorCode = z.enum(COHORT_FACTOR_CODES as [CohortFactorCode, ...CohortFactorCode[]]);
const finite = z.number().finite().min(-1e9).max(1e9);

/** One filter: `values` for choice, text and flag factors ('yes'/'no'/'unknown'), `min`/`max` for numbers, `locationId` for a place, `fromYear`/`toYear` for the date made. */
export const cohortFilterSchema = z
  .object({
    factor: factorCode,
    values: z.array(z.string().trim().min(1).max(200)).min(1).max(100).optional(),
    min: finite.optional(),
    max: finite.optional(),
    locationId: id.optional(),
    fromYear: z.number().int().min(1800).max(2200).optional(),
    toYear: z.number().int().min(1800).max(2200).optional(),
  })
  .superRefine((f, ctx) => {
    const kind = COHORT_FACTORS[f.factor].kind;
    const need = (ok: boolean, path: string, message: string) => { if (!ok) ctx.addIssue({ code: 'custom', path: [path], message }); };
    if (kind === 'choice' || kind === 'text' || kind === 'flag') need(!!f.values, 'values', 'Choose at least one value');
    if (kind === 'choice' && f.values) {
      const codes = (COHORT_FACTORS[f.factor] as { choices: { codes: readonly string[] } }).choices.codes;
      for (const [i, v] of f.values.entries()) if (!codes.includes(v)) ctx.addIssue({ code: 'custom', path: ['values', i], message: `Not one of the listed values of ${COHORT_FACTORS[f.factor].label}` });
    }
    if (kind === 'flag' && f.values) for (const [i, v] of f.values.entries()) if (!['yes', 'no', 'unknown'].includes(v)) ctx.addIssue({ code: 'custom', path: ['values', i], message: 'Choose yes, no or unknown' });
    if (kind === 'number') need(f.min !== undefined || f.max !== undefined, 'min', 'Give a lowest or a highest value');
    if (kind === 'number' && f.min !== undefined && f.max !== undefined) need(f.min <= f.max, 'max', 'The highest must not be below the lowest');
    if (kind === 'place') need(!!f.locationId, 'locationId', 'Choose a place');
    if (kind === 'year') need(f.fromYear !== undefined || f.toYear !== undefined, 'fromYear', 'Give a first or a last year');
    if (kind === 'year' && f.fromYear !== undefined && f.toYear !== undefined) need(f.fromYear <= f.toYear, 'toYear', 'The last year must not be before the first');
  });
export type CohortFilter = z.infer<typeof cohortFilterSchema>;

export const SURVIVAL_EVENTS = ['fading', 'observation', 'grade'] as const;
export const SURVIVAL_ORIGINS = ['made', 'first_exam'] as const;
export const CI_METHODS = ['log-log', 'plain'] as const;

export const cohortQuerySchema = z
  .object({
    filters: z.array(cohortFilterSchema).max(20).default([]),
    /** One or two factors; none: the whole cohort is one group. A place groups by the level below the filter's place (or the top level). */
    groupBy: z.array(factorCode).max(2).default([]),
    /** Cut points for a number factor grouped by (ascending); the median split when absent. */
    bands: z.record(z.string(), z.array(finite).min(1).max(10)).optional(),
    event: z
      .object({
        kind: z.enum(SURVIVAL_EVENTS).default('fading'),
        /** For 'fading': ΔE00 against the baseline at the maximum-density spot; the measurement settings' noticeable threshold when absent. */
        thresholdDeltaE: z.number().min(0.1).max(50).optional(),
        /** For 'observation': a deterioration term code in a signed report. */
        term: z.string().trim().min(1).max(100).optional(),
        /** For 'grade': the first signed report graded at or below this. */
        grade: z.enum(GRADES).optional(),
      })
      .default({ kind: 'fading' })
      .refine((e) => e.kind !== 'observation' || !!e.term, { path: ['term'], message: 'Choose the observation' })
      .refine((e) => e.kind !== 'grade' || !!e.grade, { path: ['grade'], message: 'Choose the grade' }),
    /** Time counted from the date made (its earliest year; prints with no date made are left out of survival) or from the first examination. */
    origin: z.enum(SURVIVAL_ORIGINS).default('first_exam'),
    ci: z.enum(CI_METHODS).default('log-log'),
    /** Up to five factors for the Cox model (none: no model). */
    coxFactors: z.array(factorCode).max(5).default([]),
  })
  .superRefine((q, ctx) => {
    for (const [i, f] of q.groupBy.entries()) if (COHORT_FACTORS[f].kind === 'place' && !q.filters.some((x) => x.factor === 'location')) ctx.addIssue({ code: 'custom', path: ['groupBy', i], message: 'Group by place under a place filter' });
    if (new Set(q.groupBy).size !== q.groupBy.length) ctx.addIssue({ code: 'custom', path: ['groupBy'], message: 'Group by two different factors' });
  });
export type CohortQuery = z.infer<typeof cohortQuerySchema>;
export type CohortQueryIn = z.input<typeof cohortQuerySchema>;

const interval = z.object({ value: z.number(), lower: z.number().nullable(), upper: z.number().nullable() });

export const cohortGroupSchema = z.object({
  /** Stable key of the group within this answer, used to ask for its prints. */
  key: z.string(),
  label: z.string(),
  values: z.record(z.string(), z.string().nullable()),
  size: z.number().int(),
  /** Prints with a fading rate (a baseline and two or more sessions at the maximum-density spot). */
  withRate: z.number().int(),
  /** Prints that count for survival (an origin date and at least one observation after it). */
  withSurvival: z.number().int(),
});

export const distributionSchema = z.object({
  n: z.number().int(), median: z.number().nullable(), q1: z.number().nullable(), q3: z.number().nullable(),
  min: z.number().nullable(), max: z.number().nullable(),
  /** Every value, for a strip plot (each links to its print). */
  points: z.array(z.object({ printId: id, accessionNumber: z.string(), value: z.number() })),
});

export const kmStepSchema = z.object({ t: z.number(), atRisk: z.number().int(), events: z.number().int(), censored: z.number().int(), s: z.number(), se: z.number().nullable(), lower: z.number().nullable(), upper: z.number().nullable() });

export const survivalGroupSchema = z.object({
  key: z.string(),
  n: z.number().int(),
  events: z.number().int(),
  censored: z.number().int(),
  /** Median time with its 95 % interval; null where the curve never reaches 0.5. */
  median: interval.nullable(),
  steps: z.array(kmStepSchema),
  /** Number at risk at the chart's ticks. */
  atRisk: z.array(z.object({ t: z.number(), n: z.number().int() })),
});

export const logRankSchema = z.object({
  chi2: z.number(), df: z.number().int(), p: z.number(),
  groups: z.array(z.object({ key: z.string(), observed: z.number(), expected: z.number() })),
  assumptions: z.array(z.string()),
  warnings: z.array(z.string()),
});

export const coxSchema = z.object({
  n: z.number().int(), events: z.number().int(),
  ties: z.literal('efron'),
  terms: z.array(z.object({
    /** e.g. "alkalineAfterBath = yes (against no)". */
    label: z.string(), factor: factorCode, level: z.string().nullable(), reference: z.string().nullable(),
    beta: z.number(), se: z.number(), hazardRatio: z.number(), lower: z.number(), upper: z.number(), p: z.number(),
  })),
  likelihoodRatio: z.object({ chi2: z.number(), df: z.number().int(), p: z.number() }),
  /** The proportional-hazards check per term (correlation of scaled Schoenfeld residuals with time), stated in words. */
  proportionalHazards: z.array(z.object({ label: z.string(), rho: z.number().nullable(), p: z.number().nullable(), verdict: z.string() })),
  warnings: z.array(z.string()),
});

export const incidenceSchema = z.object({
  term: z.string(), label: z.string(),
  groups: z.array(z.object({ key: z.string(), n: z.number().int(), count: z.number().int(), share: z.number(), lower: z.number(), upper: z.number() })),
});

/**
 * The figures a run computes: `fading` (rates per group with their strip-plot points), `survival`
 * (Kaplan–Meier curves and the log-rank test), `incidence` (deterioration terms), `cox` (the model).
 * Every run answers the groups with their sizes. The screen asks for them in parts, at once, so each
 * part is shown when it is ready; the export asks for all.
 */
export const COHORT_FIGURES = ['fading', 'survival', 'incidence', 'cox'] as const;
export type CohortFigure = (typeof COHORT_FIGURES)[number];
/** `?figures=fading,survival`: the figures to compute (each at most once, in any order); all when left out. */
export const cohortRunQuerySchema = z.object({
  figures: z
    .string()
    .max(100)
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v === '') return [...COHORT_FIGURES];
      const parts = v.split(',').map((x) => x.trim());
      const unknown = parts.filter((x) => !(COHORT_FIGURES as readonly string[]).includes(x));
      if (unknown.length) {
        ctx.addIssue({ code: 'custom', message: `Not a figure: ${unknown.join(', ')}; choose from ${COHORT_FIGURES.join(', ')}` });
        return z.NEVER;
      }
      return COHORT_FIGURES.filter((f) => parts.includes(f));
    }),
});

export const cohortResultSchema = z.object({
  query: cohortQuerySchema,
  /** The figures computed; the others are answered empty (`fading` and `incidence` []; `survival` without groups; `cox` null). */
  figures: z.array(z.enum(COHORT_FIGURES)),
  total: z.number().int(),
  groups: z.array(cohortGroupSchema),
  fading: z.array(z.object({ key: z.string(), deltaEPerYear: distributionSchema, densityLossPerYear: distributionSchema })),
  survival: z.object({
    origin: z.enum(SURVIVAL_ORIGINS), originLabel: z.string(), eventLabel: z.string(), timeUnit: z.literal('years'),
    ci: z.enum(CI_METHODS), groups: z.array(survivalGroupSchema), logRank: logRankSchema.nullable(),
  }),
  cox: coxSchema.nullable(),
  incidence: z.array(incidenceSchema),
  /** When the per-print outcomes behind these figures were last brought up to date. */
  outcomesAsOf: isoDateTime.nullable(),
});
export type CohortResult = z.infer<typeof cohortResultSchema>;

/** The prints behind a figure: a group, and optionally those with a rate, with the event, censored, at risk at a time, or showing a term. */
export const cohortPrintsInputSchema = z.object({
  query: cohortQuerySchema,
  groupKey: z.string().max(500).optional(),
  which: z.enum(['all', 'with_rate', 'events', 'censored', 'at_risk', 'term']).default('all'),
  /** For at_risk: years from the origin. */
  time: z.number().min(0).max(1000).optional(),
  term: z.string().max(100).optional(),
  page: z.number().int().min(1).default(1),
  pageSize: z.number().int().min(1).max(200).default(50),
});
export const cohortPrintSchema = z.object({
  printId: id, accessionNumber: z.string(), title: z.string().nullable(), group: z.string(),
  deltaEPerYear: z.number().nullable(), densityLossPerYear: z.number().nullable(),
  /** Years from the origin to the event or to the last observation. */
  time: z.number().nullable(), event: z.boolean().nullable(),
});

export const savedQueryInputSchema = z.object({
  name: z.string().trim().min(1, 'Name the query').max(200),
  description: z.preprocess((v) => (v === '' ? null : v), z.string().trim().max(4000).nullable()).optional(),
  query: cohortQuerySchema,
  /** Shared: every researcher sees it; otherwise only its owner. */
  shared: z.boolean().default(false),
});
/** A change names only what it changes: `shared` has no default here, so a rename leaves the sharing as it was. */
export const savedQueryUpdateSchema = savedQueryInputSchema.partial().extend({ shared: z.boolean().optional(), version: z.number().int().min(1) });
export const savedQuerySchema = z.object({
  id, name: z.string(), description: z.string().nullable(), query: cohortQuerySchema, shared: z.boolean(),
  owner: z.object({ id, name: z.string() }), createdAt: isoDateTime, updatedAt: isoDateTime, version: z.number().int(),
});
export type SavedQuery = z.infer<typeof savedQuerySchema>;
export const savedQueryListSchema = pageQuerySchema.extend({ mine: z.enum(['true', 'false']).optional() });
