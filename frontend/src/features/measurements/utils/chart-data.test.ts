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
