/**
 * Survival of prints until an event (a noticeable fading, an observation, a grade): the
 * Kaplan–Meier product-limit estimate with Greenwood standard errors and pointwise confidence
 * intervals, the median with the Brookmeyer–Crowley interval, the number at risk, and the
 * log-rank test for two or more groups. Pure functions, no I/O.
 *
 * Sources: E. L. Kaplan & P. Meier, JASA 53:457–481 (1958); M. Greenwood, "The natural duration of
 * cancer", Reports on Public Health and Medical Subjects 33 (1926); R. Brookmeyer & J. Crowley,
 * Biometrics 38:29–41 (1982); N. Mantel, Cancer Chemotherapy Reports 50:163–170 (1966).
 */
// @ts-expect-error -- jstat ships no type declarations; the functions used are typed below.
import jStatModule from 'jstat';

const jStat = jStatModule as {
  normal: { inv(p: number, mean: number, sd: number): number };
  chisquare: { cdf(x: number, df: number): number };
};

/**
 * One observation, or `count` identical ones (a whole number ≥ 1; 1 when absent). Counts give exactly
 * the figures of the expanded list, so a caller may send (time, event, count) rows instead of one per print.
 */
export interface SurvivalObs { time: number; event: boolean; count?: number }
export interface KmStep { t: number; atRisk: number; events: number; censored: number; s: number; se: number | null; lower: number | null; upper: number | null }
export type CiMethod = 'log-log' | 'plain';

/** The two-sided normal quantile for a confidence level (1.959964 for 0.95). */
export function normalQuantileForLevel(level: number): number {
  if (!(level > 0 && level < 1)) throw new RangeError(`level must be in (0, 1) (got ${level})`);
  return jStat.normal.inv((1 + level) / 2, 0, 1);
}

/** Upper tail of the χ² distribution on `df` degrees of freedom (jstat). */
export function chiSquareUpper(x: number, df: number): number {
  if (!(df > 0)) throw new RangeError(`df must be positive (got ${df})`);
  if (!(x > 0)) return 1;
  return Math.max(0, 1 - jStat.chisquare.cdf(x, df));
}

function checkObs(obs: SurvivalObs[]): void {
  for (const [i, o] of obs.entries()) {
    if (!Number.isFinite(o.time) || o.time < 0) throw new RangeError(`observation ${i}: time must be a finite number ≥ 0 (got ${o.time})`);
    if (o.count !== undefined && !(Number.isInteger(o.count) && o.count >= 1)) throw new RangeError(`observation ${i}: count must be a whole number ≥ 1 (got ${o.count})`);
  }
}

/** How many observations a list stands for (the sum of the counts). */
function countOf(obs: SurvivalObs[]): number {
  let n = 0;
  for (const o of obs) n += o.count ?? 1;
  return n;
}

/** Times ascending with the running count from the end: `from[i]` = observations with time ≥ times[i]. */
function sortedWithTail(obs: SurvivalObs[]): { times: number[]; from: number[] } {
  const sorted = [...obs].sort((a, b) => a.time - b.time);
  const times = sorted.map((o) => o.time);
  const from = new Array<number>(sorted.length + 1).fill(0);
  for (let i = sorted.length - 1; i >= 0; i--) from[i] = from[i + 1]! + (sorted[i]!.count ?? 1);
  return { times, from };
}

/** Observations with time ≥ t, from `sortedWithTail`. */
function countFrom(s: { times: number[]; from: number[] }, t: number): number {
  let lo = 0;
  let hi = s.times.length;
  while (lo < hi) { const mid = (lo + hi) >> 1; if (s.times[mid]! < t) lo = mid + 1; else hi = mid; }
  return s.from[lo]!;
}

interface TimeRow { t: number; events: number; censored: number }

/** Distinct times, ascending, with the events and censorings at each. */
function tabulate(obs: SurvivalObs[]): TimeRow[] {
  const byTime = new Map<number, TimeRow>();
  for (const o of obs) {
    const row = byTime.get(o.time) ?? { t: o.time, events: 0, censored: 0 };
    if (o.event) row.events += o.count ?? 1; else row.censored += o.count ?? 1;
    byTime.set(o.time, row);
  }
  return [...byTime.values()].sort((a, b) => a.t - b.t);
}

/**
 * Pointwise interval for S(t) from S and the Greenwood sum v = Σ d/(n(n−d)) (the variance of log S).
 * 'plain': S ± z·S·√v clipped to [0, 1]. 'log-log': the interval for log(−log S) with standard error
 * √v / |log S|, transformed back: S^exp(±z·√v/|log S|); null where S is 0 or 1 (undefined there).
 */
function interval(s: number, v: number, z: number, ci: CiMethod): { lower: number | null; upper: number | null } {
  if (s === 0 || !Number.isFinite(v)) return { lower: null, upper: null };
  if (ci === 'plain') {
    const half = z * s * Math.sqrt(v);
    return { lower: Math.max(0, s - half), upper: Math.min(1, s + half) };
  }
  if (s === 1) return { lower: null, upper: null };
  const w = (z * Math.sqrt(v)) / Math.abs(Math.log(s));
  return { lower: Math.pow(s, Math.exp(w)), upper: Math.pow(s, Math.exp(-w)) };
}

export interface KaplanMeierResult {
  n: number; events: number; censored: number; steps: KmStep[];
  median: { value: number; lower: number | null; upper: number | null } | null;
}

/**
 * Kaplan–Meier product-limit estimate: one step per distinct time with events or censorings (a time
 * with only censorings leaves S unchanged). At each step, `atRisk` = observations with time ≥ t;
 * S(t) = Π (1 − d/n) over the event times ≤ t; the Greenwood SE is S·√Σ d/(n(n−d)). SE and interval
 * are null where S = 0 (the Greenwood sum is infinite there); with 'log-log' also where S = 1.
 *
 * Median: the first t with S(t) ≤ 0.5 (null when the curve stays above). Its interval (Brookmeyer &
 * Crowley, on the same transform): the times where the band crosses 0.5 — lower end the first t whose
 * lower limit is ≤ 0.5, upper end the first t whose upper limit is ≤ 0.5 (null when it never is).
 * Where a limit is null, S itself stands in for it.
 */
export function kaplanMeier(obs: SurvivalObs[], opts: { ci?: CiMethod; level?: number } = {}): KaplanMeierResult {
  checkObs(obs);
  const ci = opts.ci ?? 'log-log';
  const z = normalQuantileForLevel(opts.level ?? 0.95);
  const rows = tabulate(obs);
  const total = countOf(obs);
  let atRisk = total;
  let s = 1;
  let v = 0;
  const steps: KmStep[] = [];
  for (const r of rows) {
    if (r.events > 0) {
      s *= 1 - r.events / atRisk;
      v += r.events < atRisk ? r.events / (atRisk * (atRisk - r.events)) : Infinity;
    }
    const defined = s > 0 && Number.isFinite(v);
    const { lower, upper } = interval(s, v, z, ci);
    steps.push({ t: r.t, atRisk, events: r.events, censored: r.censored, s, se: defined ? s * Math.sqrt(v) : null, lower, upper });
    atRisk -= r.events + r.censored;
  }
  const events = rows.reduce((a, r) => a + r.events, 0);
  const first = (pick: (st: KmStep) => number) => steps.find((st) => st.events > 0 && pick(st) <= 0.5)?.t ?? null;
  const value = first((st) => st.s);
  const median = value === null ? null : { value, lower: first((st) => st.lower ?? st.s), upper: first((st) => st.upper ?? st.s) };
  return { n: total, events, censored: total - events, steps, median };
}

/** Number at risk just before each time: the observations with time ≥ t. */
export function atRiskAt(obs: SurvivalObs[], times: number[]): { t: number; n: number }[] {
  checkObs(obs);
  const s = sortedWithTail(obs);
  return times.map((t) => ({ t, n: countFrom(s, t) }));
}

/** Inverse of a symmetric positive-definite matrix by Cholesky; null when it is not (numerically) positive definite. */
export function invertSpd(a: number[][]): number[][] | null {
  const n = a.length;
  const l = a.map(() => new Array<number>(n).fill(0));
  const scale = Math.max(1e-300, ...a.map((row, i) => Math.abs(row[i])));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = a[i][j];
      for (let k = 0; k < j; k++) sum -= l[i][k] * l[j][k];
      if (i === j) {
        if (!(sum > 1e-12 * scale)) return null;
        l[i][i] = Math.sqrt(sum);
      } else l[i][j] = sum / l[j][j];
    }
  }
  // inverse of L (lower triangular), then A⁻¹ = L⁻ᵀ L⁻¹
  const li = l.map(() => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    li[i][i] = 1 / l[i][i];
    for (let j = 0; j < i; j++) {
      let sum = 0;
      for (let k = j; k < i; k++) sum -= l[i][k] * li[k][j];
      li[i][j] = sum / l[i][i];
    }
  }
  const inv = l.map(() => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) {
    let sum = 0;
    for (let k = i; k < n; k++) sum += li[k][i] * li[k][j];
    inv[i][j] = sum;
    inv[j][i] = sum;
  }
  return inv;
}

export interface LogRankResult {
  chi2: number; df: number; p: number; observed: number[]; expected: number[];
  /** Indexes of groups left out of the test because their variance is zero (e.g. an empty group). */
  excluded?: number[];
}

/**
 * Log-rank test for k ≥ 2 groups. At each distinct event time of the pooled data, with n at risk and d
 * events, group j expects d·n_j/n events; the hypergeometric covariance is
 * V_jl = d(n − d)/(n − 1) · (n_j/n)(δ_jl − n_l/n) (zero where n = 1). χ² = (O − E)ᵀ V⁻¹ (O − E) over
 * the groups that count, less one, on that many − 1 df; p is the χ² upper tail (jstat).
 *
 * A group whose variance is zero carries no information: no one of it at risk at any event time (an
 * empty group, or one censored before the first event), or it is the only group ever at risk. It is
 * listed in `excluded` and left out of χ² and df. When fewer than
 * two groups count (or no event happened) the result is χ² = 0 on 0 df with p = 1: there is no test.
 */
export function logRank(groups: SurvivalObs[][]): LogRankResult {
  if (groups.length < 2) throw new RangeError('logRank needs at least two groups');
  groups.forEach(checkObs);
  const k = groups.length;
  const eventTimes = [...new Set(groups.flatMap((g) => g.filter((o) => o.event).map((o) => o.time)))].sort((a, b) => a - b);
  const sortedTimes = groups.map(sortedWithTail);
  const atRisk = (j: number, t: number) => countFrom(sortedTimes[j]!, t);
  const eventsAt = groups.map((g) => {
    const m = new Map<number, number>();
    for (const o of g) if (o.event) m.set(o.time, (m.get(o.time) ?? 0) + (o.count ?? 1));
    return m;
  });
  const observed = new Array<number>(k).fill(0);
  const expected = new Array<number>(k).fill(0);
  const v = groups.map(() => new Array<number>(k).fill(0));
  for (const t of eventTimes) {
    const nj = groups.map((_, j) => atRisk(j, t));
    const dj = groups.map((_, j) => eventsAt[j].get(t) ?? 0);
    const n = nj.reduce((a, b) => a + b, 0);
    const d = dj.reduce((a, b) => a + b, 0);
    const f = n > 1 ? (d * (n - d)) / (n - 1) : 0;
    for (let j = 0; j < k; j++) {
      observed[j] += dj[j];
      expected[j] += (d * nj[j]) / n;
      for (let l = 0; l < k; l++) v[j][l] += f * (nj[j] / n) * ((j === l ? 1 : 0) - nj[l] / n);
    }
  }
  const counted = [...Array(k).keys()].filter((j) => v[j][j] > 0);
  const excluded = [...Array(k).keys()].filter((j) => !counted.includes(j));
  const base = { observed, expected, ...(excluded.length ? { excluded } : {}) };
  if (counted.length < 2) return { chi2: 0, df: 0, p: 1, ...base };
  // Drop the last counted group: the deviations of all k sum to zero.
  const use = counted.slice(0, -1);
  const dev = use.map((j) => observed[j] - expected[j]);
  const inv = invertSpd(use.map((j) => use.map((l) => v[j][l])));
  if (!inv) return { chi2: 0, df: 0, p: 1, ...base };
  let chi2 = 0;
  for (let a = 0; a < use.length; a++) for (let b = 0; b < use.length; b++) chi2 += dev[a] * inv[a][b] * dev[b];
  const df = use.length;
  return { chi2, df, p: chiSquareUpper(chi2, df), ...base };
}
