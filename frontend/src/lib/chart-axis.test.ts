import { describe, expect, it } from 'vitest';
import { decimalYear, valueAxis, yearAxis, yearLabel } from '@/lib/chart-axis';

/** Every step between neighbouring ticks is the same. */
const evenSteps = (ticks: number[]) => new Set(ticks.slice(1).map((t, i) => +(t - ticks[i]!).toFixed(9))).size === 1;

// Hand arithmetic with d3-array's rule for a step (its documented `tickIncrement`): the span over
// the count, rounded to 1, 2 or 5 × 10^k, taking 5 from √10 ≈ 3.16 up to √50 ≈ 7.07, 2 from
// √2 ≈ 1.41 up to √10, and 10 from √50 on.
describe('valueAxis', () => {
  it('density loss up to 14.9 %: 0, 5, 10, 15, not 0, 5, 10, 18', () => {
    // 14.9 / 4 = 3.725 ≥ 3.16 → step 5; 14.9 rounds up to 15.
    expect(valueAxis(0, 14.9, 4)).toEqual({ domain: [0, 15], ticks: [0, 5, 10, 15] });
  });

  it('a ΔE00 axis up to 2.3: steps of 0.5 ending on a tick', () => {
    // 2.3 / 5 = 0.46 = 4.6 × 10^-1 → step 0.5; 2.3 rounds up to 2.5.
    expect(valueAxis(0, 2.3, 5)).toEqual({ domain: [0, 2.5], ticks: [0, 0.5, 1, 1.5, 2, 2.5] });
  });

  it('a gain below zero: the axis takes in the negative values on the same steps', () => {
    // (14.9 + 1.2) / 4 = 4.025 → step 5; −1.2 rounds down to −5.
    expect(valueAxis(-1.2, 14.9, 4)).toEqual({ domain: [-5, 15], ticks: [-5, 0, 5, 10, 15] });
  });

  it('ends on ticks with even steps over a range of spans', () => {
    for (const high of [0.7, 1, 2.02, 3.4412, 7.9, 18, 23.5, 64, 140]) {
      const axis = valueAxis(0, high, 5);
      expect(axis.ticks[0]).toBe(axis.domain[0]);
      expect(axis.ticks.at(-1)).toBe(axis.domain[1]);
      expect(axis.domain[1]).toBeGreaterThanOrEqual(high);
      expect(evenSteps(axis.ticks)).toBe(true);
    }
  });

  it('a flat range still has an axis', () => {
    // 0 to 1 over 4: 0.25 = 2.5 × 10^-1, between 1.41 and 3.16 → step 0.2.
    expect(valueAxis(0, 0, 4)).toEqual({ domain: [0, 1], ticks: [0, 0.2, 0.4, 0.6, 0.8, 1] });
  });
});

describe('yearAxis', () => {
  const ms = (day: string) => Date.parse(`${day}T00:00:00Z`);

  it('2008 to 2026: whole years 2007–2027, labelled every 5 years', () => {
    // Span 18.1 years; 3 % room each side ends in 2007 and 2027; 20 / 6 = 3.3 → step 5.
    const axis = yearAxis([ms('2008-03-14'), ms('2026-05-02')]);
    expect(axis.domain).toEqual([ms('2007-01-01'), ms('2027-01-01')]);
    expect(axis.ticks.map(yearLabel)).toEqual(['2010', '2015', '2020', '2025']);
  });

  it('1992 to 2031 (a projection) every 5 years; 1980 to 2038 every 10', () => {
    // 1991 to 2033: 42 / 6 = 7 → step 5 (7 < 7.07); a longer span, 1979–2040, gives 10.
    expect(yearAxis([ms('1992-06-01'), ms('2031-03-14')]).ticks.map(yearLabel)).toEqual(['1995', '2000', '2005', '2010', '2015', '2020', '2025', '2030']);
    expect(yearAxis([ms('1980-06-01'), ms('2038-03-14')]).ticks.map(yearLabel)).toEqual(['1980', '1990', '2000', '2010', '2020', '2030', '2040']);
  });

  it('a short span: never less than a year between labels', () => {
    const axis = yearAxis([ms('2019-06-01'), ms('2021-09-01')]);
    expect(axis.ticks.map(yearLabel)).toEqual(['2019', '2020', '2021', '2022']);
  });

  it('ticks on 1 January, inside the domain, evenly spaced in years', () => {
    const axis = yearAxis([ms('1994-02-11'), ms('2026-10-30')]);
    for (const t of axis.ticks) {
      expect(new Date(t).toISOString().slice(5)).toBe('01-01T00:00:00.000Z');
      expect(t).toBeGreaterThanOrEqual(axis.domain[0]);
      expect(t).toBeLessThanOrEqual(axis.domain[1]);
    }
    expect(evenSteps(axis.ticks.map((t) => new Date(t).getUTCFullYear()))).toBe(true);
  });

  it('decimalYear: 1 July 2001 is 2001 + 181/365 (hand arithmetic: 181 days in January–June 2001)', () => {
    expect(decimalYear(ms('2001-07-01'))).toBeCloseTo(2001 + 181 / 365, 12);
  });
});
