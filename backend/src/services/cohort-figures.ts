import { COHORT_FACTORS, type CohortFactorCode } from '@toneledger/common/fields/cohort';
import type { CohortQuery, CohortResult } from '@toneledger/common/schemas/research';
import { atRiskAt, kaplanMeier, logRank, type SurvivalObs } from '@toneledger/common/domain/survival';
import { coxPH } from '@toneledger/common/domain/cox';
import { describe, wilsonInterval } from '@toneledger/common/domain/distribution';
import type { CohortRow } from './cohort-sql';

/**
 * From the cohort statement's rows to the figures: group keys (number factors by the query's bands or
 * the median split, the date made by decade, a place by the level below the filtered place), the
 * fading distributions, Kaplan–Meier per group with the number at risk at the chart's ticks, the
 * log-rank test, the Cox model and the incidence of each term with its Wilson interval. Every
 * statistic comes from `common/src/domain/{survival,cox,distribution}.ts`.
 */

export const UNKNOWN = 'unknown';
/** A group with fewer prints or events than these gets a warning beside the log-rank test (common practice for small samples). */
export const MIN_GROUP_PRINTS = 10;
export const MIN_GROUP_EVENTS = 5;
/** Events per Cox term below which the model is flagged (the "ten events per variable" rule of thumb, common practice). */
export const EVENTS_PER_TERM = 10;
/** A text or choice factor in the Cox model keeps its largest levels; the rest are one level "other". */
export const MAX_COX_LEVELS = 8;

export interface GroupedRow extends CohortRow { key: string; values: Record<string, string | null>; label: string }

const fmt = (n: number) => (Number.isInteger(n) ? String(n) : n.toPrecision(3).replace(/\.?0+$/, ''));

export interface Grouping {
  /** Per group factor: raw value → group value (its label). */
  valueOf(code: CohortFactorCode, raw: string | number | null): string | null;
}

/** How the query's group factors turn raw values into group values. `places` maps a location id to the child of the filter's place it lies under. */
export function makeGrouping(q: CohortQuery, rows: CohortRow[], places: Map<string, string>): Grouping {
  const medians = new Map<string, number | null>();
  for (const [i, code] of q.groupBy.entries()) {
    if (COHORT_FACTORS[code].kind !== 'number' || q.bands?.[code]) continue;
    // Each row stands for `weight` prints.
    const vals: number[] = [];
    for (const r of rows) { const v = i === 0 ? r.g0 : r.g1; if (v !== null) for (let k = 0; k < r.weight; k += 1) vals.push(Number(v)); }
    medians.set(code, describe(vals).median);
  }
  return {
    valueOf(code, raw) {
      const kind = COHORT_FACTORS[code].kind;
      if (raw === null || raw === undefined) return kind === 'flag' ? UNKNOWN : null;
      if (kind === 'number') {
        const x = Number(raw);
        const cuts = q.bands?.[code];
        if (cuts) { const i = cuts.findIndex((c) => x < c); return bandLabel(cuts, i === -1 ? cuts.length : i); }
        const m = medians.get(code);
        if (m === null || m === undefined) return null;
        return medianLabel(m, x < m);
      }
      if (kind === 'year') return `${Math.floor(Number(raw) / 10) * 10}s`;
      if (kind === 'place') return places.get(String(raw)) ?? null;
      return String(raw);
    },
  };
}

/** The label of band `i` of the cut points: 0 below the first, `cuts.length` at or above the last. */
function bandLabel(cuts: number[], i: number): string {
  if (i === 0) return `< ${fmt(cuts[0]!)}`;
  if (i >= cuts.length) return `≥ ${fmt(cuts.at(-1)!)}`;
  return `${fmt(cuts[i - 1]!)}–${fmt(cuts[i]!)}`;
}
const medianLabel = (m: number, below: boolean) => (below ? `below the median (${fmt(m)})` : `the median (${fmt(m)}) or above`);

/**
 * The group value of a group code from the aggregated statement (`cohort-aggregate.ts`): the same
 * labels `makeGrouping` gives the raw values. Codes: a band's index, 'below'/'above' the median, a
 * decade, a place's name, the value itself otherwise.
 */
export function valueOfCode(q: CohortQuery, code: CohortFactorCode, raw: string | null, median: number | null): string | null {
  if (raw === null) return null;
  const kind = COHORT_FACTORS[code].kind;
  if (kind === 'number') {
    const cuts = q.bands?.[code];
    if (cuts) return bandLabel(cuts, Number(raw));
    return median === null ? null : medianLabel(median, raw === 'below');
  }
  if (kind === 'year') return `${raw}s`;
  return raw;
}

/** A group's key, values and label from its group values (as `groupRows` makes them). */
export function groupIdentity(q: CohortQuery, parts: (string | null)[]): { key: string; values: Record<string, string | null>; label: string } {
  if (!q.groupBy.length) return { key: 'all', values: {}, label: 'All prints' };
  return {
    key: q.groupBy.map((c, i) => `${c}=${parts[i] ?? 'none'}`).join('|'),
    values: Object.fromEntries(q.groupBy.map((c, i) => [c, parts[i] ?? null])),
    label: q.groupBy.map((c, i) => labelOf(c, parts[i] ?? 'none')).join(' · '),
  };
}

/** The order of a number factor's groups: by their lower bound. */
function bandOrder(label: string): number {
  const m = /-?\d+(?:\.\d+)?/.exec(label);
  if (label.startsWith('<')) return -Infinity;
  if (label.startsWith('below')) return -1e15;
  if (label.startsWith('the median')) return 1e15;
  return m ? Number(m[0]) : Infinity;
}

/** Gives each row its group key, values and label (in place: a cohort may hold 200,000 rows). */
export function groupRows(q: CohortQuery, rows: CohortRow[], grouping: Grouping): GroupedRow[] {
  const labels = new Map<string, { values: Record<string, string | null>; label: string }>();
  const out = rows as GroupedRow[];
  for (const r of out) {
    if (!q.groupBy.length) { r.key = 'all'; r.values = {}; r.label = 'All prints'; continue; }
    const parts = q.groupBy.map((code, i) => grouping.valueOf(code, i === 0 ? r.g0 : r.g1));
    const key = q.groupBy.map((c, i) => `${c}=${parts[i] ?? 'none'}`).join('|');
    let seen = labels.get(key);
    if (!seen) { seen = groupIdentity(q, parts); labels.set(key, seen); }
    r.key = key; r.values = seen.values; r.label = seen.label;
  }
  return out;
}

function labelOf(code: CohortFactorCode, value: string): string {
  const f = COHORT_FACTORS[code] as { label: string; choices?: { labels: Record<string, string> } };
  const shown = f.choices?.labels[value] ?? value;
  return `${f.label}: ${shown}`;
}

/** Chart ticks from 0 to the longest time, at a round step (1, 2 or 5 × 10^k), about five of them. */
export function chartTicks(maxT: number): number[] {
  if (!(maxT > 0)) return [0];
  const raw = maxT / 5;
  const pow = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * pow).find((s) => s >= raw)!;
  const out: number[] = [];
  for (let t = 0; t <= maxT + 1e-9; t += step) out.push(Math.round(t * 1e9) / 1e9);
  return out;
}

const ASSUMPTIONS = [
  'Censoring is independent of fading or deterioration: a print that stops being examined is as likely to change as one still examined.',
  'Censoring is non-informative: why a print left observation (not yet examined again, lent, deaccessioned) says nothing of its risk.',
  'The test has most power when the hazards are proportional (the curves do not cross); crossing curves can hide a difference.',
];

/** Kaplan–Meier per group and the log-rank test; each group's observations may carry counts ((time, event, count) rows). */
export function survivalFigures(q: CohortQuery, groups: { key: string; obs: SurvivalObs[] }[]): CohortResult['survival'] {
  const all = groups.filter((g) => g.obs.length > 0);
  let maxT = 0;
  for (const g of all) for (const o of g.obs) if (o.time > maxT) maxT = o.time;
  const ticks = chartTicks(maxT);
  const curves = all.map((g) => {
    const km = kaplanMeier(g.obs, { ci: q.ci });
    return { key: g.key, n: km.n, events: km.events, censored: km.censored, median: km.median, steps: km.steps, atRisk: atRiskAt(g.obs, ticks) };
  });
  let test: CohortResult['survival']['logRank'] = null;
  if (all.length >= 2) {
    const lr = logRank(all.map((g) => g.obs));
    const warnings: string[] = [];
    for (const c of curves) {
      if (c.n < MIN_GROUP_PRINTS) warnings.push(`Group ${c.key} has ${c.n} prints (fewer than ${MIN_GROUP_PRINTS}): the test's χ² approximation is rough.`);
      if (c.events < MIN_GROUP_EVENTS) warnings.push(`Group ${c.key} has ${c.events} events (fewer than ${MIN_GROUP_EVENTS}): the test has little power.`);
    }
    test = {
      chi2: lr.chi2, df: lr.df, p: lr.p,
      groups: all.map((g, i) => ({ key: g.key, observed: lr.observed[i]!, expected: lr.expected[i]! })),
      assumptions: ASSUMPTIONS, warnings,
    };
  }
  return {
    origin: q.origin,
    originLabel: q.origin === 'made' ? 'years since made (earliest year of the date made)' : 'years since the first examination',
    eventLabel: eventLabel(q),
    timeUnit: 'years', ci: q.ci, groups: curves, logRank: test,
  };
}

export function eventLabel(q: CohortQuery, threshold?: number): string {
  if (q.event.kind === 'fading') return `ΔE00 at the maximum-density spot reaches ${q.event.thresholdDeltaE ?? threshold ?? 'the noticeable threshold'}`;
  if (q.event.kind === 'observation') return `first signed report showing "${q.event.term}"`;
  return `first signed report graded ${q.event.grade} or worse`;
}

/** Incidence of each term per group with its Wilson interval: `seen` prints with a signed report, `counts` of them per term. */
export function incidenceFigures(tallies: { key: string; seen: number; counts: Map<string, number> }[], termLabels: Map<string, string>): CohortResult['incidence'] {
  const terms = [...new Set(tallies.flatMap((x) => [...x.counts.keys()]))].sort();
  return terms.map((term) => ({
    term, label: termLabels.get(term) ?? term,
    groups: tallies.filter((x) => x.seen > 0).map((x) => {
      const count = x.counts.get(term) ?? 0;
      const w = wilsonInterval(count, x.seen);
      return { key: x.key, n: x.seen, count, share: w.share, lower: w.lower, upper: w.upper };
    }),
  }));
}

/** One print that counts for survival, with the raw values of the Cox factors in the query's order. */
export interface CoxObs { time: number; event: boolean; x: (string | number | null)[] | null }

/** The Cox model on the query's factors: numbers as they are; choice, text and flag factors as dummies against their largest level. */
export function coxFigures(q: CohortQuery, usable: CoxObs[]): CohortResult['cox'] {
  if (!q.coxFactors.length) return null;
  const warnings: string[] = [];
  type Col = { label: string; factor: CohortFactorCode; level: string | null; reference: string | null; value: (raw: string | null) => number | null };
  const cols: Col[] = [];
  // Prints sharing a covariate pattern share its array (the statement sends each pattern once): the
  // levels are counted and the model's columns computed once per pattern, then given to its prints.
  const patterns = new Map<CoxObs['x'], number>();
  for (const r of usable) patterns.set(r.x, (patterns.get(r.x) ?? 0) + 1);
  for (const [j, code] of q.coxFactors.entries()) {
    const kind = COHORT_FACTORS[code].kind;
    if (kind === 'number' || kind === 'year') {
      cols.push({ label: `${code} (per ${COHORT_FACTORS[code].unit ?? 'unit'})`, factor: code, level: null, reference: null, value: (raw) => (raw === null ? null : Number(raw)) });
      continue;
    }
    if (kind === 'place') { warnings.push('The storage place is left out of the model: group by it instead.'); continue; }
    const counts = new Map<string, number>();
    for (const [x, m] of patterns) { const v = String(x?.[j] ?? (kind === 'flag' ? UNKNOWN : 'none')); counts.set(v, (counts.get(v) ?? 0) + m); }
    const levels = [...counts].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0])).map(([v]) => v);
    if (levels.length < 2) { warnings.push(`${code} takes one value in this cohort and is left out of the model.`); continue; }
    const kept = levels.slice(0, MAX_COX_LEVELS);
    if (levels.length > MAX_COX_LEVELS) warnings.push(`${code} has ${levels.length} values: the ${levels.length - MAX_COX_LEVELS + 1} smallest are taken together as "other".`);
    const reference = kept[0]!;
    const levelOf = (raw: string | null) => { const v = raw ?? (kind === 'flag' ? UNKNOWN : 'none'); return kept.includes(v) && !(levels.length > MAX_COX_LEVELS && v === kept.at(-1)) ? v : 'other'; };
    const dummies = levels.length > MAX_COX_LEVELS ? [...kept.slice(1, -1), 'other'] : kept.slice(1);
    for (const level of dummies) cols.push({ label: `${code} = ${level} (against ${reference})`, factor: code, level, reference, value: (raw) => (levelOf(raw) === level ? 1 : 0) });
  }
  const modelRows: { time: number; event: boolean; x: number[] }[] = [];
  const colIndex = cols.map((c) => q.coxFactors.indexOf(c.factor));
  const modelX = new Map<CoxObs['x'], number[] | null>();
  for (const raw of patterns.keys()) {
    const x = cols.map((c, k) => c.value((raw?.[colIndex[k]!] ?? null) as string | null));
    modelX.set(raw, x.some((v) => v === null || !Number.isFinite(v)) ? null : x as number[]);
  }
  for (const r of usable) {
    const x = modelX.get(r.x);
    if (x) modelRows.push({ time: r.time, event: r.event, x });
  }
  const events = modelRows.filter((r) => r.event).length;
  if (modelRows.length < usable.length) warnings.push(`${usable.length - modelRows.length} prints without a value of a numeric factor are left out of the model.`);
  if (!cols.length || !events) {
    if (!events) warnings.push('No events among the prints with every factor: the model cannot be fitted.');
    return { n: modelRows.length, events, ties: 'efron', terms: [], likelihoodRatio: { chi2: 0, df: 0, p: 1 }, proportionalHazards: [], warnings };
  }
  if (events < EVENTS_PER_TERM * cols.length) warnings.push(`${events} events for ${cols.length} terms (fewer than ${EVENTS_PER_TERM} per term): the estimates may be unstable.`);
  const fit = coxPH(modelRows, { ties: 'efron' });
  warnings.push(...fit.warnings);
  if (!fit.converged) warnings.push(`The fit did not converge in ${fit.iterations} iterations.`);
  const num = (v: number) => (Number.isFinite(v) ? v : 0);
  return {
    n: modelRows.length, events, ties: 'efron',
    terms: cols.map((c, k) => ({
      label: c.label, factor: c.factor, level: c.level, reference: c.reference,
      beta: num(fit.beta[k]!), se: num(fit.se[k]!), hazardRatio: num(fit.hazardRatio[k]!), lower: num(fit.lower[k]!), upper: num(fit.upper[k]!), p: num(fit.p[k]!),
    })),
    likelihoodRatio: { chi2: num(fit.lr.chi2), df: fit.lr.df, p: Number.isFinite(fit.lr.p) ? fit.lr.p : 1 },
    proportionalHazards: cols.map((c, k) => {
      const ph = fit.ph[k];
      const rho = ph && Number.isFinite(ph.rho) ? ph.rho : null;
      const p = ph && Number.isFinite(ph.p) ? ph.p : null;
      const verdict = p === null ? 'Not tested.' : p < 0.05
        ? `The effect seems to change with time (p = ${p.toPrecision(2)}): read the hazard ratio as an average over the follow-up.`
        : `No sign that the effect changes with time (p = ${p.toPrecision(2)}).`;
      return { label: c.label, rho, p, verdict };
    }),
    warnings,
  };
}
