import { describe, expect, it } from 'vitest';
import { coxPH, type CoxRow } from './cox';
import { logRank } from './survival';

// Remission times in weeks, 6-MP vs placebo: E. A. Gehan, Biometrika 52:203–233 (1965), from Freireich
// et al. (1963), as tabulated in D. R. Cox & D. Oakes, Analysis of Survival Data (1984), p. 7
// [published; via /work/shared/REFERENCES.md §2]. Negative = censored. x = [1] for placebo.
const rowsOf = (xs: number[], x: number[]): CoxRow[] => xs.map((v) => ({ time: Math.abs(v), event: v > 0, x }));
const SIX_MP = rowsOf([6, 6, 6, -6, 7, -9, 10, -10, -11, 13, 16, -17, -19, -20, 22, 23, -25, -32, -32, -34, -35], [0]);
const PLACEBO = rowsOf([1, 1, 2, 2, 3, 4, 4, 5, 5, 8, 8, 8, 8, 11, 11, 12, 12, 15, 17, 22, 23], [1]);
const GEHAN = [...SIX_MP, ...PLACEBO];

describe('coxPH on the 6-MP remission data', () => {
  it('Efron ties: β 1.5721, HR 4.8169, SE 0.4124, LR χ² 16.35, score χ² 17.25', () => {
    // REFERENCES.md §2 [computed; the same figures as R's coxph default output, from memory].
    const m = coxPH(GEHAN);
    expect(m.converged).toBe(true);
    expect(m.warnings).toEqual([]);
    expect(m.beta[0]).toBeCloseTo(1.5721, 4);
    expect(m.hazardRatio[0]).toBeCloseTo(4.8169, 3);
    expect(m.se[0]).toBeCloseTo(0.4124, 4);
    expect(m.lr.chi2).toBeCloseTo(16.35, 2);
    expect(m.score.chi2).toBeCloseTo(17.25, 2);
    expect(m.lr.df).toBe(1);
    // Wald: z = β/SE = 3.81; HR interval exp(1.5721 ± 1.96·0.4124) = [2.147, 10.81] [computed from the figures above].
    expect(m.z[0]).toBeCloseTo(3.812, 3);
    expect(m.lower[0]).toBeCloseTo(2.147, 2);
    expect(m.upper[0]).toBeCloseTo(10.81, 1);
    expect(m.p[0]).toBeLessThan(2e-4);
    expect(m.p[0]).toBeGreaterThan(1e-4);
  });

  it('Breslow ties: HR ≈ 4.52 (β ≈ 1.509)', () => {
    // REFERENCES.md §2 [Kleinbaum & Klein, from memory].
    const m = coxPH(GEHAN, { ties: 'breslow' });
    expect(m.hazardRatio[0]).toBeCloseTo(4.52, 2);
    expect(m.beta[0]).toBeCloseTo(1.509, 3);
    // The tie method changes the likelihood itself, so the null log-likelihoods differ too.
    expect(m.logLik0).not.toBeCloseTo(coxPH(GEHAN).logLik0, 3);
  });

  it('the proportional-hazards check does not reject for these data', () => {
    // Proportional hazards are judged reasonable for the remission data in Kleinbaum & Klein, ch. 4 [memory].
    const m = coxPH(GEHAN);
    expect(m.ph[0].rho).not.toBeNull();
    expect(Math.abs(m.ph[0].rho!)).toBeLessThan(0.3);
    expect(m.ph[0].p!).toBeGreaterThan(0.05);
  });
});

// A constructed dataset with no tied times, two covariates (a 0/1 dummy and a number), 40 rows:
// times from a fixed recipe, every fifth row censored. With no ties, Efron = Breslow = the exact
// partial likelihood, which the test writes out itself and maximises by a nested grid search.
function constructed(): CoxRow[] {
  const rows: CoxRow[] = [];
  for (let i = 0; i < 40; i++) {
    const dummy = i % 2;
    const num = ((i * 7) % 11) / 2 - 2.5; // −2.5 … 2.5
    // A hazard that rises with both covariates, plus a deterministic scramble so the fit is not perfect.
    const u = (((i * 37 + 11) % 41) + 0.5) / 41;
    const time = (-Math.log(u) / Math.exp(0.8 * dummy + 0.4 * num)) * 10 + i * 1e-4; // i·1e-4 keeps times distinct
    rows.push({ time, event: i % 5 !== 4, x: [dummy, num] });
  }
  return rows;
}

/** ℓ(β) = Σ_events [β·x_i − log Σ_{t_j ≥ t_i} exp(β·x_j)], straight from the definition (no ties). */
function partialLogLik(rows: CoxRow[], b: number[]): number {
  let ll = 0;
  for (const r of rows) {
    if (!r.event) continue;
    const eta = b[0] * r.x[0] + b[1] * r.x[1];
    let den = 0;
    for (const s of rows) if (s.time >= r.time) den += Math.exp(b[0] * s.x[0] + b[1] * s.x[1]);
    ll += eta - Math.log(den);
  }
  return ll;
}

/** Nested grid: 41 × 41 points around the best so far, the spacing cut by 10 at each round. */
function gridMax(f: (b: number[]) => number): number[] {
  let best = [0, 0];
  let step = 0.1;
  for (let round = 0; round < 5; round++) {
    let bestVal = -Infinity;
    let next = best;
    for (let i = -20; i <= 20; i++) for (let j = -20; j <= 20; j++) {
      const b = [best[0] + i * step, best[1] + j * step];
      const v = f(b);
      if (v > bestVal) { bestVal = v; next = b; }
    }
    best = next;
    step /= 10;
  }
  return best;
}

describe('coxPH with two covariates against a brute-force maximum', () => {
  const rows = constructed();
  const ll = (b: number[]) => partialLogLik(rows, b);
  const bHat = gridMax(ll);

  it('the grid maximum is interior (the search was wide enough)', () => {
    expect(Math.abs(bHat[0])).toBeLessThan(1.9);
    expect(Math.abs(bHat[1])).toBeLessThan(1.9);
  });

  it('β, log-likelihoods and the LR test agree with the brute-force search', () => {
    for (const ties of ['efron', 'breslow'] as const) {
      const m = coxPH(rows, { ties });
      expect(m.converged).toBe(true);
      expect(m.beta[0]).toBeCloseTo(bHat[0], 4);
      expect(m.beta[1]).toBeCloseTo(bHat[1], 4);
      expect(m.logLik).toBeCloseTo(ll(bHat), 8);
      expect(m.logLik0).toBeCloseTo(ll([0, 0]), 8);
      expect(m.lr.chi2).toBeCloseTo(2 * (ll(bHat) - ll([0, 0])), 6);
      expect(m.lr.df).toBe(2);
    }
  });

  it('standard errors agree with the inverse of a finite-difference Hessian of the same likelihood', () => {
    const h = 1e-3;
    const [b0, b1] = bHat;
    const f00 = (ll([b0 + h, b1]) - 2 * ll([b0, b1]) + ll([b0 - h, b1])) / (h * h);
    const f11 = (ll([b0, b1 + h]) - 2 * ll([b0, b1]) + ll([b0, b1 - h])) / (h * h);
    const f01 = (ll([b0 + h, b1 + h]) - ll([b0 + h, b1 - h]) - ll([b0 - h, b1 + h]) + ll([b0 - h, b1 - h])) / (4 * h * h);
    const det = f00 * f11 - f01 * f01; // information = −Hessian; its inverse by the 2 × 2 formula
    const se0 = Math.sqrt(-f11 / det);
    const se1 = Math.sqrt(-f00 / det);
    const m = coxPH(rows);
    expect(m.se[0]).toBeCloseTo(se0, 3);
    expect(m.se[1]).toBeCloseTo(se1, 3);
    expect(m.hazardRatio[1]).toBeCloseTo(Math.exp(bHat[1]), 3);
  });

  it('with no ties, the score test of one 0/1 covariate equals the log-rank χ²', () => {
    // A standard identity (Cox 1972; Collett, Modelling Survival Data in Medical Research, §3.9 [memory]).
    const one = rows.map((r) => ({ ...r, x: [r.x[0]] }));
    const m = coxPH(one);
    const lr = logRank([one.filter((r) => r.x[0] === 0), one.filter((r) => r.x[0] === 1)]);
    expect(m.score.chi2).toBeCloseTo(lr.chi2, 8);
  });
});

describe('coxPH warnings and edge cases', () => {
  it('separation: converged false and a warning', () => {
    // Every placebo-like row fails before every other: the partial likelihood rises without bound in β.
    const rows = [1, 2, 3, 4, 5].map((t) => ({ time: t, event: true, x: [1] })).concat([6, 7, 8, 9].map((t) => ({ time: t, event: true, x: [0] })));
    const m = coxPH(rows);
    expect(m.converged).toBe(false);
    expect(m.warnings.join(' ')).toMatch(/covariate 1 appears to be infinite/);
    expect(m.beta[0]).toBeGreaterThan(10);
    expect(m.ph[0]).toEqual({ rho: null, p: null });
  });

  it('a covariate with no variation is dropped with a warning; the rest is the one-covariate fit', () => {
    const rows = GEHAN.map((r) => ({ ...r, x: [7, r.x[0]] }));
    const m = coxPH(rows);
    expect(m.dropped).toEqual([0]);
    expect(m.warnings).toEqual(['Covariate 1 has the same value for every row and was left out.']);
    expect(Number.isNaN(m.beta[0])).toBe(true);
    expect(m.beta[1]).toBeCloseTo(1.5721, 4);
    expect(m.lr.df).toBe(1);
    expect(m.ph[0]).toEqual({ rho: null, p: null });
  });

  it('collinear covariates: a singular-information warning, not a crash', () => {
    const rows = GEHAN.map((r) => ({ ...r, x: [r.x[0], 1 - r.x[0]] }));
    const m = coxPH(rows);
    expect(m.converged).toBe(false);
    expect(m.warnings.join(' ')).toMatch(/singular/);
  });

  it('a clear violation of proportional hazards gives a small PH p and a negative rho', () => {
    // Group 1 fails early or never (censored late); group 0 fails steadily: group 1's hazard ratio falls with time.
    const g0 = Array.from({ length: 20 }, (_, i) => ({ time: 1 + i, event: true, x: [0] }));
    const g1 = Array.from({ length: 20 }, (_, i) => (i < 10 ? { time: 0.2 + i * 0.1, event: true, x: [1] } : { time: 30 + i, event: false, x: [1] }));
    const m = coxPH([...g0, ...g1]);
    expect(m.converged).toBe(true);
    expect(m.ph[0].rho!).toBeLessThan(-0.4);
    expect(m.ph[0].p!).toBeLessThan(0.01);
    // The same with the time itself in place of its rank.
    expect(coxPH([...g0, ...g1], { phTime: 'identity' }).ph[0].p!).toBeLessThan(0.01);
  });

  it('no events, n = 1 and bad input', () => {
    const none = coxPH([{ time: 1, event: false, x: [0] }, { time: 2, event: false, x: [1] }]);
    expect(none.converged).toBe(false);
    expect(none.warnings).toContain('No events: the model cannot be fitted.');
    const single = coxPH([{ time: 1, event: true, x: [3] }]);
    expect(single.dropped).toEqual([0]);
    expect(() => coxPH([{ time: -1, event: true, x: [0] }])).toThrow(RangeError);
    expect(() => coxPH([{ time: 1, event: true, x: [0] }, { time: 2, event: true, x: [] }])).toThrow(RangeError);
  });
});
