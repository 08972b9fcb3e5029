import { QueryTypes } from 'sequelize';
import { COHORT_FACTORS, COHORT_FACTOR_CODES } from '@toneledger/common/fields/cohort';
import { COHORT_FIGURES, type CohortFigure, type CohortQuery, type CohortResult } from '@toneledger/common/schemas/research';
import type { cohortPrintSchema, cohortPrintsInputSchema } from '@toneledger/common/schemas/research';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import type { z } from 'zod';
import { db } from '../db';
import { validationFailed } from '../errors';
import { buildCohortSql, type CohortRow } from './cohort-sql';
import { coxFigures, groupIdentity, groupRows, incidenceFigures, makeGrouping, survivalFigures, valueOfCode, type CoxObs, type GroupedRow } from './cohort-figures';
import { buildAggregateSql, type AggregateAnswer } from './cohort-aggregate';
import type { SurvivalObs } from '@toneledger/common/domain/survival';
import { getMeasurementSettings } from './measurement.service';
import { pgRows } from './print-list.service';

/** What the contract's schema cannot see alone: bands only for number factors grouped by, in ascending order. */
function checkQuery(q: CohortQuery, at = ''): void {
  const issues: FieldIssue[] = [];
  for (const [code, cuts] of Object.entries(q.bands ?? {})) {
    const path = `${at}bands.${code}`;
    const known = (COHORT_FACTOR_CODES as string[]).includes(code);
    if (!known || COHORT_FACTORS[code as keyof typeof COHORT_FACTORS].kind !== 'number') issues.push({ path, code: 'custom', message: 'Bands are for a number factor' });
    else if (!q.groupBy.includes(code as keyof typeof COHORT_FACTORS)) issues.push({ path, code: 'custom', message: 'Bands are for a factor the query groups by' });
    else if (cuts.some((c, i) => i > 0 && c <= cuts[i - 1]!)) issues.push({ path, code: 'custom', message: 'List the cut points in ascending order' });
  }
  if (issues.length) throw validationFailed(issues);
}

/** The place under the query's place filter each location lies in: the filter's place itself, or its child on the way down. */
async function placeGroups(q: CohortQuery): Promise<Map<string, string>> {
  const out = new Map<string, string>();
  if (!q.groupBy.includes('location')) return out;
  const root = q.filters.find((f) => f.factor === 'location')?.locationId;
  if (!root) return out;
  const rows = await db().query<{ id: string; name: string; top: string }>(
    `WITH RECURSIVE sub AS (
       SELECT id, name, id AS top, 0 AS depth FROM locations WHERE id = $1::uuid
       UNION ALL
       SELECT l.id, l.name, CASE WHEN sub.depth = 0 THEN l.id ELSE sub.top END, sub.depth + 1 FROM locations l JOIN sub ON l.parent_id = sub.id WHERE sub.depth < 30)
     SELECT s.id, t.name, s.top FROM sub s JOIN locations t ON t.id = s.top`,
    { bind: [root], type: QueryTypes.SELECT },
  );
  for (const r of rows) out.set(r.id, r.name);
  return out;
}

interface Cohort { rows: GroupedRow[]; groups: { key: string; label: string; values: Record<string, string | null>; rows: GroupedRow[] }[]; threshold: number }

/** The cohort's rows, grouped. */
export async function loadCohort(q: CohortQuery, options: { ordered?: boolean } = {}): Promise<Cohort> {
  checkQuery(q);
  const threshold = q.event.thresholdDeltaE ?? (await getMeasurementSettings()).noticeableDeltaE;
  const sql = buildCohortSql(q, threshold, options);
  const [raw, places] = await Promise.all([pgRows<CohortRow>(sql.text, sql.values), placeGroups(q)]);
  const rows = groupRows(q, raw, makeGrouping(q, raw, places));
  const byKey = new Map<string, Cohort['groups'][number]>();
  for (const r of rows) {
    const g = byKey.get(r.key);
    if (g) g.rows.push(r); else byKey.set(r.key, { key: r.key, label: r.label, values: r.values, rows: [r] });
  }
  const size = (g: { rows: GroupedRow[] }) => g.rows.reduce((n, r) => n + r.weight, 0);
  const groups = [...byKey.values()].sort((a, b) => size(b) - size(a) || a.label.localeCompare(b.label));
  return { rows, groups, threshold };
}

/**
 * The figures' statement with more sort memory and without JIT (`SET LOCAL` in its own transaction):
 * its sorts over 200,000 rows (quartiles, ranks for the points) spill to disk at the default 4 MB, and
 * its cost estimate makes PostgreSQL compile it with LLVM, which took longer (1.5–5 s on the 2-core
 * machine) than running it.
 */
export async function withWorkMem<T>(text: string, values: unknown[]): Promise<T[]> {
  const manager = db().connectionManager as unknown as {
    getConnection(): Promise<{ query(text: string, values?: unknown[]): Promise<{ rows: T[] }> }>;
    releaseConnection(connection: unknown): Promise<void>;
  };
  const connection = await manager.getConnection();
  try {
    await connection.query("BEGIN READ ONLY; SET LOCAL work_mem = '64MB'; SET LOCAL jit = off");
    try {
      const rows = (await connection.query(text, values)).rows;
      await connection.query('COMMIT');
      return rows;
    } catch (err) {
      await connection.query('ROLLBACK');
      throw err;
    }
  } finally {
    await manager.releaseConnection(connection);
  }
}

/** Strip-plot points per group and rate in an answer (evenly spaced by rank; `n` says how many there are). */
export const POINTS_CAP = 500;

/**
 * The figures of a query, grouped in SQL (`cohort-aggregate.ts`). `pointsCap`: strip-plot points per
 * group and rate (null: every print, for the export). `figures`: those to compute (all when left
 * out); the groups and their sizes come with every part.
 */
export async function runCohort(q: CohortQuery, options: { pointsCap?: number | null; figures?: readonly CohortFigure[] } = {}): Promise<CohortResult> {
  checkQuery(q);
  const figures = COHORT_FIGURES.filter((f) => !options.figures || options.figures.includes(f));
  const threshold = q.event.thresholdDeltaE ?? (await getMeasurementSettings()).noticeableDeltaE;
  const places = await placeGroups(q);
  const sql = buildAggregateSql(q, threshold, { places, pointsCap: options.pointsCap === undefined ? POINTS_CAP : options.pointsCap, figures });
  const [[a], terms] = await Promise.all([
    withWorkMem<AggregateAnswer>(sql.text, sql.values),
    figures.includes('incidence') ? db().query<{ code: string; label: string }>('SELECT code, label FROM condition_terms', { type: QueryTypes.SELECT }) : [],
  ]);
  const codeKey = (k0: string | null, k1: string | null) => `${k0 ?? ''}\u0000${k1 ?? ''}`;
  const identity = new Map<string, ReturnType<typeof groupIdentity>>();
  const keyOf = (k0: string | null, k1: string | null) => {
    const ck = codeKey(k0, k1);
    let id = identity.get(ck);
    if (!id) {
      const parts = q.groupBy.map((code, i) => valueOfCode(q, code, i === 0 ? k0 : k1, a!.medians?.[i] ?? null));
      id = groupIdentity(q, parts);
      identity.set(ck, id);
    }
    return id.key;
  };
  type Dist = CohortResult['fading'][number]['deltaEPerYear'];
  const dist = ([n, min, max, qs]: [number, number | null, number | null, (number | null)[] | null]): Dist =>
    ({ n, min, max, q1: qs?.[0] ?? null, median: qs?.[1] ?? null, q3: qs?.[2] ?? null, points: [] });
  const groups = (a!.groups ?? []).map(([k0, k1, size, withRate, withSurvival, reports, de, dl]) => {
    keyOf(k0, k1);
    const id = identity.get(codeKey(k0, k1))!;
    return { ...id, size, withRate, withSurvival, reports, de: dist(de), dl: dist(dl), obs: [] as SurvivalObs[], terms: new Map<string, number>() };
  }).sort((x, y) => y.size - x.size || x.label.localeCompare(y.label));
  const byKey = new Map(groups.map((g) => [g.key, g]));
  for (const [k0, k1, metric, printId, accessionNumber, value] of a!.points ?? []) {
    const g = byKey.get(keyOf(k0, k1))!;
    (metric === 'de' ? g.de : g.dl).points.push({ printId, accessionNumber, value });
  }
  for (const [k0, k1, times, events, counts] of a!.survival ?? []) {
    const obs = byKey.get(keyOf(k0, k1))!.obs;
    for (let i = 0; i < times.length; i += 1) obs.push({ time: times[i]!, event: events[i]!, count: counts[i]! });
  }
  for (const [k0, k1, term, n] of a!.terms ?? []) byKey.get(keyOf(k0, k1))!.terms.set(term, n);
  const coxRows: CoxObs[] = [];
  if (a!.cox) {
    const [patterns, index, times, events] = a!.cox;
    for (let i = 0; i < index.length; i += 1) coxRows.push({ time: times[i]!, event: events[i]!, x: patterns![index[i]!]! });
  }
  const survival = survivalFigures(q, figures.includes('survival') ? groups : []);
  survival.eventLabel = survival.eventLabel.replace('the noticeable threshold', String(threshold));
  const has = (f: CohortFigure) => figures.includes(f);
  return {
    query: q,
    figures,
    total: a!.total,
    groups: groups.map((g) => ({ key: g.key, label: g.label, values: g.values, size: g.size, withRate: g.withRate, withSurvival: g.withSurvival })),
    fading: has('fading') ? groups.map((g) => ({ key: g.key, deltaEPerYear: g.de, densityLossPerYear: g.dl })) : [],
    survival: has('survival') ? survival : { ...survival, groups: [], logRank: null },
    cox: has('cox') ? coxFigures(q, coxRows) : null,
    incidence: has('incidence') ? incidenceFigures(groups.map((g) => ({ key: g.key, seen: g.reports, counts: g.terms })), new Map(terms.map((t) => [t.code, t.label]))) : [],
    outcomesAsOf: a!.as_of !== null ? new Date(a!.as_of * 1000).toISOString() : null,
  };
}

type PrintsInput = z.infer<typeof cohortPrintsInputSchema>;

/** The prints behind a figure, in accession order, a page at a time. */
export async function cohortPrints(input: PrintsInput): Promise<{ data: z.infer<typeof cohortPrintSchema>[]; pagination: { page: number; pageSize: number; total: number } }> {
  if (input.which === 'at_risk' && input.time === undefined) throw validationFailed([{ path: 'time', code: 'custom', message: 'Give the time (years from the origin)' }]);
  if (input.which === 'term' && !input.term) throw validationFailed([{ path: 'term', code: 'custom', message: 'Choose the observation' }]);
  const { rows } = await loadCohort(input.query, { ordered: true });
  const seen = new Set<string>();
  const pick = rows.filter((r) => {
    if (input.groupKey !== undefined && r.key !== input.groupKey) return false;
    if (input.groupKey === undefined && seen.has(r.id)) return false;
    seen.add(r.id);
    switch (input.which) {
      case 'with_rate': return r.de_per_year !== null;
      case 'events': return r.event === true;
      case 'censored': return r.event === false;
      case 'at_risk': return r.time !== null && r.time >= input.time!;
      case 'term': return !!r.terms?.includes(input.term!);
      default: return true;
    }
  });
  const start = (input.page - 1) * input.pageSize;
  return {
    data: pick.slice(start, start + input.pageSize).map((r) => ({
      printId: r.id, accessionNumber: r.accession_number, title: r.title, group: r.key,
      deltaEPerYear: r.de_per_year, densityLossPerYear: r.density_loss_per_year, time: r.time, event: r.event,
    })),
    pagination: { page: input.page, pageSize: input.pageSize, total: pick.length },
  };
}

const TEXT_SQL: Record<string, string> = {
  paperSurface: `SELECT pa.surface AS value, count(*)::int AS count FROM prints p JOIN papers pa ON pa.id = p.paper_id WHERE pa.surface IS NOT NULL GROUP BY 1`,
  paperTint: `SELECT pa.base_tint AS value, count(*)::int AS count FROM prints p JOIN papers pa ON pa.id = p.paper_id WHERE pa.base_tint IS NOT NULL GROUP BY 1`,
  tonerSequence: `SELECT seq AS value, count(*)::int AS count FROM print_step_factors WHERE seq IS NOT NULL GROUP BY 1`,
  enclosureType: `SELECT et.name AS value, count(*)::int AS count FROM prints p JOIN enclosure_types et ON et.id = p.enclosure_id GROUP BY 1`,
  maker: `SELECT p.maker_name AS value, count(*)::int AS count FROM prints p WHERE p.maker_name IS NOT NULL GROUP BY 1`,
};

/** The values each text factor takes, most frequent first (at most 500 each). */
export async function factorValues(): Promise<Record<string, { value: string; count: number }[]>> {
  const out: Record<string, { value: string; count: number }[]> = {};
  for (const code of COHORT_FACTOR_CODES) {
    if (COHORT_FACTORS[code].kind !== 'text') continue;
    const sql = TEXT_SQL[code];
    if (!sql) continue;
    out[code] = await db().query<{ value: string; count: number }>(`${sql} ORDER BY count DESC, value LIMIT 500`, { type: QueryTypes.SELECT });
  }
  return out;
}
