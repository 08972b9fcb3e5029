import { describe, expect, it } from 'vitest';
// @ts-expect-error -- jstat ships no type declarations.
import jStatModule from 'jstat';
import { atRiskAt, kaplanMeier, logRank, type SurvivalObs } from './survival';

const jStat = jStatModule as { chisquare: { cdf(x: number, df: number): number } };

// Remission times in weeks, 6-mercaptopurine vs placebo: E. A. Gehan, Biometrika 52:203–233 (1965),
// from Freireich et al. (1963), as tabulated in D. R. Cox & D. Oakes, Analysis of Survival Data (1984),
// p. 7 [published; via /work/shared/REFERENCES.md §2]. A negative number here means censored (“+”).
const parse = (xs: number[]): SurvivalObs[] => xs.map((x) => ({ time: Math.abs(x), event: x > 0 }));
const SIX_MP = parse([6, 6, 6, -6, 7, -9, 10, -10, -11, 13, 16, -17, -19, -20, 22, 23, -25, -32, -32, -34, -35]);
const PLACEBO = parse([1, 1, 2, 2, 3, 4, 4, 5, 5, 8, 8, 8, 8, 11, 11, 12, 12, 15, 17, 22, 23]);

describe('kaplanMeier on the 6-MP remission data', () => {
  it('gives the product-limit estimates and Greenwood SEs of the table', () => {
    // REFERENCES.md §2 [computed; the same values in Kleinbaum & Klein, Survival Analysis, ch. 2, from memory]
    const table = [
      [6, 21, 3, 0.8571, 0.0764], [7, 17, 1, 0.8067, 0.0869], [10, 15, 1, 0.7529, 0.0963], [13, 12, 1, 0.6902, 0.1068],
      [16, 11, 1, 0.6275, 0.1141], [22, 7, 1, 0.5378, 0.1282], [23, 6, 1, 0.4482, 0.1346],
    ];
    const km = kaplanMeier(SIX_MP);
    expect([km.n, km.events, km.censored]).toEqual([21, 9, 12]);
    const eventSteps = km.steps.filter((s) => s.events > 0);
    expect(eventSteps).toHaveLength(table.length);
    for (const [i, [t, n, d, s, se]] of table.entries()) {
      const st = eventSteps[i];
      expect([st.t, st.atRisk, st.events]).toEqual([t, n, d]);
      expect(st.s).toBeCloseTo(s, 4);
      expect(st.se!).toBeCloseTo(se, 4);
    }
    // A time with censorings only is a step that keeps S: t = 9 (one censored, 16 at risk).
    const nine = km.steps.find((s) => s.t === 9)!;
    expect(nine).toMatchObject({ atRisk: 16, events: 0, censored: 1 });
    expect(nine.s).toBeCloseTo(0.8067, 4);
    // t = 6 has 3 events and 1 censoring: one step for both.
    expect(km.steps[0]).toMatchObject({ t: 6, events: 3, censored: 1 });
    expect(km.steps.at(-1)).toMatchObject({ t: 35, atRisk: 1, censored: 1 });
  });

  it('gives the placebo curve and its first SE', () => {
    // REFERENCES.md §2; SE at t = 1 confirmed in G. Rodríguez's Princeton survival notes.
    const expected = [0.9048, 0.8095, 0.7619, 0.6667, 0.5714, 0.381, 0.2857, 0.1905, 0.1429, 0.0952, 0.0476, 0];
    const km = kaplanMeier(PLACEBO);
    expect(km.steps.map((s) => s.t)).toEqual([1, 2, 3, 4, 5, 8, 11, 12, 15, 17, 22, 23]);
    km.steps.forEach((s, i) => expect(s.s).toBeCloseTo(expected[i], 4));
    expect(km.steps[0].se!).toBeCloseTo(0.0641, 4);
    // S = 0 at the last time: the Greenwood SE and the interval are undefined there.
    expect(km.steps.at(-1)).toMatchObject({ s: 0, se: null, lower: null, upper: null });
  });

  it('gives the medians of 23 and 8 weeks with Brookmeyer–Crowley intervals', () => {
    // Medians: REFERENCES.md §2. Interval ends worked by hand from the table's S and SE
    // [computed]: log-log limits are S^exp(±1.96·(SE/S)/|ln S|).
    //  6-MP lower limit: t = 10 → 0.7529^exp(1.96·0.1279/0.2838) = 0.503 (> 0.5); t = 13 → 0.432 → lower end 13.
    //  6-MP upper limit at the last event (t = 23) = 0.4482^exp(−1.96·0.3003/0.8025) = 0.680 → never ≤ 0.5 → null.
    //  Placebo (no censoring, Greenwood sum = (1 − S)/(21·S)): lower limit t = 3 → 0.519, t = 4 → 0.425 → 4;
    //  upper limit t = 8 → 0.578, t = 11 → 0.482 → 11.
    expect(kaplanMeier(SIX_MP).median).toEqual({ value: 23, lower: 13, upper: null });
    expect(kaplanMeier(PLACEBO).median).toEqual({ value: 8, lower: 4, upper: 11 });
    // Plain intervals, by hand: 6-MP t = 10 → 0.7529 − 1.96·0.0963 = 0.564, t = 13 → 0.481 → 13;
    // placebo lower t = 4 → 0.465 → 4, upper t = 8 → 0.589, t = 11 → 0.479 → 11 [computed].
    expect(kaplanMeier(SIX_MP, { ci: 'plain' }).median).toEqual({ value: 23, lower: 13, upper: null });
    expect(kaplanMeier(PLACEBO, { ci: 'plain' }).median).toEqual({ value: 8, lower: 4, upper: 11 });
  });

  it('plain and log-log intervals differ as the transforms say', () => {
    const loglog = kaplanMeier(SIX_MP).steps.find((s) => s.t === 23)!;
    const plain = kaplanMeier(SIX_MP, { ci: 'plain' }).steps.find((s) => s.t === 23)!;
    // Plain: S ± 1.96·SE = 0.4482 ± 0.2638 → [0.1844, 0.7120], symmetric about S [computed from the table].
    expect(plain.lower!).toBeCloseTo(0.1844, 3);
    expect(plain.upper!).toBeCloseTo(0.712, 3);
    expect(plain.upper! - plain.s).toBeCloseTo(plain.s - plain.lower!, 10);
    // Log-log: 0.4482^exp(±1.96·0.3742) → [0.188, 0.680], not symmetric, same SE [computed].
    expect(loglog.lower!).toBeCloseTo(0.188, 3);
    expect(loglog.upper!).toBeCloseTo(0.680, 3);
    expect(loglog.se).toBe(plain.se);
    // Near S = 1 the plain band is clipped at 1, the log-log band stays inside (0, 1):
    // placebo t = 1: 0.9048 + 1.96·0.0641 = 1.030 → 1.
    const p1 = kaplanMeier(PLACEBO, { ci: 'plain' }).steps[0];
    const l1 = kaplanMeier(PLACEBO).steps[0];
    expect(p1.upper).toBe(1);
    expect(l1.upper!).toBeLessThan(1);
    expect(l1.upper!).toBeGreaterThan(l1.s);
    expect(l1.lower!).toBeGreaterThan(0);
    // A wider level gives a wider interval.
    const wide = kaplanMeier(SIX_MP, { level: 0.99 }).steps.find((s) => s.t === 23)!;
    expect(wide.lower!).toBeLessThan(loglog.lower!);
    expect(wide.upper!).toBeGreaterThan(loglog.upper!);
  });
});

describe('atRiskAt', () => {
  it('counts the prints still followed just before each time', () => {
    // From the 6-MP list: 21 at t = 0 and t = 6; 17 at 7; 12 at 13 (after 9+, 10, 10+, 11+); 1 at 35; 0 after.
    expect(atRiskAt(SIX_MP, [0, 6, 7, 13, 35, 36])).toEqual([
      { t: 0, n: 21 }, { t: 6, n: 21 }, { t: 7, n: 17 }, { t: 13, n: 12 }, { t: 35, n: 1 }, { t: 36, n: 0 },
    ]);
    // The same counts as the Kaplan–Meier table's at-risk column.
    for (const s of kaplanMeier(SIX_MP).steps) expect(atRiskAt(SIX_MP, [s.t])[0].n).toBe(s.atRisk);
  });
});

describe('logRank', () => {
  it('gives χ² = 16.79 with O/E for the 6-MP data', () => {
    // REFERENCES.md §2: O = 9, E = 19.25 (6-MP); O = 21, E = 10.75 (placebo); variance 6.2570;
    // χ² = 16.79 on 1 df, p ≈ 4.2e-5 [computed; 16.79 published in Kleinbaum & Klein, from memory].
    const r = logRank([SIX_MP, PLACEBO]);
    expect(r.observed).toEqual([9, 21]);
    expect(r.expected[0]).toBeCloseTo(19.25, 2);
    expect(r.expected[1]).toBeCloseTo(10.75, 2);
    expect(r.chi2).toBeCloseTo(16.79, 2);
    expect((r.observed[0] - r.expected[0]) ** 2 / r.chi2).toBeCloseTo(6.257, 3);
    expect(r.df).toBe(1);
    expect(r.p).toBeGreaterThan(4.1e-5);
    expect(r.p).toBeLessThan(4.3e-5);
    // The order of the groups does not matter.
    expect(logRank([PLACEBO, SIX_MP]).chi2).toBeCloseTo(r.chi2, 10);
  });

  it('p agrees with jstat’s χ² distribution and a printed table value', () => {
    // χ²(1) = 3.841 is the 5 % point of the standard χ² table [common practice].
    expect(1 - jStat.chisquare.cdf(3.841, 1)).toBeCloseTo(0.05, 4);
    const r = logRank([SIX_MP, PLACEBO]);
    expect(r.p).toBeCloseTo(1 - jStat.chisquare.cdf(r.chi2, 1), 12);
  });

  it('three groups: k − 1 df and the matrix form, checked on a small example worked by hand', () => {
    // A: 1, 3; B: 2, 4+; C: 3. Event times 1, 2, 3 [computed by hand]:
    //  t = 1: at risk 2/2/1, d = 1 (A) → E .4/.4/.2;   d(n−d)/(n−1) = 1; V_AA .24, V_BB .24, V_AB −.16
    //  t = 2: at risk 1/2/1, d = 1 (B) → E .25/.5/.25; factor 1; V_AA .1875, V_BB .25, V_AB −.125
    //  t = 3: at risk 1/1/1, d = 2 (A, C) → E ⅔ each;  factor 1; V_AA 2/9, V_BB 2/9, V_AB −1/9
    //  O = 2/1/1, E = 1.3167/1.5667/1.1167; O − E (A, B) = .6833, −.5667;
    //  V = [[.64972, −.39611], [−.39611, .71222]], det .30584 → χ² = .23444 / .30584 = 0.7665 on 2 df.
    const r = logRank([parse([1, 3]), parse([2, -4]), parse([3])]);
    expect(r.observed).toEqual([2, 1, 1]);
    expect(r.expected[0]).toBeCloseTo(1.3167, 4);
    expect(r.expected[1]).toBeCloseTo(1.5667, 4);
    expect(r.expected[2]).toBeCloseTo(1.1167, 4);
    expect(r.df).toBe(2);
    expect(r.chi2).toBeCloseTo(0.7665, 3);
    expect(r.p).toBeCloseTo(1 - jStat.chisquare.cdf(r.chi2, 2), 12);
    // The statistic does not depend on which group is left out of the quadratic form.
    expect(logRank([parse([3]), parse([2, -4]), parse([1, 3])]).chi2).toBeCloseTo(r.chi2, 10);
  });

  it('a two-group test on identical groups gives χ² = 0', () => {
    const r = logRank([PLACEBO, PLACEBO]);
    expect(r.chi2).toBeCloseTo(0, 12);
    expect(r.p).toBeCloseTo(1, 12);
  });
});

describe('edge cases', () => {
  it('all censored: S stays 1, no median, no events', () => {
    const obs = parse([-1, -2, -2, -5]);
    const km = kaplanMeier(obs);
    expect(km.events).toBe(0);
    expect(km.median).toBeNull();
    expect(km.steps.every((s) => s.s === 1 && s.se === 0)).toBe(true);
    expect(km.steps[0]).toMatchObject({ lower: null, upper: null }); // log-log undefined at S = 1
    expect(kaplanMeier(obs, { ci: 'plain' }).steps[0]).toMatchObject({ lower: 1, upper: 1 });
    // Against the placebo group it still counts while at risk: E = 2·4/25 + 2·3/22 + 1/18 + 2/17 + 2/15
    // = 0.8993 at t = 1, 2, 3, 4, 5 (none of it at risk from t = 8) [computed by hand].
    const r = logRank([obs, PLACEBO]);
    expect(r.observed).toEqual([0, 21]);
    expect(r.expected[0]).toBeCloseTo(0.8993, 4);
    expect(r.df).toBe(1);
    expect(r.chi2).toBeGreaterThan(0);
  });

  it('one group empty: it is left out of the test', () => {
    const r = logRank([SIX_MP, [], PLACEBO]);
    expect(r.excluded).toEqual([1]);
    expect(r.df).toBe(1);
    expect(r.chi2).toBeCloseTo(16.79, 2);
    expect(r.observed[1]).toBe(0);
    expect(r.expected[1]).toBe(0);
    // Only one group left: it has no variance either (it is the whole risk set), so no test.
    expect(logRank([SIX_MP, []])).toMatchObject({ chi2: 0, df: 0, p: 1, excluded: [0, 1] });
    expect(kaplanMeier([])).toEqual({ n: 0, events: 0, censored: 0, steps: [], median: null });
  });

  it('all events at one time: S drops to 0 at once', () => {
    const km = kaplanMeier(parse([4, 4, 4]));
    expect(km.steps).toHaveLength(1);
    expect(km.steps[0]).toMatchObject({ t: 4, atRisk: 3, events: 3, s: 0, se: null });
    expect(km.median).toEqual({ value: 4, lower: 4, upper: 4 });
    // Two groups whose every event is at one time: one event time, variance d(n−d)/(n−1)·(n1 n2/n²).
    // 3 + 3 at risk, 6 events: n − d = 0 → no variance → no test.
    expect(logRank([parse([4, 4, 4]), parse([4, 4, 4])])).toMatchObject({ chi2: 0, df: 0, p: 1 });
  });

  it('n = 1', () => {
    expect(kaplanMeier(parse([3]))).toEqual({
      n: 1, events: 1, censored: 0, median: { value: 3, lower: 3, upper: 3 },
      steps: [{ t: 3, atRisk: 1, events: 1, censored: 0, s: 0, se: null, lower: null, upper: null }],
    });
    const c = kaplanMeier(parse([-3]));
    expect(c.median).toBeNull();
    expect(c.steps[0].s).toBe(1);
  });

  it('rejects negative or non-finite times', () => {
    expect(() => kaplanMeier([{ time: -1, event: true }])).toThrow(RangeError);
    expect(() => atRiskAt([{ time: Number.NaN, event: false }], [1])).toThrow(RangeError);
    expect(() => logRank([SIX_MP])).toThrow(RangeError);
  });
});

describe('observations given as counts', () => {
  // The same 6-MP and placebo lists (REFERENCES.md §2) collapsed to (time, event, count) rows: each
  // figure must equal the one of the expanded list, which the tests above check against the references.
  const collapse = (obs: SurvivalObs[]): SurvivalObs[] => {
    const m = new Map<string, SurvivalObs>();
    for (const o of obs) {
      const key = `${o.time}|${o.event}`;
      const row = m.get(key);
      if (row) row.count = (row.count ?? 1) + 1; else m.set(key, { time: o.time, event: o.event, count: 1 });
    }
    return [...m.values()].reverse(); // order must not matter
  };
  const sixMp = collapse(SIX_MP);
  const placebo = collapse(PLACEBO);

  it('collapses the lists to fewer rows with the same total', () => {
    // 6-MP: 6 ×3 events and 6+ once, 32+ twice → 21 prints in 18 rows; placebo: 12 distinct times.
    expect(sixMp).toHaveLength(18);
    expect(placebo).toHaveLength(12);
    expect(sixMp.find((o) => o.time === 6 && o.event)!.count).toBe(3);
    expect(placebo.find((o) => o.time === 8)!.count).toBe(4);
  });

  it('kaplanMeier with counts gives exactly the expanded figures (both interval methods)', () => {
    for (const ci of ['log-log', 'plain'] as const) {
      expect(kaplanMeier(sixMp, { ci })).toEqual(kaplanMeier(SIX_MP, { ci }));
      expect(kaplanMeier(placebo, { ci })).toEqual(kaplanMeier(PLACEBO, { ci }));
    }
    // And so the published figures: S(23) = 0.4482, SE 0.1346, median 23 [13, –] (REFERENCES.md §2).
    const km = kaplanMeier(sixMp);
    expect([km.n, km.events, km.censored]).toEqual([21, 9, 12]);
    const t23 = km.steps.find((s) => s.t === 23)!;
    expect(t23.s).toBeCloseTo(0.4482, 4);
    expect(t23.se!).toBeCloseTo(0.1346, 4);
    expect(km.median).toEqual({ value: 23, lower: 13, upper: null });
  });

  it('atRiskAt and logRank with counts give exactly the expanded figures', () => {
    const ticks = [0, 6, 7, 13, 35, 36];
    expect(atRiskAt(sixMp, ticks)).toEqual(atRiskAt(SIX_MP, ticks));
    expect(atRiskAt(sixMp, [13])[0].n).toBe(12);
    const counted = logRank([sixMp, placebo]);
    const expanded = logRank([SIX_MP, PLACEBO]);
    expect(counted.observed).toEqual([9, 21]);
    expect(counted.expected).toEqual(expanded.expected);
    expect(counted.chi2).toBe(expanded.chi2);
    expect(counted.chi2).toBeCloseTo(16.79, 2); // REFERENCES.md §2
    // Mixed: one group counted, the other expanded.
    expect(logRank([sixMp, PLACEBO]).chi2).toBe(expanded.chi2);
  });

  it('refuses a count that is not a whole number ≥ 1', () => {
    expect(() => kaplanMeier([{ time: 1, event: true, count: 0 }])).toThrow(RangeError);
    expect(() => kaplanMeier([{ time: 1, event: true, count: 1.5 }])).toThrow(RangeError);
    expect(() => logRank([[{ time: 1, event: true, count: -2 }], PLACEBO])).toThrow(RangeError);
  });
});
