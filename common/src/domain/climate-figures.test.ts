import { describe, expect, it } from 'vitest';
import { climateFigures, climatePeriod } from './climate-figures';
import { DEFAULT_CLIMATE_SETTINGS } from './isoperm';
import type { Reading } from './climate-readings';

// Targets of the default settings: 2–18 °C, 30–50 % RH; a gap is more than 180 minutes; brief is under 60 minutes.
const S = DEFAULT_CLIMATE_SETTINGS;
const r = (at: string, temperatureC: number, rhPercent: number): Reading => ({ at: Date.parse(at), temperatureC, rhPercent });
const END = Date.parse('2026-01-11T00:00:00Z');

describe('climateFigures, worked by hand', () => {
  // Hourly readings with a warm, damp spell and a four-hour hole in the logger data.
  const readings = [
    r('2026-01-10T00:00:00Z', 16, 45),
    r('2026-01-10T01:00:00Z', 19, 45), // too warm
    r('2026-01-10T02:00:00Z', 20, 55), // too warm and too damp
    r('2026-01-10T03:00:00Z', 17, 55), // too damp
    r('2026-01-10T04:00:00Z', 17, 45), // then nothing until 08:00: 240 min > 180, a gap
    r('2026-01-10T08:00:00Z', 17, 45),
    r('2026-01-10T09:00:00Z', 17, 45), // the last: stands for no time
  ];
  const f = climateFigures({ readings, end: END, settings: S });

  it('covers 5 hours, leaves the gap out and lists it', () => {
    // Spans of 60 min from 00:00, 01:00, 02:00, 03:00 and 08:00 = 300 min; 04:00→08:00 is the gap.
    expect(f.coveredMinutes).toBe(300);
    expect(f.gaps).toEqual([{ start: '2026-01-10T04:00:00.000Z', end: '2026-01-10T08:00:00.000Z', minutes: 240 }]);
  });

  it('gives the shares of covered time outside each range', () => {
    // Temperature out 01:00–03:00 = 120/300; RH out 02:00–04:00 = 120/300; either 01:00–04:00 = 180/300.
    expect(f.outsideTemperature).toBeCloseTo(0.4, 12);
    expect(f.outsideRh).toBeCloseTo(0.4, 12);
    expect(f.outsideEither).toBeCloseTo(0.6, 12);
  });

  it('gives min, max and mean of the readings', () => {
    // (16 + 19 + 20 + 17 × 4) / 7 = 123/7; RH (45 × 5 + 55 × 2) / 7 = 335/7.
    expect(f.temperature).toEqual({ min: 16, max: 20, mean: expect.closeTo(123 / 7, 12) });
    expect(f.rh).toEqual({ min: 45, max: 55, mean: expect.closeTo(335 / 7, 12) });
  });

  it('lists the excursions with start, end, peak and length', () => {
    expect(f.excursions).toEqual([
      { quantity: 'temperature', direction: 'above', start: '2026-01-10T01:00:00.000Z', end: '2026-01-10T03:00:00.000Z', minutes: 120, peak: 20, brief: false },
      { quantity: 'rh', direction: 'above', start: '2026-01-10T02:00:00.000Z', end: '2026-01-10T04:00:00.000Z', minutes: 120, peak: 55, brief: false },
    ]);
  });

  it('weights the permanence by time: the inverse of the mean rate over the covered spans', () => {
    // REFERENCES.md §3 form, against 20 °C / 50 %, Ea 83.68 kJ/mol, n = 1; R = 8.314462618 J/(mol·K) (CODATA 2018 [published]).
    const p = (t: number, rh: number) => (50 / rh) * Math.exp((83_680 / 8.314462618) * (1 / (t + 273.15) - 1 / 293.15));
    const spans = [[16, 45], [19, 45], [20, 55], [17, 55], [17, 45]];
    const expected = spans.length / spans.reduce((s, [t, rh]) => s + 1 / p(t, rh), 0);
    expect(f.permanence).toBeCloseTo(expected, 10);
    // Table value at 15 °C / 50 % is 1.814 (REFERENCES.md §3): the mix of 16–20 °C sits between it and 1.
    expect(f.permanence!).toBeGreaterThan(1);
    expect(f.permanence!).toBeLessThan(1.814);
  });
});

describe('a one-minute spike', () => {
  it('is an excursion of one minute, flagged brief, and one minute of the hour outside', () => {
    const f = climateFigures({
      readings: [
        r('2026-06-01T10:00:00Z', 17, 45), r('2026-06-01T10:15:00Z', 17, 45),
        r('2026-06-01T10:30:00Z', 24, 45), r('2026-06-01T10:31:00Z', 17, 45),
        r('2026-06-01T10:45:00Z', 17, 45), r('2026-06-01T11:00:00Z', 17, 45),
      ],
      end: END + 365 * 86_400_000, settings: S,
    });
    expect(f.coveredMinutes).toBe(60);
    expect(f.outsideTemperature).toBeCloseTo(1 / 60, 12);
    expect(f.excursions).toEqual([
      { quantity: 'temperature', direction: 'above', start: '2026-06-01T10:30:00.000Z', end: '2026-06-01T10:31:00.000Z', minutes: 1, peak: 24, brief: true },
    ]);
  });
});

describe('the ends of a period', () => {
  it('cuts the last span at the end of the period, using the next reading after it', () => {
    const f = climateFigures({ readings: [r('2026-01-10T23:30:00Z', 10, 20)], next: r('2026-01-11T00:30:00Z', 10, 20), end: END, settings: S });
    expect(f.coveredMinutes).toBe(30);
    expect(f.outsideRh).toBe(1);
    expect(f.excursions).toEqual([{ quantity: 'rh', direction: 'below', start: '2026-01-10T23:30:00.000Z', end: '2026-01-11T00:00:00.000Z', minutes: 30, peak: 20, brief: true }]);
  });

  it('has no figures without readings', () => {
    const f = climateFigures({ readings: [], end: END, settings: S });
    expect([f.readings, f.coveredMinutes, f.outsideEither, f.permanence, f.temperature.mean]).toEqual([0, 0, null, null, null]);
  });

  it('defaults to the 365 days ending today', () => {
    expect(climatePeriod({}, '2026-12-02')).toMatchObject({ from: '2025-12-03', to: '2026-12-02' });
    expect(climatePeriod({ from: '2026-01-01', to: '2026-01-31' }, '2026-12-02')).toEqual({
      from: '2026-01-01', to: '2026-01-31', start: Date.parse('2026-01-01T00:00:00Z'), end: Date.parse('2026-02-01T00:00:00Z'),
    });
  });
});
