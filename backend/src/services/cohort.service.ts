import { QueryTypes } from 'sequelize';
import { COHORT_FACTORS, COHORT_FACTOR_CODES } from '@toneledger/common/fields/cohort';
import type { CohortQuery, CohortResult } from '@toneledger/common/schemas/research';
import type { cohortPrintSchema, cohortPrintsInputSchema } from '@toneledger/common/schemas/research';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import type { z } from 'zod';
import { db } from '../db';
import { validationFailed } from '../errors';
import { buildCohortSql, type CohortRow } from './cohort-sql';
import { coxFigures, fadingFigures, groupRows, incidenceFigures, makeGrouping, survivalFigures, type GroupedRow } from './cohort-figures';
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
export async function loadCohort(q: CohortQuery, options: { ordered?: boolean; aggregate?: boolean } = {}): Promise<Cohort> {
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

export async function runCohort(q: CohortQuery): Promise<CohortResult> {
  const { rows, groups, threshold } = await loadCohort(q, { aggregate: true });
  const terms = await db().query<{ code: string; label: string }>('SELECT code, label FROM condition_terms', { type: QueryTypes.SELECT });
  let asOf: number | null = null;
  for (const r of rows) if (r.computed_at !== null && (asOf === null || r.computed_at < asOf)) asOf = r.computed_at;
  const survival = survivalFigures(q, groups);
  survival.eventLabel = survival.eventLabel.replace('the noticeable threshold', String(threshold));
  return {
    query: q,
    total: rows[0]?.cohort_total ?? 0,
    groups: groups.map((g) => ({
      key: g.key, label: g.label, values: g.values, size: g.rows.reduce((n, r) => n + r.weight, 0),
      withRate: g.rows.filter((r) => r.de_per_year !== null).length,
      withSurvival: g.rows.filter((r) => r.time !== null).length,
    })),
    fading: fadingFigures(groups),
    survival,
    cox: coxFigures(q, rows),
    incidence: incidenceFigures(groups, new Map(terms.map((t) => [t.code, t.label]))),
    outcomesAsOf: asOf !== null ? new Date(asOf * 1000).toISOString() : null,
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
  tonerSequence: `SELECT seq AS value, count(*)::int AS count FROM (SELECT string_agg(toner_class, ' → ' ORDER BY position) AS seq FROM process_steps WHERE type = 'toning' GROUP BY print_id) x WHERE seq IS NOT NULL GROUP BY 1`,
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
