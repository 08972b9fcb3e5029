import { describe, expect, it } from 'vitest';
import { linearRegression, linearRegressionLine, sumNthPowerDeviations } from 'simple-statistics';
import type { Lab, MeasurementConditions } from './colour';
import {
  analyseSpotHistory, compareRankedSpots, densityOf, fittedPoints, latestDeltaE00, type RankedSpot, type SpotObservation,
} from './spot-analysis';

// Sharma, Wu & Dalal (2005), Color Res. Appl. 30(1):21–30, Table 1 (REFERENCES.md §1, published).
// Pairs 1–4 share their second colour, so with that colour as the baseline each pair's first
// colour is a later reading whose ΔE00 from the baseline is the published value (ΔE00 is symmetric).
const SHARED: Lab = { L: 50, a: 0, b: -82.7485 };
const PAIR_1: Lab = { L: 50, a: 2.6772, b: -79.7751 }; // ΔE00 2.0425
const PAIR_2: Lab = { L: 50, a: 3.1571, b: -77.2803 }; // ΔE00 2.8615
const PAIR_3: Lab = { L: 50, a: 2.8361, b: -74.02 }; // ΔE00 3.4412
const PAIR_4: Lab = { L: 50, a: -1.3802, b: -84.2814 }; // ΔE00 1.0000

const D50: MeasurementConditions = { illuminant: 'D50', observer: '2', geometry: '45/0', condition: 'M0' };

let serial = 0;
function obs(measuredOn: string, lab: Lab, extra: Partial<SpotObservation> = {}): SpotObservation {
  serial += 1;
  return {
    sessionId: `s-${measuredOn}-${serial}`, measuredOn, recordedAt: `${measuredOn}T12:00:00Z`, conditions: D50, lab,
    density: null, densityType: null, reflectance: null, ...extra,
  };
}

/** Decimal years of 365.2425 days after `origin` (the convention fading.ts documents). */
const years = (origin: string, d: string) => (Date.parse(d) - Date.parse(origin)) / (365.2425 * 86_400_000);

/** Slope, intercept, standard error of the slope and the line, by simple-statistics. */
function reference(xs: number[], ys: number[]) {
  const pairs = xs.map((x, i) => [x, ys[i]]);
  const lr = linearRegression(pairs);
  const line = linearRegressionLine(lr);
  const ssr = pairs.reduce((s, [x, y]) => s + (y - line(x)) ** 2, 0);
  const se = Math.sqrt(ssr / (xs.length - 2)) / Math.sqrt(sumNthPowerDeviations(xs, 2));
  return { m: lr.m, b: lr.b, se };
}

// A fading blue: the shared colour first, then the first colours of pairs 4, 1, 2 and 3.
const FADING = [
  obs('2000-01-01', SHARED, { density: 1.5, densityType: 'visual' }),
  obs('2002-01-01', PAIR_4, { density: 1.47, densityType: 'visual' }),
  obs('2004-01-01', PAIR_1, { density: 1.41, densityType: 'visual' }),
  obs('2006-01-01', PAIR_2, { density: 1.38, densityType: 'visual' }),
  obs('2008-01-01', PAIR_3, { density: 1.35, densityType: 'visual' }),
];
const PUBLISHED = [0, 1.0, 2.0425, 2.8615, 3.4412];

describe('analyseSpotHistory: change against the first session', () => {
  const a = analyseSpotHistory([...FADING].reverse(), { baselineSessionId: null, threshold: 2 });

  it('takes the first session by date as the baseline and orders the points by date', () => {
    expect(a.baseline).toEqual({ sessionId: FADING[0].sessionId, measuredOn: '2000-01-01', lab: SHARED, density: 1.5, chosen: false });
    expect(a.points.map((p) => p.measuredOn)).toEqual(['2000-01-01', '2002-01-01', '2004-01-01', '2006-01-01', '2008-01-01']);
  });

  it('gives each session the ΔE00 of Sharma et al. 2005 Table 1 (pairs 4, 1, 2, 3)', () => {
    expect(a.points.map((p) => p.dE00!.toFixed(4))).toEqual(PUBLISHED.map((v) => v.toFixed(4)));
  });

  it('splits pair 1 into ΔL, ΔC, ΔH and names the loss of chroma (pair 1 reversed; hand arithmetic in colour.test.ts)', () => {
    // Pair 1 forward (first → second colour) has ΔC = +2.9285, ΔH = −2.7263 and ΔE76 = 4.0011;
    // here the baseline is the second colour, so both signs turn.
    const p = a.points[2];
    expect(p.dL).toBe(0);
    expect(p.dC!.toFixed(4)).toBe('-2.9285');
    expect(p.dH!.toFixed(4)).toBe('2.7263');
    expect(p.dE76!.toFixed(4)).toBe('4.0011');
    expect(p.dominant).toBe('loss of chroma');
    expect(a.points[0].dominant).toBeNull();
  });

  it('gives the density change and % loss against the baseline density (hand arithmetic)', () => {
    // 1.50 → 1.35: ΔD = −0.15, (1.50 − 1.35) / 1.50 = 10 %.
    expect(a.points[4].dD).toBeCloseTo(-0.15, 12);
    expect(a.points[4].densityLossPercent).toBeCloseTo(10, 12);
    expect(a.points[1].densityLossPercent).toBeCloseTo(2, 12);
  });

  it('fits ΔE00 per year as simple-statistics does, with slope ± t(0.975, 3)·SE', () => {
    const xs = FADING.map((o) => years('2000-01-01', o.measuredOn));
    const ref = reference(xs, PUBLISHED);
    if (!a.rate?.ok) throw new Error('expected a rate');
    // Our ΔE00 agree with the table to 4 decimals, so the fit agrees to about that.
    expect(a.rate.slopePerYear).toBeCloseTo(ref.m, 4);
    expect(a.rate.intercept).toBeCloseTo(ref.b, 4);
    expect(a.rate.standardError).toBeCloseTo(ref.se, 4);
    expect(a.rate.n).toBe(5);
    // t(0.975, 3) = 3.182 (Student t table, e.g. NIST/SEMATECH e-Handbook §1.3.6.7.2).
    expect(a.rate.ci95[0]).toBeCloseTo(ref.m - 3.182 * ref.se, 3);
    expect(a.rate.ci95[1]).toBeCloseTo(ref.m + 3.182 * ref.se, 3);
  });

  it('fits the density loss per year as simple-statistics does', () => {
    const xs = FADING.map((o) => years('2000-01-01', o.measuredOn));
    const losses = FADING.map((o) => ((1.5 - o.density!) / 1.5) * 100);
    const ref = reference(xs, losses);
    if (!a.densityLossRate?.ok) throw new Error('expected a density rate');
    expect(a.densityLossRate.slopePerYear).toBeCloseTo(ref.m, 9);
    expect(a.densityLossRate.intercept).toBeCloseTo(ref.b, 9);
  });

  it('fits the density change in D per year as simple-statistics does on the densities themselves', () => {
    const xs = FADING.map((o) => years('2000-01-01', o.measuredOn));
    const ref = reference(xs, FADING.map((o) => o.density!));
    if (!a.densityChangeRate?.ok) throw new Error('expected a density change rate');
    expect(a.densityChangeRate.slopePerYear).toBeCloseTo(ref.m, 9);
    // The fit is of ΔD = D − 1.50, so its intercept is that of D less the baseline density.
    expect(a.densityChangeRate.intercept).toBeCloseTo(ref.b - 1.5, 9);
  });

  it('a threshold already passed: first reached at the first observed session at or above it (2.0425 ≥ 2 in 2004)', () => {
    expect(a.projection).toMatchObject({ reached: true, alreadyReached: true, basis: 'observed', threshold: 2 });
    expect(a.projection!.reached && a.projection!.alreadyReached && a.projection!.firstDate.toISOString()).toBe('2004-01-01T00:00:00.000Z');
  });

  it('a threshold ahead: the date where the simple-statistics line reaches it', () => {
    const ahead = analyseSpotHistory(FADING, { baselineSessionId: null, threshold: 5 });
    const xs = FADING.map((o) => years('2000-01-01', o.measuredOn));
    const ref = reference(xs, PUBLISHED);
    const expected = Date.parse('2000-01-01') + ((5 - ref.b) / ref.m) * 365.2425 * 86_400_000;
    const p = ahead.projection;
    if (!p?.reached || p.alreadyReached) throw new Error('expected a projected date');
    // Within a day: the fit agrees with the table's values to about 1e-4 ΔE00.
    expect(Math.abs(p.date.getTime() - expected)).toBeLessThan(86_400_000);
    expect(p.interval.earliest.getTime()).toBeLessThan(p.date.getTime());
  });

  it('latestDeltaE00 is that of the last fitted session (pair 3: 3.4412)', () => {
    expect(latestDeltaE00(a)!.toFixed(4)).toBe('3.4412');
  });
});

describe('analyseSpotHistory: density rates in D per year and in % of the baseline per year', () => {
  // D = 1.34, 1.24, 1.14 at 0, 9 and 18 years.
  const series = [
    obs('2000-01-01', SHARED, { density: 1.34, densityType: 'visual' }),
    obs('2009-01-01', SHARED, { density: 1.24, densityType: 'visual' }),
    obs('2018-01-01', SHARED, { density: 1.14, densityType: 'visual' }),
  ];
  const a = analyseSpotHistory(series, { baselineSessionId: null, threshold: 2 });
  const xs = series.map((o) => years('2000-01-01', o.measuredOn));

  it('D per year: −0.0111 (hand arithmetic: −0.20 D over 18 years; simple-statistics linearRegression)', () => {
    if (!a.densityChangeRate?.ok) throw new Error('expected a density change rate');
    // Hand arithmetic: (1.14 − 1.34) / 18 = −0.01111 D/year. The dates are 9.0022 and 18.0017
    // years of 365.2425 days apart, so the fitted slope is −0.011110: −0.0111 to four places.
    expect(a.densityChangeRate.slopePerYear).toBeCloseTo(-0.0111, 4);
    expect(a.densityChangeRate.slopePerYear).toBeCloseTo(linearRegression(xs.map((x, i) => [x, series[i].density!])).m, 12);
    // Not the percentage: 0.83 %/year would be read as 75 times the real loss of density.
    expect(Math.abs(a.densityChangeRate.slopePerYear)).toBeLessThan(0.02);
  });

  it('% of the baseline density per year: 0.829 (hand arithmetic: 14.93 % over 18 years; simple-statistics)', () => {
    if (!a.densityLossRate?.ok) throw new Error('expected a density loss rate');
    // Hand arithmetic: (1.34 − 1.14) / 1.34 = 14.925 % lost by the last session; 14.925 / 18 = 0.829 %/year.
    expect(a.points[2].densityLossPercent).toBeCloseTo(14.925, 3);
    expect(a.densityLossRate.slopePerYear).toBeCloseTo(0.829, 3);
    const losses = series.map((o) => ((1.34 - o.density!) / 1.34) * 100);
    expect(a.densityLossRate.slopePerYear).toBeCloseTo(linearRegression(xs.map((x, i) => [x, losses[i]])).m, 10);
  });

  it('the two rates are one fit in two units: % per year = −100 · (D per year) / baseline D, interval included', () => {
    const d = a.densityChangeRate;
    const p = a.densityLossRate;
    if (!d?.ok || !p?.ok) throw new Error('expected both rates');
    expect(p.slopePerYear).toBeCloseTo((-100 * d.slopePerYear) / 1.34, 10);
    expect(p.ci95[0]).toBeCloseTo((-100 * d.ci95[1]) / 1.34, 8);
    expect(p.ci95[1]).toBeCloseTo((-100 * d.ci95[0]) / 1.34, 8);
  });

  it('a baseline density of 0 gives a rate in D per year but no percentage', () => {
    const b = analyseSpotHistory(
      [obs('2000-01-01', SHARED, { density: 0 }), obs('2005-01-01', SHARED, { density: 0.01 }), obs('2010-01-01', SHARED, { density: 0.02 })],
      { baselineSessionId: null, threshold: 2 },
    );
    expect(b.densityChangeRate?.ok).toBe(true);
    expect(b.densityLossRate).toBeNull();
  });
});

describe('analyseSpotHistory: sessions that cannot be compared', () => {
  const d65 = obs('2005-01-01', PAIR_1, { conditions: { ...D50, illuminant: 'D65' }, density: 1.2, densityType: 'visual' });
  const a = analyseSpotHistory([...FADING, d65], { baselineSessionId: null, threshold: 2 });

  it('keeps the reading and density of a session under another illuminant, with the reason and no differences', () => {
    const p = a.points.find((x) => x.sessionId === d65.sessionId)!;
    expect(p).toMatchObject({ comparable: false, dE00: null, dE76: null, dL: null, dC: null, dH: null, dominant: null, dD: null, densityLossPercent: null, lab: PAIR_1, density: 1.2 });
    expect(p.reason).toMatch(/D50\/2°.*D65\/2°.*not comparable without conversion/);
  });

  it('leaves it out of the rate: the fit is that of the five comparable sessions (simple-statistics)', () => {
    const xs = FADING.map((o) => years('2000-01-01', o.measuredOn));
    const ref = reference(xs, PUBLISHED);
    if (!a.rate?.ok) throw new Error('expected a rate');
    expect(a.rate.n).toBe(5);
    expect(a.rate.slopePerYear).toBeCloseTo(ref.m, 4);
    expect(fittedPoints(a).map((p) => p.sessionId)).not.toContain(d65.sessionId);
  });

  it('gives no ΔD when both readings name a kind of density and the kinds differ', () => {
    const statusA = obs('2009-01-01', PAIR_3, { density: 1.3, densityType: 'status_a' });
    const unnamed = obs('2010-01-01', PAIR_3, { density: 1.29, densityType: null });
    const b = analyseSpotHistory([FADING[0], statusA, unnamed], { baselineSessionId: null, threshold: 2 });
    expect(b.points[1]).toMatchObject({ comparable: true, density: 1.3, dD: null, densityLossPercent: null });
    expect(b.points[1].dE00!.toFixed(4)).toBe('3.4412');
    // An unnamed kind is compared: 1.50 → 1.29 is ΔD −0.21, 14 % (hand arithmetic).
    expect(b.points[2].dD).toBeCloseTo(-0.21, 12);
    expect(b.points[2].densityLossPercent).toBeCloseTo(14, 12);
  });
});

describe('analyseSpotHistory: a chosen baseline', () => {
  it('compares every session with the chosen one and fits only from its date on', () => {
    // After a treatment the 2004 reading (pair 1's first colour) is chosen as the baseline. Later
    // readings are that colour again (ΔE00 0) or the shared colour (ΔE00 2.0425, Table 1 pair 1).
    const history = [
      obs('2000-01-01', SHARED), obs('2002-01-01', PAIR_4),
      obs('2004-01-01', PAIR_1), obs('2006-01-01', PAIR_1), obs('2008-01-01', SHARED), obs('2010-01-01', SHARED),
    ];
    const chosen = history[2];
    const a = analyseSpotHistory(history, { baselineSessionId: chosen.sessionId, threshold: 2 });
    expect(a.baseline).toMatchObject({ sessionId: chosen.sessionId, measuredOn: '2004-01-01', chosen: true });
    // The 2000 reading is shown against the new baseline (pair 1, 2.0425) but not fitted.
    expect(a.points[0].dE00!.toFixed(4)).toBe('2.0425');
    expect(fittedPoints(a).map((p) => p.measuredOn)).toEqual(['2004-01-01', '2006-01-01', '2008-01-01', '2010-01-01']);
    const xs = ['2004-01-01', '2006-01-01', '2008-01-01', '2010-01-01'].map((d) => years('2004-01-01', d));
    const ref = reference(xs, [0, 0, 2.0425, 2.0425]);
    if (!a.rate?.ok) throw new Error('expected a rate');
    expect(a.rate.n).toBe(4);
    expect(a.rate.origin.toISOString()).toBe('2004-01-01T00:00:00.000Z');
    expect(a.rate.slopePerYear).toBeCloseTo(ref.m, 4);
    // Reached first in 2008, after the new baseline; the 2000 reading (also ≥ 2) does not count.
    expect(a.projection!.reached && a.projection!.alreadyReached && a.projection!.firstDate.toISOString()).toBe('2008-01-01T00:00:00.000Z');
  });

  it('falls back to the first session when the chosen one did not measure the spot', () => {
    const a = analyseSpotHistory(FADING, { baselineSessionId: 'another-session', threshold: 2 });
    expect(a.baseline).toMatchObject({ sessionId: FADING[0].sessionId, chosen: false });
  });
});

describe('analyseSpotHistory: edges', () => {
  it('no readings: no baseline, no points, no rate', () => {
    expect(analyseSpotHistory([], { baselineSessionId: null, threshold: 2 })).toEqual({ baseline: null, points: [], rate: null, densityChangeRate: null, densityLossRate: null, projection: null });
  });

  it('two sessions: a refused rate, no projection; no density rate without a baseline density', () => {
    const a = analyseSpotHistory([obs('2000-01-01', SHARED), obs('2003-01-01', PAIR_1)], { baselineSessionId: null, threshold: 2 });
    expect(a.rate).toMatchObject({ ok: false, reason: 'not_enough_sessions' });
    expect(a.projection).toBeNull();
    expect(a.densityLossRate).toBeNull();
    expect(a.densityChangeRate).toBeNull();
  });

  it('sessions of the same day are ordered by when they were recorded', () => {
    const later = obs('2001-05-05', PAIR_1, { recordedAt: new Date('2001-05-05T15:00:00Z') });
    const earlier = obs('2001-05-05', SHARED, { recordedAt: new Date('2001-05-05T09:00:00Z') });
    const a = analyseSpotHistory([later, earlier], { baselineSessionId: null, threshold: 2 });
    expect(a.baseline!.sessionId).toBe(earlier.sessionId);
    expect(a.points[1].dE00!.toFixed(4)).toBe('2.0425');
  });

  it('a density from the reflectance when none is given: R = 0.1 → D = 1 (D = −log10 R)', () => {
    expect(densityOf({ density: null, reflectance: 0.1 })).toBeCloseTo(1, 12);
    expect(densityOf({ density: 1.62, reflectance: 0.1 })).toBe(1.62);
    expect(densityOf({ density: null, reflectance: null })).toBeNull();
    const a = analyseSpotHistory([obs('2000-01-01', SHARED, { reflectance: 0.1 }), obs('2001-01-01', SHARED, { reflectance: 0.125 })], { baselineSessionId: null, threshold: 2 });
    // D = −log10 0.125 = 3·log10 2 = 0.90309 (log10 2 = 0.30103, log tables); loss (1 − 0.90309) / 1 = 9.691 %.
    expect(a.baseline!.density).toBeCloseTo(1, 12);
    expect(a.points[1].densityLossPercent).toBeCloseTo(9.691, 3);
  });
});

describe('compareRankedSpots', () => {
  const spot = (spotName: string, accessionSort: string, ratePerYear: number | null, latestDeltaE00: number | null): RankedSpot => ({ spotName, accessionSort, ratePerYear, latestDeltaE00 });
  const spots = [
    spot('Dmax', '0002', 0.1, 3),
    spot('Highlight', '0001', null, 5),
    spot('Dmax', '0001', 0.4, 1),
    spot('Margin', '0001', 0.1, 3),
    spot('Mid-tone', '0003', 0.1, null),
    spot('Dmax', '0003', null, null),
  ];
  const names = (xs: RankedSpot[]) => xs.map((s) => `${s.accessionSort} ${s.spotName}`);

  it('by rate: faster first, then larger change, unknowns last, ties by accession then spot name', () => {
    expect(names([...spots].sort(compareRankedSpots('rate')))).toEqual([
      '0001 Dmax', '0001 Margin', '0002 Dmax', '0003 Mid-tone', '0001 Highlight', '0003 Dmax',
    ]);
  });

  it('by change: larger latest ΔE00 first, then faster, unknowns last', () => {
    expect(names([...spots].sort(compareRankedSpots('change')))).toEqual([
      '0001 Highlight', '0001 Margin', '0002 Dmax', '0001 Dmax', '0003 Mid-tone', '0003 Dmax',
    ]);
  });
});
