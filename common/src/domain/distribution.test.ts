import { describe as group, expect, it } from 'vitest';
// @ts-expect-error -- jstat ships no type declarations.
import jStatModule from 'jstat';
import { median as ssMedian } from 'simple-statistics';
import { describe, wilsonInterval } from './distribution';

const jStat = jStatModule as { quantiles(arr: number[], p: number[], alphap: number, betap: number): number[]; normal: { inv(p: number, m: number, s: number): number } };

group('describe', () => {
  it('gives R’s default quartiles of 1…10: 3.25, 5.5, 7.75', () => {
    // Type 7 (Hyndman & Fan, The American Statistician 50:361–365, 1996): h = (n − 1)p, so
    // q1 = x[1 + 2.25] → 3.25, median 5.5, q3 7.75 [computed; R's quantile(1:10) prints the same, from memory].
    expect(describe([10, 9, 8, 7, 6, 5, 4, 3, 2, 1])).toEqual({ n: 10, median: 5.5, q1: 3.25, q3: 7.75, min: 1, max: 10 });
  });

  it('agrees with jstat (alphap = betap = 1, the type-7 rule) and simple-statistics’ median on uneven data', () => {
    // The 6-MP remission times (Gehan 1965 via Cox & Oakes 1984, p. 7), ignoring censoring, and odd lengths.
    const lists = [
      [6, 6, 6, 6, 7, 9, 10, 10, 11, 13, 16, 17, 19, 20, 22, 23, 25, 32, 32, 34, 35],
      [0.31, -0.2, 4.5, 0.07, 2.2, 1.9, 0.004],
      [2.5, 2.5],
    ];
    for (const xs of lists) {
      const d = describe(xs);
      const [q1, med, q3] = jStat.quantiles(xs, [0.25, 0.5, 0.75], 1, 1);
      expect(d.q1).toBeCloseTo(q1, 12);
      expect(d.median).toBeCloseTo(med, 12);
      expect(d.q3).toBeCloseTo(q3, 12);
      expect(d.median).toBeCloseTo(ssMedian(xs), 12);
      expect(d.min).toBe(Math.min(...xs));
      expect(d.max).toBe(Math.max(...xs));
    }
    // 6-MP times: the 11th of 21 sorted values is 16; q1 = x(6) = 9, q3 = x(16) = 23 [computed].
    expect(describe(lists[0])).toMatchObject({ n: 21, median: 16, q1: 9, q3: 23 });
    // One value is every quantile (jstat returns NaN for a one-element list, so checked on its own).
    expect(describe([0.8])).toEqual({ n: 1, median: 0.8, q1: 0.8, q3: 0.8, min: 0.8, max: 0.8 });
  });

  it('nulls for an empty list; rejects non-finite values', () => {
    expect(describe([])).toEqual({ n: 0, median: null, q1: null, q3: null, min: null, max: null });
    expect(() => describe([1, Number.NaN])).toThrow(RangeError);
  });
});

group('wilsonInterval', () => {
  it('matches the worked examples of Newcombe (1998)', () => {
    // R. G. Newcombe, Statistics in Medicine 17:857–872 (1998), Table II, method 3 (score) [memory].
    const cases: [number, number, number, number][] = [[81, 263, 0.2553, 0.3662], [15, 148, 0.0624, 0.1605], [0, 20, 0, 0.1611], [1, 29, 0.0061, 0.1718]];
    for (const [x, n, lo, hi] of cases) {
      const w = wilsonInterval(x, n);
      expect(w.share).toBeCloseTo(x / n, 12);
      expect(w.lower).toBeCloseTo(lo, 4);
      expect(w.upper).toBeCloseTo(hi, 4);
    }
  });

  it('its ends solve the score equation |p̂ − π| = z·√(π(1 − π)/n)', () => {
    // Wilson's definition (JASA 22:209–212, 1927), with z from jstat's normal quantile.
    for (const [x, n, level] of [[81, 263, 0.95], [3, 10, 0.9], [40, 41, 0.99]]) {
      const z = jStat.normal.inv((1 + level) / 2, 0, 1);
      const w = wilsonInterval(x, n, level);
      for (const pi of [w.lower, w.upper]) expect(Math.abs(x / n - pi)).toBeCloseTo(z * Math.sqrt((pi * (1 - pi)) / n), 10);
    }
  });

  it('all or none, n = 0, and bad input', () => {
    expect(wilsonInterval(20, 20)).toMatchObject({ share: 1, upper: 1 });
    expect(wilsonInterval(20, 20).lower).toBeCloseTo(1 - 0.1611, 4); // mirror of 0/20 above
    expect(wilsonInterval(0, 0)).toEqual({ share: 0, lower: 0, upper: 1 });
    expect(() => wilsonInterval(5, 4)).toThrow(RangeError);
    expect(() => wilsonInterval(1.5, 4)).toThrow(RangeError);
  });
});
