import { describe, expect, it } from 'vitest';
import { linearRegression } from 'simple-statistics';
import { DEFAULT_NOTICEABLE_DELTA_E } from './fading';
import { fitLightCost, LIGHT_COST_ASSUMPTIONS, predictDisplayCost, type LightCostFit, type LightCostSession } from './light-cost';
import type { DisplayPeriodInput } from './light-dose';

// Four displays of 50 days each at 200 lx × 10 h = 2,000 lx·h a day: 100,000 lx·h = 0.1 Mlx·h each,
// with a measurement session after each. Exposure since the 2024-01-01 baseline: 0.1, 0.2, 0.3, 0.4 Mlx·h.
const DISPLAYS: DisplayPeriodInput[] = [
  { start: '2024-01-10', end: '2024-02-28', lux: 200, hoursPerDay: 10 }, // 22 + 28 days
  { start: '2024-04-01', end: '2024-05-20', lux: 200, hoursPerDay: 10 }, // 30 + 20 days
  { start: '2024-07-01', end: '2024-08-19', lux: 200, hoursPerDay: 10 }, // 31 + 19 days
  { start: '2024-10-01', end: '2024-11-19', lux: 200, hoursPerDay: 10 }, // 31 + 19 days
];
const DATES = ['2024-01-01', '2024-03-15', '2024-06-01', '2024-09-01', '2024-12-01'];
const series = (ys: number[]): LightCostSession[] => DATES.map((date, i) => ({ date, deltaE00: i === 0 ? 0 : ys[i - 1] }));

// A noisy series, by hand: x = 0.1, 0.2, 0.3, 0.4; y = 0.09, 0.17, 0.26, 0.30.
//   Σx² = 0.30, Σxy = 0.009 + 0.034 + 0.078 + 0.120 = 0.241, b = 0.241 / 0.30 = 0.80333…
//   residuals y − bx = 0.009667, 0.009333, 0.019000, −0.021333; SSR = 0.00099667
//   s² = SSR / 3 = 0.00033222; se = √(s² / Σx²) = √0.00110741 = 0.033278
//   t(0.975, 3) = 3.182 (standard t table [memory]); half width 3.182 × 0.033278 = 0.10589
//   95 % interval [0.6974, 0.9092]; uncentred R² = 1 − 0.00099667 / 0.1946 = 0.99488.
const NOISY = [0.09, 0.17, 0.26, 0.3];

function ok(r: ReturnType<typeof fitLightCost>): LightCostFit {
  if (r.status !== 'ok') throw new Error(`expected a fit, got ${r.reason}`);
  return r;
}

describe('fitLightCost: ΔE00 per million lux-hours through the baseline', () => {
  it('computes each session’s exposure since the baseline', () => {
    const f = ok(fitLightCost(series([0.08, 0.16, 0.24, 0.32]), DISPLAYS));
    expect(f.points.map((p) => p.megaLuxHours)).toEqual([0, 0.1, 0.2, 0.3, 0.4].map((x) => expect.closeTo(x, 12)));
  });

  it('an exact line y = 0.8·x gives slope 0.8 and an interval of zero width', () => {
    const f = ok(fitLightCost(series([0.08, 0.16, 0.24, 0.32]), DISPLAYS));
    expect(f.slopePerMlxh).toBeCloseTo(0.8, 12);
    expect(f.ci95[0]).toBeCloseTo(0.8, 10);
    expect(f.ci95[1]).toBeCloseTo(0.8, 10);
    expect(f.r2).toBeCloseTo(1, 12);
    expect(f).toMatchObject({ n: 5, df: 3 });
    expect(f.assumptions).toBe(LIGHT_COST_ASSUMPTIONS);
  });

  it('takes sessions in any order', () => {
    const shuffled = [...series([0.08, 0.16, 0.24, 0.32])].reverse();
    expect(ok(fitLightCost(shuffled, DISPLAYS)).slopePerMlxh).toBeCloseTo(0.8, 12);
  });


  it('a noisy series: slope and interval as worked by hand', () => {
    const f = ok(fitLightCost(series(NOISY), DISPLAYS));
    expect(f.slopePerMlxh).toBeCloseTo(0.80333, 5);
    expect(f.standardError).toBeCloseTo(0.033278, 6);
    expect(f.ci95[0]).toBeCloseTo(0.6974, 3);
    expect(f.ci95[1]).toBeCloseTo(0.9092, 3);
    expect(f.r2).toBeCloseTo(0.99488, 5);
  });

  it('a noisy series: slope and standard error agree with simple-statistics on the data mirrored through the origin', () => {
    // Adding (−x, −y) for every (x, y) makes the means zero, so ordinary least squares with an intercept
    // gives intercept 0 and slope Σxy/Σx², the fit through the origin. Its residual sum is twice ours over
    // 2m − 2 = 2(m − 1) degrees of freedom against twice our Σx², so its SE is ours divided by √2.
    const xs = [0.1, 0.2, 0.3, 0.4];
    const pts = xs.flatMap((x, i) => [[x, NOISY[i]], [-x, -NOISY[i]]]);
    const lr = linearRegression(pts);
    const ssr = pts.reduce((s, [x, y]) => s + (y - (lr.m * x + lr.b)) ** 2, 0);
    const sxx = pts.reduce((s, [x]) => s + x * x, 0);
    const seMirror = Math.sqrt(ssr / (pts.length - 2) / sxx);
    const f = ok(fitLightCost(series(NOISY), DISPLAYS));
    expect(lr.b).toBeCloseTo(0, 12);
    expect(f.slopePerMlxh).toBeCloseTo(lr.m, 12);
    expect(f.standardError).toBeCloseTo(seMirror * Math.SQRT2, 12);
    // The interval's t is jstat's quantile; a standard t table gives t(0.975, 3) = 3.182 [memory].
    const t = (f.ci95[1] - f.slopePerMlxh) / f.standardError;
    expect(t).toBeCloseTo(3.182, 3);
  });

  it('a session counts the days before its own: one on a display’s last day has not yet had that day', () => {
    // Display 2024-01-10 … 2024-01-19 at 100 lx × 10 h = 1,000 lx·h a day. A session on 2024-01-19 has had
    // 9 days (0.009 Mlx·h); one on 2024-01-20 all 10 (0.010 Mlx·h).
    const f = ok(fitLightCost([
      { date: '2024-01-01', deltaE00: 0 }, { date: '2024-01-19', deltaE00: 0.01 }, { date: '2024-01-20', deltaE00: 0.01 },
    ], [{ start: '2024-01-10', end: '2024-01-19', lux: 100, hoursPerDay: 10 }]));
    expect(f.points.map((p) => p.megaLuxHours)).toEqual([0, 0.009, 0.01]);
  });

  it('a session with no exposure before it still counts its scatter', () => {
    // Baseline 2024-01-01, a repeat on 2024-01-05 before any display (x = 0, y = 0.1), then two sessions.
    const f = ok(fitLightCost([
      { date: '2024-01-01', deltaE00: 0 }, { date: '2024-01-05', deltaE00: 0.1 },
      { date: '2024-03-15', deltaE00: 0.08 }, { date: '2024-06-01', deltaE00: 0.16 },
    ], DISPLAYS));
    // b = (0.1·0.08 + 0.2·0.16) / (0.01 + 0.04) = 0.04 / 0.05 = 0.8; SSR = 0.1² = 0.01 over df 2.
    expect(f.slopePerMlxh).toBeCloseTo(0.8, 12);
    expect(f.df).toBe(2);
    expect(f.standardError).toBeCloseTo(Math.sqrt(0.01 / 2 / 0.05), 12);
  });
});

describe('fitLightCost says "not enough data" honestly', () => {
  it('fewer than three sessions, the baseline included', () => {
    const r = fitLightCost(series([0.08]).slice(0, 2), DISPLAYS);
    expect(r).toMatchObject({ status: 'not_enough_data', reason: 'fewer_than_three_sessions' });
    expect(fitLightCost([], DISPLAYS).status).toBe('not_enough_data');
  });

  it('no exposure between the first and the last session', () => {
    expect(fitLightCost(series([0.1, 0.1, 0.2, 0.2]), [])).toMatchObject({ status: 'not_enough_data', reason: 'no_exposure_between_sessions' });
    // Displays only before the baseline or after the last session do not count.
    const outside: DisplayPeriodInput[] = [
      { start: '2023-01-01', end: '2023-12-31', lux: 200, hoursPerDay: 10 },
      { start: '2024-12-01', end: '2025-03-01', lux: 200, hoursPerDay: 10 },
    ];
    const r = fitLightCost(series([0.1, 0.1, 0.2, 0.2]), outside);
    expect(r.status).toBe('not_enough_data');
    if (r.status === 'not_enough_data') expect(r.message).toMatch(/^Not enough data/);
  });

  it('refuses a baseline whose ΔE00 is not 0 and values that are not numbers', () => {
    expect(() => fitLightCost([{ date: '2024-01-01', deltaE00: 0.5 }, ...series(NOISY).slice(1)], DISPLAYS)).toThrow(/baseline/);
    expect(() => fitLightCost(series([Number.NaN, 0.1, 0.2, 0.3]), DISPLAYS)).toThrow(RangeError);
    expect(() => fitLightCost([{ date: '2024-13-01', deltaE00: 0 }], DISPLAYS)).toThrow(RangeError);
  });
});

describe('predictDisplayCost', () => {
  const exact = ok(fitLightCost(series([0.08, 0.16, 0.24, 0.32]), DISPLAYS));
  const noisy = ok(fitLightCost(series(NOISY), DISPLAYS));

  it('uses the project’s noticeable-change threshold by default', () => {
    expect(predictDisplayCost(exact, 0, 0).threshold).toBe(DEFAULT_NOTICEABLE_DELTA_E);
  });

  it('500,000 lx·h at 0.8 ΔE00 per Mlx·h adds 0.4', () => {
    const c = predictDisplayCost(exact, 500_000, 1.5, 2);
    expect(c.addedDeltaE).toBeCloseTo(0.4, 12);
    expect(c.expectedDeltaE).toBeCloseTo(1.9, 12);
    expect(c).toMatchObject({ crosses: false, mayCross: false, alreadyOver: false });
  });

  it('crosses the threshold when the expected value reaches it', () => {
    expect(predictDisplayCost(exact, 500_000, 1.7, 2)).toMatchObject({ crosses: true, alreadyOver: false });
    expect(predictDisplayCost(exact, 500_000, 2, 2)).toMatchObject({ crosses: false, alreadyOver: true });
  });

  it('the interval scales the slope’s interval; its upper end may cross when the expected value does not', () => {
    // 0.5 Mlx·h × [0.6974, 0.9092] = [0.3487, 0.4546]; from 1.58: expected 1.58 + 0.4017 = 1.98, upper 2.0346.
    const c = predictDisplayCost(noisy, 500_000, 1.58, 2);
    expect(c.addedInterval[0]).toBeCloseTo(0.3487, 3);
    expect(c.addedInterval[1]).toBeCloseTo(0.4546, 3);
    expect(c).toMatchObject({ crosses: false, mayCross: true });
  });

  it('refuses negative or non-numeric input', () => {
    expect(() => predictDisplayCost(exact, -1, 0)).toThrow(RangeError);
    expect(() => predictDisplayCost(exact, 1, Number.NaN)).toThrow(RangeError);
  });
});
