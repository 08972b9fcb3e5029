import { describe, expect, it } from 'vitest';
import { linearRegression, linearRegressionLine, rSquared } from 'simple-statistics';
import {
  addYears,
  DAYS_PER_YEAR,
  DEFAULT_NOTICEABLE_DELTA_E,
  fadingRate,
  MS_PER_YEAR,
  NOTICEABLE_DELTA_E_GUIDANCE,
  projectThreshold,
  studentTQuantile,
  yearsBetween,
  type FadingRateFit,
  type SeriesPoint,
} from './fading';

const ORIGIN = new Date('2000-01-01T00:00:00Z');
/** A series at exact model years (multiples of 365.2425 days) after 2000-01-01. */
const atYears = (xs: number[], ys: number[]): SeriesPoint[] => xs.map((x, i) => ({ t: addYears(ORIGIN, x), value: ys[i] }));
const ok = (r: ReturnType<typeof fadingRate>): FadingRateFit => {
  if (!r.ok) throw new Error(`expected a fit, got ${r.reason}`);
  return r;
};
const DAY_MS = 86_400_000;

describe('decimal years of 365.2425 days', () => {
  it('400 Gregorian years (2000-01-01 → 2400-01-01) are 146 097 days, exactly 400 such years', () => {
    // The Gregorian calendar repeats every 400 years = 146 097 days (calendar rule: 97 leap years
    // in 400; recalled from memory, and JavaScript Date implements the proleptic Gregorian calendar).
    expect(DAYS_PER_YEAR).toBe(365.2425);
    expect(MS_PER_YEAR).toBe(31_556_952_000);
    expect(yearsBetween(ORIGIN, new Date('2400-01-01T00:00:00Z'))).toBe(400);
  });
});

describe('studentTQuantile', () => {
  // Two-sided 95 % critical values t(0.975, df) from a standard Student t table (e.g. NIST/SEMATECH
  // e-Handbook of Statistical Methods, §1.3.6.7.2) — values recalled from memory.
  it.each([
    [1, 12.706],
    [2, 4.303],
    [3, 3.182],
    [5, 2.571],
    [9, 2.262],
    [10, 2.228],
    [30, 2.042],
  ])('t(0.975, %i) = %f (standard t table, from memory)', (df, expected) => {
    expect(studentTQuantile(0.975, df)).toBeCloseTo(expected, 3);
  });

  it('matches the closed forms for 1 and 2 degrees of freedom', () => {
    // df = 1 is the Cauchy distribution: t = tan(π(p − ½)); df = 2 has F(t) = ½ + t / (2·sqrt(2 + t²)),
    // so t = (2p − 1) / sqrt(2p(1 − p)). Standard results, recalled from memory.
    for (const p of [0.9, 0.975, 0.995]) {
      expect(studentTQuantile(p, 1)).toBeCloseTo(Math.tan(Math.PI * (p - 0.5)), 7);
      expect(studentTQuantile(p, 2)).toBeCloseTo((2 * p - 1) / Math.sqrt(2 * p * (1 - p)), 7);
    }
  });

  it('tends to the normal quantile 1.95996 for many degrees of freedom (z table, from memory)', () => {
    expect(studentTQuantile(0.975, 1e6)).toBeCloseTo(1.95996, 4);
  });

  it('refuses p outside (0, 1) and df ≤ 0', () => {
    expect(() => studentTQuantile(1, 5)).toThrow(RangeError);
    expect(() => studentTQuantile(0.975, 0)).toThrow(RangeError);
  });
});

describe('fadingRate: ordinary least squares against time', () => {
  it('a hand-computed example: slope 1.2, intercept 0.6, SE 0.2309, r² 0.9, CI [0.465, 1.935]', () => {
    // x = 0..4 years, y = 1, 2, 2, 4, 6. x̄ = 2, ȳ = 3; Sxx = 10; Sxy = 4 + 1 + 0 + 1 + 6 = 12;
    // slope = 1.2, intercept = 3 − 1.2·2 = 0.6. Fitted 0.6, 1.8, 3.0, 4.2, 5.4; residuals
    // 0.4, 0.2, −1, −0.2, 0.6; SSR = 0.16 + 0.04 + 1 + 0.04 + 0.36 = 1.6; SST = 16; r² = 0.9.
    // SE = sqrt(1.6/3)/sqrt(10) = 0.230940. With t(0.975, 3) = 3.182 (t table):
    // 1.2 ± 3.182·0.230940 = 1.2 ± 0.7349 → [0.4651, 1.9349].
    const r = ok(fadingRate(atYears([0, 1, 2, 3, 4], [1, 2, 2, 4, 6])));
    expect(r.slopePerYear).toBeCloseTo(1.2, 10);
    expect(r.intercept).toBeCloseTo(0.6, 10);
    expect(r.standardError).toBeCloseTo(0.23094, 5);
    expect(r.r2).toBeCloseTo(0.9, 10);
    expect(r.ci95[0]).toBeCloseTo(0.4651, 3);
    expect(r.ci95[1]).toBeCloseTo(1.9349, 3);
    expect(r.n).toBe(5);
    expect(r.spanYears).toBeCloseTo(4, 10);
    expect(r.meanYears).toBeCloseTo(2, 10);
    expect(r.origin.toISOString()).toBe('2000-01-01T00:00:00.000Z');
  });

  // Anscombe (1973), "Graphs in Statistical Analysis", The American Statistician 27(1):17–21, data
  // set I and its stated summary: regression Y = 3 + 0.5X, standard error of the slope 0.118,
  // t = 4.24, r² = 0.667, N = 11. Data and summary recalled from memory; the summary figures
  // agreeing with the fit below is itself a check on the recalled data.
  const ANSCOMBE_X = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
  const ANSCOMBE_Y1 = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];

  it("Anscombe's data set I: slope 0.5, intercept 3.00, SE 0.118, t 4.24, r² 0.667 (from memory)", () => {
    const r = ok(fadingRate(atYears(ANSCOMBE_X, ANSCOMBE_Y1)));
    expect(r.n).toBe(11);
    expect(r.slopePerYear).toBeCloseTo(0.5, 3);
    // The origin of the fit is the earliest point, x = 4; the intercept at x = 0 is 3.00.
    expect(r.intercept - 4 * r.slopePerYear).toBeCloseTo(3.0, 2);
    expect(r.standardError).toBeCloseTo(0.118, 3);
    expect(r.slopePerYear / r.standardError).toBeCloseTo(4.24, 2);
    expect(r.r2).toBeCloseTo(0.667, 3);
    // t(0.975, 9) = 2.262 (t table): 0.5001 ± 2.262·0.1179 → [0.233, 0.767].
    expect(r.ci95[0]).toBeCloseTo(0.233, 3);
    expect(r.ci95[1]).toBeCloseTo(0.767, 3);
  });

  it.each([
    ['hand example', [0, 1, 2, 3, 4], [1, 2, 2, 4, 6]],
    ['Anscombe I', ANSCOMBE_X, ANSCOMBE_Y1],
    ['irregular ΔE00 sessions', [0, 0.9, 2.3, 5.1, 7.75, 12.4], [0, 0.31, 0.52, 1.35, 1.62, 2.9]],
    ['falling density', [0, 1.5, 3, 6, 10], [1.42, 1.4, 1.37, 1.33, 1.21]],
  ])('slope, intercept and r² agree with simple-statistics: %s', (_name, xs, ys) => {
    const r = ok(fadingRate(atYears(xs, ys)));
    const x0 = Math.min(...xs);
    const pairs = xs.map((x, i) => [x - x0, ys[i]]);
    const lr = linearRegression(pairs);
    expect(r.slopePerYear).toBeCloseTo(lr.m, 9);
    expect(r.intercept).toBeCloseTo(lr.b, 9);
    expect(r.r2).toBeCloseTo(rSquared(pairs, linearRegressionLine(lr)), 9);
  });

  it('accepts ISO strings and unordered points; years are 365.2425 days', () => {
    // 2000-01-01, 2004-01-01, 2002-01-01: 1461 and 731 days → 4.00007 and 2.00141 years.
    const r = ok(
      fadingRate([
        { t: '2000-01-01', value: 0 },
        { t: '2004-01-01', value: 2 },
        { t: '2002-01-01', value: 1 },
      ]),
    );
    expect(r.origin.toISOString()).toBe('2000-01-01T00:00:00.000Z');
    expect(r.spanYears).toBeCloseTo(1461 / 365.2425, 12);
  });

  it('refuses too few sessions', () => {
    const two = fadingRate(atYears([0, 5], [0, 1]));
    expect(two).toEqual({ ok: false, reason: 'not_enough_sessions', message: expect.stringMatching(/at least 3 sessions; this series has 2/) });
    // Two readings on the same date are one session.
    expect(fadingRate(atYears([0, 0, 5], [0, 0.1, 1]))).toMatchObject({ ok: false, reason: 'not_enough_sessions' });
    expect(fadingRate(atYears([0, 1, 2, 3], [0, 1, 2, 3]), { minSessions: 5 })).toMatchObject({ ok: false, reason: 'not_enough_sessions' });
    // Fewer than 3 is never accepted: the slope's error needs n − 2 ≥ 1.
    expect(fadingRate(atYears([0, 5], [0, 1]), { minSessions: 2 })).toMatchObject({ ok: false, reason: 'not_enough_sessions' });
  });

  it('refuses too short a span', () => {
    const r = fadingRate(atYears([0, 0.25, 0.5], [0, 0.1, 0.2]));
    expect(r).toEqual({ ok: false, reason: 'span_too_short', message: expect.stringMatching(/at least 1 year\(s\); this series spans 0\.50/) });
    expect(fadingRate(atYears([0, 0.25, 0.5], [0, 0.1, 0.2]), { minSpanYears: 0.5 }).ok).toBe(true);
    expect(fadingRate(atYears([0, 2, 4], [0, 1, 2]), { minSpanYears: 5 })).toMatchObject({ ok: false, reason: 'span_too_short' });
  });

  it('a constant series fits perfectly with slope 0', () => {
    const r = ok(fadingRate(atYears([0, 1, 3], [1.1, 1.1, 1.1])));
    expect(r.slopePerYear).toBe(0);
    expect(r.standardError).toBe(0);
    expect(r.r2).toBe(1);
  });
});

describe('noticeable-change threshold', () => {
  it('defaults to ΔE 2.0 with guidance naming 1.6 and 2 as a setting (REFERENCES.md §1)', () => {
    expect(DEFAULT_NOTICEABLE_DELTA_E).toBe(2.0);
    expect(NOTICEABLE_DELTA_E_GUIDANCE).toMatch(/1\.6/);
    expect(NOTICEABLE_DELTA_E_GUIDANCE).toMatch(/microfading/);
    // Thresholds cite a paper beside the figure, never a piece of software.
    expect(NOTICEABLE_DELTA_E_GUIDANCE).toMatch(/Whitmore.*1999/);
    expect(NOTICEABLE_DELTA_E_GUIDANCE).not.toMatch(/calculator|software|program/i);
    expect(NOTICEABLE_DELTA_E_GUIDANCE).toMatch(/setting/);
  });
});

describe('projectThreshold', () => {
  const baseline = { t: ORIGIN };

  it('ΔE = 0.5·years exactly from 2000-01-01 reaches 2.0 four years on, at 2004-01-01 within a day', () => {
    const r = ok(fadingRate(atYears([0, 1, 2, 3], [0, 0.5, 1, 1.5])));
    const p = projectThreshold(r, baseline);
    expect(p).toMatchObject({ reached: true, alreadyReached: false, threshold: 2 });
    if (!p.reached || p.alreadyReached) throw new Error('expected a projection');
    expect(Math.abs(p.date.getTime() - Date.parse('2004-01-01T00:00:00Z'))).toBeLessThan(DAY_MS);
    // Four 365.2425-day years = 1460.97 days: 2003-12-31T23:16:48Z.
    expect(Math.abs(p.date.getTime() - Date.parse('2003-12-31T23:16:48Z'))).toBeLessThan(1000);
    expect(p.yearsAfterBaseline).toBeCloseTo(4, 6);
    // An exact line has a zero-width slope interval.
    expect(Math.abs(p.interval.earliest.getTime() - p.date.getTime())).toBeLessThan(1000);
    expect(Math.abs((p.interval.latest?.getTime() ?? 0) - p.date.getTime())).toBeLessThan(1000);
  });

  it('the same on calendar anniversaries (1 January 2000–2003) lands within a day of 2004-01-01', () => {
    const r = ok(
      fadingRate([
        { t: '2000-01-01', value: 0 },
        { t: '2001-01-01', value: 0.5 },
        { t: '2002-01-01', value: 1 },
        { t: '2003-01-01', value: 1.5 },
      ]),
    );
    const p = projectThreshold(r, { t: '2000-01-01' }, 2.0);
    if (!p.reached || p.alreadyReached) throw new Error('expected a projection');
    expect(Math.abs(p.date.getTime() - Date.parse('2004-01-01T00:00:00Z'))).toBeLessThan(DAY_MS);
  });

  it('interval from the slope CI pivots on the fitted centre (hand-computed example)', () => {
    // Fit from the hand example: slope 1.2, centre (2 y, 3), CI [0.465046, 1.934954].
    // Threshold 10: date 2 + 7/1.2 = 7.8333 y; earliest 2 + 7/1.934954 = 5.6177 y;
    // latest 2 + 7/0.465046 = 17.0523 y.
    const r = ok(fadingRate(atYears([0, 1, 2, 3, 4], [1, 2, 2, 4, 6])));
    const p = projectThreshold(r, baseline, 10);
    if (!p.reached || p.alreadyReached) throw new Error('expected a projection');
    expect(yearsBetween(ORIGIN, p.date)).toBeCloseTo(7.8333, 3);
    expect(yearsBetween(ORIGIN, p.interval.earliest)).toBeCloseTo(5.6177, 3);
    expect(yearsBetween(ORIGIN, p.interval.latest as Date)).toBeCloseTo(17.0523, 3);
  });

  it('leaves the late end open when the lower slope is ≤ 0 (hand-computed example)', () => {
    // x = 0..3, y = 0.5, 0.2, 0.9, 0.6: x̄ = 1.5, ȳ = 0.55, Sxx = 5, Sxy = 0.5 → slope 0.1;
    // residuals 0.1, −0.3, 0.3, −0.1, SSR = 0.2, SE = sqrt(0.1)/sqrt(5) = 0.141421;
    // t(0.975, 2) = 4.303 (t table) → CI 0.1 ± 0.6085 = [−0.5085, 0.7085].
    // Threshold 2: date 1.5 + 1.45/0.1 = 16 y; earliest 1.5 + 1.45/0.7085 = 3.5466 y.
    const r = ok(fadingRate(atYears([0, 1, 2, 3], [0.5, 0.2, 0.9, 0.6])));
    expect(r.ci95[0]).toBeCloseTo(-0.5085, 3);
    const p = projectThreshold(r, baseline, 2);
    if (!p.reached || p.alreadyReached) throw new Error('expected a projection');
    expect(yearsBetween(ORIGIN, p.date)).toBeCloseTo(16, 6);
    expect(yearsBetween(ORIGIN, p.interval.earliest)).toBeCloseTo(3.5466, 3);
    expect(p.interval.latest).toBeNull();
  });

  it('reports yearsAfterBaseline from the given baseline date', () => {
    const r = ok(fadingRate(atYears([1, 2, 3], [0.5, 1, 1.5])));
    const p = projectThreshold(r, { t: ORIGIN }, 2);
    if (!p.reached || p.alreadyReached) throw new Error('expected a projection');
    expect(p.yearsAfterBaseline).toBeCloseTo(4, 6);
    expect(yearsBetween(r.origin, p.date)).toBeCloseTo(3, 6);
  });

  it('a flat or falling trend is not reached', () => {
    const falling = ok(fadingRate(atYears([0, 1, 2], [1, 0.9, 0.8])));
    expect(projectThreshold(falling, baseline)).toEqual({ reached: false, threshold: 2, reason: 'not reached on current trend' });
    const flat = ok(fadingRate(atYears([0, 1, 2], [1, 1, 1])));
    expect(projectThreshold(flat, baseline, 2, atYears([0, 1, 2], [1, 1, 1]))).toMatchObject({ reached: false });
  });

  it('already reached: the first observed session at or over the threshold', () => {
    const series = atYears([0, 1, 2, 3], [0, 1.0, 2.5, 3]);
    const r = ok(fadingRate(series));
    const p = projectThreshold(r, baseline, 2, series);
    expect(p).toMatchObject({ reached: true, alreadyReached: true, basis: 'observed' });
    if (!p.reached || !p.alreadyReached) throw new Error('expected already reached');
    expect(p.firstDate.getTime()).toBe(addYears(ORIGIN, 2).getTime());
    expect(p.yearsAfterBaseline).toBeCloseTo(2, 10);
    // A single latest reading also counts, and so does a falling trend that is already over.
    const latest = { t: '2010-06-01', value: 2.2 };
    const q = projectThreshold(ok(fadingRate(atYears([0, 1, 2], [2.4, 2.3, 2.2]))), baseline, 2, latest);
    expect(q).toMatchObject({ reached: true, alreadyReached: true, basis: 'observed', firstDate: new Date('2010-06-01') });
  });

  it('already reached on the fitted line when no observations are given', () => {
    // ΔE = 1.5·years exactly, last session at 2 y (ΔE 3): the line crossed 2.0 at 2/1.5 = 1.3333 y.
    const r = ok(fadingRate(atYears([0, 1, 2], [0, 1.5, 3])));
    const p = projectThreshold(r, baseline);
    expect(p).toMatchObject({ reached: true, alreadyReached: true, basis: 'fitted' });
    if (!p.reached || !p.alreadyReached) throw new Error('expected already reached');
    expect(yearsBetween(ORIGIN, p.firstDate)).toBeCloseTo(4 / 3, 6);
  });
});
