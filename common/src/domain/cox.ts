/**
 * Cox proportional-hazards model, fitted by Newton–Raphson on the partial likelihood. Pure, no I/O.
 *
 * Sources: D. R. Cox, JRSS B 34:187–220 (1972); N. Breslow, Biometrics 30:89–99 (1974) and
 * B. Efron, JASA 72:557–565 (1977) for tied event times; P. Grambsch & T. Therneau, Biometrika
 * 81:515–526 (1994) for the proportional-hazards check.
 */
import { chiSquareUpper, invertSpd, normalQuantileForLevel } from './survival';

export interface CoxRow { time: number; event: boolean; x: number[] }
export type Ties = 'efron' | 'breslow';

export interface CoxResult {
  beta: number[]; se: number[]; z: number[]; p: number[]; hazardRatio: number[]; lower: number[]; upper: number[];
  logLik: number; logLik0: number; lr: { chi2: number; df: number; p: number }; score: { chi2: number; df: number; p: number };
  ph: { rho: number | null; p: number | null }[]; converged: boolean; iterations: number; warnings: string[];
  /** Columns left out of the model (no variation): their entries in the arrays above are NaN. */
  dropped?: number[];
}

interface Pass { logLik: number; u: number[]; info: number[][]; means?: { t: number; xbar: number[]; d: number }[] }

/** The rows for `pass`: times descending, covariates centred, in one flat array (row i's column a at i·p + a). */
interface Prepared { n: number; p: number; time: Float64Array; event: Uint8Array; x: Float64Array }

/**
 * One pass over the risk sets at `beta` (covariates already centred): the log partial likelihood, its
 * gradient u and the observed information. Efron: at a time with d tied events, the l-th of them
 * (l = 0 … d − 1) sees the risk set less l/d of the tied events' weight; Breslow: the whole risk set.
 * The sums live in flat typed arrays reused from time to time (a cohort holds 150,000 rows); every
 * sum is formed in the same order, with the same operations, as the plain arrays they replace.
 */
function pass(rows: Prepared, beta: number[], ties: Ties, keepMeans = false): Pass {
  const { n, p, time, event, x } = rows;
  const u = new Array<number>(p).fill(0);
  const info = beta.map(() => new Array<number>(p).fill(0));
  let logLik = 0;
  let s0 = 0;
  const s1 = new Float64Array(p);
  const s2 = new Float64Array(p * p);
  const d1 = new Float64Array(p);
  const d2 = new Float64Array(p * p);
  const xSum = new Float64Array(p);
  const mean = new Float64Array(p);
  const means: { t: number; xbar: number[]; d: number }[] = [];
  // rows are sorted by time descending: walk down, adding each time's rows to the risk set first.
  let i = 0;
  while (i < n) {
    const t = time[i]!;
    let dCount = 0;
    let d0 = 0;
    d1.fill(0); d2.fill(0); xSum.fill(0);
    for (; i < n && time[i] === t; i++) {
      const o = i * p;
      let eta = 0;
      for (let a = 0; a < p; a++) eta += beta[a]! * x[o + a]!;
      const w = Math.exp(eta);
      s0 += w;
      for (let a = 0; a < p; a++) { const xa = x[o + a]!; s1[a] += w * xa; for (let b = 0; b < p; b++) s2[a * p + b] += w * xa * x[o + b]!; }
      if (event[i]) {
        dCount++;
        logLik += eta;
        d0 += w;
        for (let a = 0; a < p; a++) { const xa = x[o + a]!; xSum[a] += xa; d1[a] += w * xa; for (let b = 0; b < p; b++) d2[a * p + b] += w * xa * x[o + b]!; }
      }
    }
    if (dCount === 0) continue;
    for (let a = 0; a < p; a++) u[a] += xSum[a]!;
    const xbarMean = new Array<number>(p).fill(0);
    for (let l = 0; l < dCount; l++) {
      const f = ties === 'efron' ? l / dCount : 0;
      const den = s0 - f * d0;
      logLik -= Math.log(den);
      for (let a = 0; a < p; a++) mean[a] = (s1[a]! - f * d1[a]!) / den;
      for (let a = 0; a < p; a++) {
        u[a] -= mean[a]!;
        xbarMean[a] += mean[a]! / dCount;
        const row = info[a]!;
        for (let b = 0; b < p; b++) row[b] += (s2[a * p + b]! - f * d2[a * p + b]!) / den - mean[a]! * mean[b]!;
      }
    }
    if (keepMeans) means.push({ t, xbar: xbarMean, d: dCount });
  }
  return keepMeans ? { logLik, u, info, means } : { logLik, u, info };
}

const matVec = (m: number[][], v: number[]) => m.map((row) => row.reduce((a, x, j) => a + x * v[j], 0));
const dot = (a: number[], b: number[]) => a.reduce((s, x, i) => s + x * b[i], 0);

function pearson(x: number[], y: number[]): number | null {
  const n = x.length;
  if (n < 3) return null;
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  let sxy = 0, sxx = 0, syy = 0;
  for (let i = 0; i < n; i++) { sxy += (x[i] - mx) * (y[i] - my); sxx += (x[i] - mx) ** 2; syy += (y[i] - my) ** 2; }
  if (!(sxx > 0) || !(syy > 1e-24 * n)) return null;
  return Math.max(-1, Math.min(1, sxy / Math.sqrt(sxx * syy)));
}

/** Ranks 1…n, ties given their average rank. */
function ranks(v: number[]): number[] {
  const order = v.map((x, i) => [x, i] as const).sort((a, b) => a[0] - b[0]);
  const r = new Array<number>(v.length);
  for (let i = 0; i < order.length;) {
    let j = i;
    while (j + 1 < order.length && order[j + 1][0] === order[i][0]) j++;
    for (let k = i; k <= j; k++) r[order[k][1]] = (i + j) / 2 + 1;
    i = j + 1;
  }
  return r;
}

/**
 * Cox proportional hazards. Newton–Raphson from β = 0 with step halving when the log partial
 * likelihood falls; converged when it changes by less than 1e-9 relative. SE from the inverse
 * information at β̂; Wald z and two-sided normal p; hazard ratio exp(β) with 95 % interval
 * exp(β ± 1.96·SE); likelihood-ratio χ² = 2(ℓ(β̂) − ℓ(0)) and score χ² = u(0)ᵀ I(0)⁻¹ u(0), both on
 * (number of columns kept) df.
 *
 * Proportional-hazards check, per column j (`ph[j]`): for each event k (sorted by time) the Schoenfeld
 * residual r_k = x_k − x̄(t_k) (x̄ the risk-set weighted mean; with Efron ties the mean of the d
 * sub-step means), scaled as r*_k = D·V·r_k (+ β̂, which does not change a correlation), D the number
 * of events and V the inverse information. `rho` is the Pearson correlation of r*_kj with g(t_k), g the
 * rank of the event time (`phTime: 'rank'`, the default; tied times share their average rank) or the time
 * itself (`'identity'`). `p` is the Grambsch–Therneau one-degree-of-freedom test:
 * T = (Σ (g_k − ḡ) r*_kj)² / (D · V_jj · Σ (g_k − ḡ)²), p = P(χ²₁ > T). Null with fewer than 3 events
 * or when the fit did not converge.
 *
 * Columns with no variation are dropped (warning; NaN in their places). Separation — the likelihood
 * increasing without bound as a coefficient runs to ±∞ — is detected when, at the end, the next Newton
 * step is still large against the coefficient, or a coefficient exceeds 25 standard deviations of
 * its column in log-hazard: `converged` is false and a warning names the column (the interval's upper
 * end may then be Infinity: show the warning, not the figures).
 */
export function coxPH(rowsIn: CoxRow[], opts: { ties?: Ties; maxIter?: number; phTime?: 'rank' | 'identity' } = {}): CoxResult {
  const ties = opts.ties ?? 'efron';
  const maxIter = opts.maxIter ?? 30;
  const pAll = rowsIn[0]?.x.length ?? 0;
  for (const [i, r] of rowsIn.entries()) {
    if (!Number.isFinite(r.time) || r.time < 0) throw new RangeError(`row ${i}: time must be a finite number ≥ 0 (got ${r.time})`);
    if (r.x.length !== pAll || r.x.some((v) => !Number.isFinite(v))) throw new RangeError(`row ${i}: x must hold ${pAll} finite numbers`);
  }
  const warnings: string[] = [];
  const kept: number[] = [];
  const dropped: number[] = [];
  const sd: number[] = [];
  const mean: number[] = [];
  for (let j = 0; j < pAll; j++) {
    const col = rowsIn.map((r) => r.x[j]);
    const m = col.reduce((a, b) => a + b, 0) / (col.length || 1);
    const s = Math.sqrt(col.reduce((a, b) => a + (b - m) ** 2, 0) / (col.length || 1));
    if (s > 0) { kept.push(j); mean.push(m); sd.push(s); } else { dropped.push(j); warnings.push(`Covariate ${j + 1} has the same value for every row and was left out.`); }
  }
  const p = kept.length;
  const rows = rowsIn
    .map((r) => ({ time: r.time, event: r.event, x: kept.map((j, a) => r.x[j] - mean[a]) }))
    .sort((a, b) => b.time - a.time);
  const nEvents = rows.filter((r) => r.event).length;
  const flat: Prepared = { n: rows.length, p, time: new Float64Array(rows.length), event: new Uint8Array(rows.length), x: new Float64Array(rows.length * p) };
  rows.forEach((r, i) => { flat.time[i] = r.time; flat.event[i] = r.event ? 1 : 0; flat.x.set(r.x, i * p); });

  const spread = (v: number[]) => { const out = new Array<number>(pAll).fill(Number.NaN); kept.forEach((j, a) => { out[j] = v[a]; }); return out; };
  const fit0 = pass(flat, new Array<number>(p).fill(0), ties);
  const logLik0 = fit0.logLik;

  let beta = new Array<number>(p).fill(0);
  let cur = fit0;
  let converged = false;
  let iterations = 0;
  let singular = false;
  if (p === 0 || nEvents === 0) {
    converged = p === 0;
    if (nEvents === 0) warnings.push('No events: the model cannot be fitted.');
  } else {
    for (iterations = 1; iterations <= maxIter; iterations++) {
      const inv = invertSpd(cur.info);
      if (!inv) { singular = true; break; }
      const step = matVec(inv, cur.u);
      let next = beta.map((b, a) => b + step[a]);
      let fit = pass(flat, next, ties);
      for (let h = 0; h < 30 && !(fit.logLik >= cur.logLik - 1e-12 * Math.abs(cur.logLik)); h++) {
        next = next.map((b, a) => (b + beta[a]) / 2);
        fit = pass(flat, next, ties);
      }
      const change = Math.abs(fit.logLik - cur.logLik);
      beta = next;
      cur = fit;
      if (!beta.every(Number.isFinite) || !Number.isFinite(cur.logLik)) break;
      if (change <= 1e-9 * Math.max(1, Math.abs(cur.logLik))) { converged = true; break; }
    }
    iterations = Math.min(iterations, maxIter);
  }

  const V = p > 0 ? invertSpd(cur.info) : [];
  if (p > 0 && (!V || singular)) warnings.push('The information matrix is singular (covariates collinear, or a factor level with no events): no standard errors.');
  if (p > 0 && nEvents > 0 && V) {
    const step = matVec(V, cur.u);
    kept.forEach((j, a) => {
      if (Math.abs(step[a]) > 1e-4 * Math.max(1, Math.abs(beta[a])) || Math.abs(beta[a]) * sd[a] > 25) {
        converged = false;
        warnings.push(`The coefficient of covariate ${j + 1} appears to be infinite: its groups are separated (every event on one side), so the hazard ratio cannot be estimated.`);
      }
    });
  }
  if (p > 0 && nEvents > 0 && !converged && !warnings.some((w) => w.includes('infinite'))) warnings.push(`The fit did not converge in ${maxIter} iterations.`);

  const z = normalQuantileForLevel(0.95);
  const se = beta.map((_, a) => (V ? Math.sqrt(V[a][a]) : Number.NaN));
  const zs = beta.map((b, a) => b / se[a]);
  const pv = zs.map((v) => (Number.isFinite(v) ? chiSquareUpper(v * v, 1) : Number.NaN));
  const lrChi2 = Math.max(0, 2 * (cur.logLik - logLik0));
  const inv0 = p > 0 ? invertSpd(fit0.info) : null;
  const scoreChi2 = inv0 ? dot(fit0.u, matVec(inv0, fit0.u)) : 0;

  // Proportional-hazards check on the final fit.
  const ph: { rho: number | null; p: number | null }[] = new Array(pAll).fill(null).map(() => ({ rho: null, p: null }));
  if (p > 0 && V && converged && nEvents >= 3) {
    const final = pass(flat, beta, ties, true);
    const times: number[] = [];
    const scaled: number[][] = [];
    const byTime = new Map(final.means!.map((m) => [m.t, m.xbar]));
    for (const r of [...rows].reverse()) {
      if (!r.event) continue;
      const xbar = byTime.get(r.time)!;
      const resid = r.x.map((v, a) => v - xbar[a]);
      times.push(r.time);
      scaled.push(matVec(V, resid).map((v) => v * nEvents));
    }
    const g = opts.phTime === 'identity' ? times : ranks(times);
    const gm = g.reduce((a, b) => a + b, 0) / g.length;
    const sgg = g.reduce((a, b) => a + (b - gm) ** 2, 0);
    kept.forEach((j, a) => {
      const col = scaled.map((s) => s[a]);
      const rho = pearson(g, col);
      if (rho === null || !(sgg > 0)) return;
      const test = g.reduce((acc, gv, k) => acc + (gv - gm) * col[k], 0);
      const stat = (test * test) / (nEvents * V[a][a] * sgg);
      ph[j] = { rho, p: chiSquareUpper(stat, 1) };
    });
  }

  const out = (v: number[]) => spread(v);
  return {
    beta: out(beta), se: out(se), z: out(zs), p: out(pv),
    hazardRatio: out(beta.map(Math.exp)),
    lower: out(beta.map((b, a) => Math.exp(b - z * se[a]))),
    upper: out(beta.map((b, a) => Math.exp(b + z * se[a]))),
    logLik: cur.logLik, logLik0,
    lr: { chi2: lrChi2, df: p, p: p > 0 ? chiSquareUpper(lrChi2, p) : 1 },
    score: { chi2: scoreChi2, df: p, p: p > 0 ? chiSquareUpper(scoreChi2, p) : 1 },
    ph, converged, iterations, warnings,
    ...(dropped.length ? { dropped } : {}),
  };
}
