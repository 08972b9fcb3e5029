/**
 * Light cost of a display: how much colour change (ΔE00 at a print's most sensitive spot) its
 * light exposure has caused so far, and what a planned display is expected to add.
 *
 * Fit: ΔE00 from the baseline against the cumulative exposure since the baseline, in millions of
 * lux-hours (Mlx·h), by least squares through the origin (the baseline is ΔE00 0 at exposure 0):
 *   b = Σxy / Σx², s² = Σ(y − bx)² / (m − 1), se(b) = √(s² / Σx²), 95 % interval b ± t(0.975, m − 1)·se,
 * where m is the number of sessions after the baseline. The baseline itself is not counted among
 * the residuals: its ΔE00 is zero by definition, not a measurement that could scatter.
 *
 * A session is taken as made at the start of its day: the exposure it has received is that of
 * the days from the baseline's day up to the day before its own.
 */
import { DEFAULT_NOTICEABLE_DELTA_E, studentTQuantile } from './fading';
import { addDays, dayNumber, exposureBetween, type DisplayPeriodInput } from './light-dose';

export interface LightCostSession {
  /** 'YYYY-MM-DD'. */
  date: string;
  /** ΔE00 from the baseline session at the spot; the baseline (earliest) session has 0. */
  deltaE00: number;
}

/** What the fit takes for granted, to be shown beside it. */
export const LIGHT_COST_ASSUMPTIONS: readonly string[] = [
  'Reciprocity: the same lux-hours do the same harm whether given as a low light for long or a bright light briefly ' +
    '(50 lx for 10 h counts as 250 lx for 2 h).',
  'Change grows in a straight line with exposure from the baseline; the rate found so far continues.',
  'Only light counts: change in the dark (from the air, the mount, the storage climate) is put down to light.',
  'Dark recovery of Prussian blue, which partly regains colour in the dark, is ignored.',
  'Each session is taken as measured at the start of its day, before that day’s display.',
];

export interface LightCostFit {
  status: 'ok';
  /** ΔE00 per million lux-hours. */
  slopePerMlxh: number;
  /** 95 % confidence interval of the slope. */
  ci95: [number, number];
  standardError: number;
  /** Sessions used, the baseline included. */
  n: number;
  /** Degrees of freedom: sessions after the baseline, less one. */
  df: number;
  /** Uncentred R² of a fit through the origin: 1 − Σ(y − bx)² / Σy² (1 when all y are 0). */
  r2: number;
  /** The fitted points: exposure since the baseline (Mlx·h) and ΔE00, in date order. */
  points: { date: string; megaLuxHours: number; deltaE00: number }[];
  assumptions: readonly string[];
}

export interface LightCostRefusal {
  status: 'not_enough_data';
  reason: 'fewer_than_three_sessions' | 'no_exposure_between_sessions';
  message: string;
}

export type LightCostResult = LightCostFit | LightCostRefusal;

/** Fit ΔE00 per million lux-hours from measurement sessions and the print's display periods. */
export function fitLightCost(sessions: readonly LightCostSession[], periods: readonly DisplayPeriodInput[]): LightCostResult {
  for (const s of sessions) {
    dayNumber(s.date);
    if (!Number.isFinite(s.deltaE00)) throw new RangeError(`session ${s.date} has a non-finite ΔE00 (${s.deltaE00})`);
  }
  if (sessions.length < 3) {
    return {
      status: 'not_enough_data',
      reason: 'fewer_than_three_sessions',
      message: `Not enough data: a light cost needs at least three measurement sessions (the baseline included); there are ${sessions.length}.`,
    };
  }
  const sorted = [...sessions].sort((a, b) => dayNumber(a.date) - dayNumber(b.date));
  const baseline = sorted[0];
  if (baseline.deltaE00 !== 0) throw new RangeError(`the baseline session (${baseline.date}) must have ΔE00 0 (got ${baseline.deltaE00})`);
  const points = sorted.map((s) => ({
    date: s.date,
    megaLuxHours: s.date === baseline.date ? 0 : exposureBetween(periods, baseline.date, addDays(s.date, -1)) / 1e6,
    deltaE00: s.deltaE00,
  }));
  const after = points.slice(1);
  const sxx = after.reduce((s, p) => s + p.megaLuxHours ** 2, 0);
  if (!(sxx > 0)) {
    return {
      status: 'not_enough_data',
      reason: 'no_exposure_between_sessions',
      message: 'Not enough data: the print had no recorded light exposure between its first and last measurement sessions.',
    };
  }
  const sxy = after.reduce((s, p) => s + p.megaLuxHours * p.deltaE00, 0);
  const syy = after.reduce((s, p) => s + p.deltaE00 ** 2, 0);
  const b = sxy / sxx;
  const ssr = after.reduce((s, p) => s + (p.deltaE00 - b * p.megaLuxHours) ** 2, 0);
  const df = after.length - 1;
  const standardError = Math.sqrt(ssr / df / sxx);
  const half = studentTQuantile(0.975, df) * standardError;
  return {
    status: 'ok',
    slopePerMlxh: b,
    ci95: [b - half, b + half],
    standardError,
    n: points.length,
    df,
    r2: syy === 0 ? 1 : 1 - ssr / syy,
    points,
    assumptions: LIGHT_COST_ASSUMPTIONS,
  };
}

export interface DisplayCost {
  /** Expected ΔE00 the display adds: slope × planned Mlx·h. */
  addedDeltaE: number;
  /** The slope's 95 % interval times the planned Mlx·h (the interval of the expected change, not of one reading). */
  addedInterval: [number, number];
  /** currentDeltaE + addedDeltaE. */
  expectedDeltaE: number;
  expectedInterval: [number, number];
  threshold: number;
  /** Already at or over the threshold before the display. */
  alreadyOver: boolean;
  /** Expected to reach the threshold during the display (was under it before). */
  crosses: boolean;
  /** The upper end of the interval reaches the threshold (was under it before). */
  mayCross: boolean;
}

/**
 * What a planned display of `plannedLuxHours` is expected to add to a print now at
 * `currentDeltaE` from its baseline, and whether it would reach the noticeable-change
 * `threshold` (default DEFAULT_NOTICEABLE_DELTA_E, the project's setting).
 */
export function predictDisplayCost(
  fit: Pick<LightCostFit, 'slopePerMlxh' | 'ci95'>,
  plannedLuxHours: number,
  currentDeltaE: number,
  threshold: number = DEFAULT_NOTICEABLE_DELTA_E,
): DisplayCost {
  if (!Number.isFinite(plannedLuxHours) || plannedLuxHours < 0) throw new RangeError(`planned lux-hours must be ≥ 0 (got ${plannedLuxHours})`);
  if (!Number.isFinite(currentDeltaE)) throw new RangeError(`current ΔE00 must be finite (got ${currentDeltaE})`);
  if (!Number.isFinite(threshold)) throw new RangeError(`threshold must be finite (got ${threshold})`);
  const x = plannedLuxHours / 1e6;
  const added = fit.slopePerMlxh * x;
  const addedInterval: [number, number] = [fit.ci95[0] * x, fit.ci95[1] * x];
  const alreadyOver = currentDeltaE >= threshold;
  return {
    addedDeltaE: added,
    addedInterval,
    expectedDeltaE: currentDeltaE + added,
    expectedInterval: [currentDeltaE + addedInterval[0], currentDeltaE + addedInterval[1]],
    threshold,
    alreadyOver,
    crosses: !alreadyOver && currentDeltaE + added >= threshold,
    mayCross: !alreadyOver && currentDeltaE + addedInterval[1] >= threshold,
  };
}
