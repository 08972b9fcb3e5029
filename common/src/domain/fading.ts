/**
 * How fast a measured quantity (ΔE00 from baseline, density, …) changes over the sessions of a
 * print, and when a straight-line trend would reach a threshold.
 *
 * Time is measured in decimal years of 365.2425 days (the mean Gregorian year), counted from the
 * earliest session of the series. Dates given as strings are parsed with `new Date(...)`, so an
 * ISO date "2004-01-01" means midnight UTC.
 */
// @ts-expect-error -- jstat ships no type declarations; the one function used is typed below.
import jStatModule from 'jstat';

const jStat = jStatModule as { studentt: { inv(p: number, df: number): number } };

/** Days in the mean Gregorian year used to turn dates into decimal years. */
export const DAYS_PER_YEAR = 365.2425;
/** Milliseconds in one such year (31 556 952 000, an integer). */
export const MS_PER_YEAR = DAYS_PER_YEAR * 86_400_000;

/**
 * The ΔE00 used by default as "a change someone would notice". It is a setting, not a constant
 * of nature: see NOTICEABLE_DELTA_E_GUIDANCE.
 */
export const DEFAULT_NOTICEABLE_DELTA_E = 2.0;

export const NOTICEABLE_DELTA_E_GUIDANCE =
  'A colour change of about ΔE 1.6 is treated as just noticeable in national conservation guidance on light damage, ' +
  'and microfading tests are usually stopped near ΔE 2 (P. M. Whitmore, X. Pan and C. Bailie, "Predicting the fading of objects", ' +
  'Journal of the American Institute for Conservation 38(3):395–409, 1999; reference recalled from memory, verify). ' +
  'Toneledger uses ΔE00 = 2.0 by default; the figure is a setting for each collection, not a constant.';

/**
 * Two-sided Student t quantile: the value t with P(T ≤ t) = p for T on `df` degrees of freedom
 * (jstat's `studentt.inv`).
 */
export function studentTQuantile(p: number, df: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`p must be in (0, 1) (got ${p})`);
  if (!(df > 0) || !Number.isFinite(df)) throw new RangeError(`df must be a positive number (got ${df})`);
  return jStat.studentt.inv(p, df);
}

export interface SeriesPoint {
  t: Date | string;
  value: number;
}

export interface FadingRateOptions {
  /** Fewest distinct session dates accepted (default 3; never fewer than 3, which n − 2 ≥ 1 needs). */
  minSessions?: number;
  /** Shortest span from first to last session, in years (default 1; a zero span is always refused). */
  minSpanYears?: number;
}

export interface FadingRateFit {
  ok: true;
  /** Fitted change of the value per year (ordinary least squares). */
  slopePerYear: number;
  /** Fitted value at `origin`, the earliest session. */
  intercept: number;
  /** Standard error of the slope: sqrt(SSR / (n − 2)) / sqrt(Sxx). */
  standardError: number;
  /** 95 % confidence interval of the slope: slope ± t(0.975, n − 2) · SE. */
  ci95: [number, number];
  /** Number of points fitted. */
  n: number;
  /** Years from the first to the last session. */
  spanYears: number;
  /** Coefficient of determination 1 − SSR/SST (1 when the values do not vary, a perfect fit). */
  r2: number;
  /** Time zero of the fit: the earliest session. */
  origin: Date;
  /** Mean of the session times in years after `origin`; the fitted line passes through (meanYears, mean value). */
  meanYears: number;
}

export interface FadingRateRefusal {
  ok: false;
  reason: 'not_enough_sessions' | 'span_too_short';
  message: string;
}

export type FadingRateResult = FadingRateFit | FadingRateRefusal;

function toDate(t: Date | string, what: string): Date {
  const d = t instanceof Date ? new Date(t.getTime()) : new Date(t);
  if (Number.isNaN(d.getTime())) throw new RangeError(`${what} is not a valid date (${String(t)})`);
  return d;
}

/** Decimal years from `origin` to `t` (365.2425-day years). */
export function yearsBetween(origin: Date, t: Date): number {
  return (t.getTime() - origin.getTime()) / MS_PER_YEAR;
}

/** The date `years` decimal years after `origin`. */
export function addYears(origin: Date, years: number): Date {
  return new Date(origin.getTime() + years * MS_PER_YEAR);
}

/** Straight-line (OLS) rate of change of `value` against time, with its 95 % confidence interval. */
export function fadingRate(points: readonly SeriesPoint[], opts: FadingRateOptions = {}): FadingRateResult {
  const minSessions = Math.max(3, opts.minSessions ?? 3);
  const minSpanYears = opts.minSpanYears ?? 1;
  const parsed = points.map((p, i) => {
    if (!Number.isFinite(p.value)) throw new RangeError(`point ${i + 1} has a non-finite value (${p.value})`);
    return { t: toDate(p.t, `point ${i + 1}`), value: p.value };
  });
  const sessions = new Set(parsed.map((p) => p.t.getTime())).size;
  if (sessions < minSessions) {
    return {
      ok: false,
      reason: 'not_enough_sessions',
      message: `A rate needs measurements from at least ${minSessions} sessions; this series has ${sessions}.`,
    };
  }
  const origin = new Date(Math.min(...parsed.map((p) => p.t.getTime())));
  const xs = parsed.map((p) => yearsBetween(origin, p.t));
  const ys = parsed.map((p) => p.value);
  const spanYears = Math.max(...xs);
  if (spanYears <= 0 || spanYears < minSpanYears) {
    return {
      ok: false,
      reason: 'span_too_short',
      message: `A rate needs sessions spread over at least ${minSpanYears} year(s); this series spans ${spanYears.toFixed(2)}.`,
    };
  }
  const n = xs.length;
  const meanX = xs.reduce((s, x) => s + x, 0) / n;
  const meanY = ys.reduce((s, y) => s + y, 0) / n;
  let sxx = 0;
  let sxy = 0;
  let sst = 0;
  for (let i = 0; i < n; i++) {
    sxx += (xs[i] - meanX) ** 2;
    sxy += (xs[i] - meanX) * (ys[i] - meanY);
    sst += (ys[i] - meanY) ** 2;
  }
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;
  let ssr = 0;
  for (let i = 0; i < n; i++) ssr += (ys[i] - (intercept + slope * xs[i])) ** 2;
  const standardError = Math.sqrt(ssr / (n - 2)) / Math.sqrt(sxx);
  const halfWidth = studentTQuantile(0.975, n - 2) * standardError;
  return {
    ok: true,
    slopePerYear: slope,
    intercept,
    standardError,
    ci95: [slope - halfWidth, slope + halfWidth],
    n,
    spanYears,
    r2: sst === 0 ? 1 : 1 - ssr / sst,
    origin,
    meanYears: meanX,
  };
}

export type ThresholdProjection =
  | {
      /** The fitted trend reaches the threshold after the last session. */
      reached: true;
      alreadyReached: false;
      threshold: number;
      /** When the fitted line reaches the threshold. */
      date: Date;
      /** `date` in years after the baseline. */
      yearsAfterBaseline: number;
      /**
       * From the slope's 95 % interval, each line pivoting on the fitted line's centre
       * (meanYears, mean value): `earliest` from the upper slope, `latest` from the lower slope,
       * or null (open-ended) when the lower slope is ≤ 0.
       */
      interval: { earliest: Date; latest: Date | null };
    }
  | {
      reached: true;
      alreadyReached: true;
      threshold: number;
      /**
       * First date at or above the threshold: the first observed session when observations were
       * given, otherwise the date the fitted line crossed it.
       */
      firstDate: Date;
      basis: 'observed' | 'fitted';
      yearsAfterBaseline: number;
    }
  | { reached: false; threshold: number; reason: 'not reached on current trend' };

/**
 * When the fitted line of a series (typically ΔE00 from the baseline) reaches `threshold`.
 *
 * `current` is the observed series (or just the latest reading). When given, the threshold counts
 * as already reached if any observed value is at or above it; when not given, if the fitted value
 * at the last session is. A slope ≤ 0 never reaches a threshold not yet reached. When
 * observations are given and none reaches the threshold, the projected date is that of the fitted
 * line even if it falls before the last session.
 */
export function projectThreshold(
  rate: FadingRateFit,
  baseline: { t: Date | string },
  threshold: number = DEFAULT_NOTICEABLE_DELTA_E,
  current?: SeriesPoint | readonly SeriesPoint[],
): ThresholdProjection {
  if (!Number.isFinite(threshold)) throw new RangeError(`threshold must be finite (got ${threshold})`);
  const baselineDate = toDate(baseline.t, 'baseline');
  const afterBaseline = (d: Date) => yearsBetween(baselineDate, d);
  const lineDate = (slope: number) =>
    addYears(rate.origin, rate.meanYears + (threshold - (rate.intercept + rate.slopePerYear * rate.meanYears)) / slope);

  if (current !== undefined) {
    const observed = (Array.isArray(current) ? current : [current as SeriesPoint])
      .map((p, i) => ({ t: toDate(p.t, `observation ${i + 1}`), value: p.value }))
      .filter((p) => p.value >= threshold)
      .sort((a, b) => a.t.getTime() - b.t.getTime());
    if (observed.length > 0) {
      const firstDate = observed[0].t;
      return { reached: true, alreadyReached: true, threshold, firstDate, basis: 'observed', yearsAfterBaseline: afterBaseline(firstDate) };
    }
  } else if (rate.intercept + rate.slopePerYear * rate.spanYears >= threshold) {
    // The fitted value at the last session is at or over the threshold. The fitted crossing is
    // taken as the first date, but never earlier than the first session; a flat or falling line
    // that is over the threshold at the last session was already over it at the first.
    const crossing = rate.slopePerYear > 0 ? lineDate(rate.slopePerYear) : rate.origin;
    const firstDate = crossing.getTime() < rate.origin.getTime() ? rate.origin : crossing;
    return { reached: true, alreadyReached: true, threshold, firstDate, basis: 'fitted', yearsAfterBaseline: afterBaseline(firstDate) };
  }

  if (!(rate.slopePerYear > 0)) return { reached: false, threshold, reason: 'not reached on current trend' };

  const date = lineDate(rate.slopePerYear);
  const [lo, hi] = rate.ci95;
  // The upper slope is ≥ the fitted slope > 0, so it always gives a date.
  const a = lineDate(hi);
  const b = lo > 0 ? lineDate(lo) : null;
  const earliest = b !== null && b.getTime() < a.getTime() ? b : a;
  const latest = b === null ? null : b.getTime() < a.getTime() ? a : b;
  return { reached: true, alreadyReached: false, threshold, date, yearsAfterBaseline: afterBaseline(date), interval: { earliest, latest } };
}
