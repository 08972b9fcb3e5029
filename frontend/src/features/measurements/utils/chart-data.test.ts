import { describe, expect, it } from 'vitest';
import { MS_PER_YEAR } from '@toneledger/common/domain/fading';
import { changeChartData, dayToMs } from '@/features/measurements/utils/chart-data';
import { makeAnalysis, SESSION2_ID } from '@/features/measurements/testing/fixtures';

describe('chart data', () => {
  it('plots only comparable points, and lists the others with their reason', () => {
    const data = changeChartData(makeAnalysis(), 2);
    expect(data.observed).toEqual([
      { t: dayToMs('2000-05-03'), value: 0 },
      { t: dayToMs('2024-05-03'), value: 1.42 },
    ]);
    expect(data.observed.some((p) => p.t === dayToMs('2012-05-03'))).toBe(false);
    expect(data.excluded).toEqual([
      { sessionId: SESSION2_ID, measuredOn: '2012-05-03', reason: 'Baseline measured under D50/2°, this session under D65/10°: not comparable without conversion' },
    ]);
    // Density loss is plotted for comparable sessions only, too.
    expect(data.densityLoss.map((p) => p.value)).toEqual([0, 8.33]);
  });

  it('does not plot a point marked comparable that has no ΔE00', () => {
    const analysis = makeAnalysis();
    analysis.points[2] = { ...analysis.points[2]!, dE00: null };
    expect(changeChartData(analysis, 2).observed).toHaveLength(1);
  });

  it('draws the fitted line over the fitted span from the first comparable session', () => {
    const data = changeChartData(makeAnalysis(), 2);
    const start = dayToMs('2000-05-03');
    expect(data.trend).toEqual([
      { t: start, value: 0.01 },
      { t: start + 24 * MS_PER_YEAR, value: 0.01 + 0.0592 * 24 },
    ]);
  });

  it('starts the fitted line at the baseline when a later session was chosen: earlier sessions are plotted, not fitted', () => {
    // The fit's time zero is its earliest session, the baseline (2012); the 2000 point is shown against it.
    const base = makeAnalysis();
    const analysis = makeAnalysis({
      baseline: { ...base.baseline!, sessionId: SESSION2_ID, measuredOn: '2012-05-03', chosen: true },
      points: [
        { ...base.points[0]!, dE00: 0.9 },
        { ...base.points[0]!, sessionId: SESSION2_ID, measuredOn: '2012-05-03', dE00: 0 },
        base.points[2]!,
      ],
      rate: { ok: true, slopePerYear: 0.1, intercept: 0.02, standardError: 0.01, ci95: [0.05, 0.15], n: 2, spanYears: 12, r2: 0.9 },
    });
    const data = changeChartData(analysis, 2);
    const start = dayToMs('2012-05-03');
    expect(data.observed[0]!.t).toBe(dayToMs('2000-05-03'));
    expect(data.trend).toEqual([
      { t: start, value: 0.02 },
      { t: start + 12 * MS_PER_YEAR, value: 0.02 + 0.1 * 12 },
    ]);
  });

  it('gives both charts round ticks: density loss to 14.9 % reads 0, 5, 10, 15 and the years go by fives', () => {
    // D 1.34 → 1.24 → 1.14 from 2008 to 2026: 0, 7.46, 14.93 % lost (hand arithmetic).
    const base = makeAnalysis();
    const point = (sessionId: string, measuredOn: string, dE00: number, density: number) => ({
      ...base.points[0]!, sessionId, measuredOn, dE00, density, dD: density - 1.34, densityLossPercent: ((1.34 - density) / 1.34) * 100,
    });
    const analysis = makeAnalysis({
      baseline: { ...base.baseline!, measuredOn: '2008-03-14', density: 1.34 },
      points: [point('a', '2008-03-14', 0, 1.34), point('b', '2017-04-20', 0.6, 1.24), point('c', '2026-05-02', 1.3, 1.14)],
      rate: { ok: false, reason: 'not_enough_sessions', message: 'Not enough.' },
      projection: null,
    });
    const data = changeChartData(analysis, 2);
    expect(data.densityAxis).toEqual({ domain: [0, 15], ticks: [0, 5, 10, 15] });
    expect(data.timeAxis.ticks.map((t) => new Date(t).getUTCFullYear())).toEqual([2010, 2015, 2020, 2025]);
    // ΔE00: the threshold 2 with room for its label, 2 × 1.15 = 2.3, rounds to 2.5 in steps of 0.5.
    expect(data.changeAxis).toEqual({ domain: [0, 2.5], ticks: [0, 0.5, 1, 1.5, 2, 2.5] });
    expect(data.yMax).toBe(2.5);
  });

  it('carries the line on, dashed, to the threshold at the projected date, with the interval as a band', () => {
    const data = changeChartData(makeAnalysis(), 2);
    const trendEnd = data.trend![1]!;
    expect(data.projection).toEqual([trendEnd, { t: Date.parse('2031-03-14T00:00:00.000Z'), value: 2 }]);
    expect(data.band).toEqual({ from: Date.parse('2029-06-01T00:00:00.000Z'), to: Date.parse('2036-02-01T00:00:00.000Z') });
    expect(data.domain[1]).toBe(Date.parse('2036-02-01T00:00:00.000Z'));
    expect(data.yMax).toBeGreaterThan(2);
  });

  it('draws no trend or projection when the rate is refused', () => {
    const data = changeChartData(
      makeAnalysis({ rate: { ok: false, reason: 'not_enough_sessions', message: 'Not enough.' }, projection: null }),
      2,
    );
    expect(data.trend).toBeNull();
    expect(data.projection).toBeNull();
    expect(data.band).toBeNull();
    expect(data.observed).toHaveLength(2);
  });
});
