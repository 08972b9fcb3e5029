import { COHORT_FACTORS, type CohortFactorCode } from '@toneledger/common/fields/cohort';
import { COHORT_FIGURES, type CohortFigure, type CohortQuery } from '@toneledger/common/schemas/research';
import { cohortBase, type CohortSql } from './cohort-sql';

/**
 * The figures' statement: the cohort grouped in SQL, so a few thousand rows leave the database instead
 * of one per print. It answers one row of JSON:
 *
 * - `groups`: per group (its codes k0, k1) the size, prints with a rate, with survival, with a signed
 *   report, and each fading rate's n, min, max and quartiles by `percentile_cont` (linear interpolation
 *   at (n − 1)·p, R's type 7, the rule of `describe`; checked in `cohort-aggregate.test.ts`);
 * - `points`: per group and rate at most `pointsCap` prints, evenly spaced by rank (`pickEvenly`,
 *   `pointRows`), so a strip plot of 200,000 prints keeps its shape; every print when the cap is null (the export);
 * - `survival`: per group its (time, event, count) rows, as columns in no set order (the statistics
 *   sort them; asking PostgreSQL for the order cost three sorts more), for the Kaplan–Meier curves and the log-rank test;
 * - `terms`: per group and term the prints with a signed report showing it;
 * - `cox`: the Cox values' distinct patterns, and per print (as columns) its pattern, time and event;
 * - `total` (prints, summed over the groups), `asOf` (the oldest `computed_at`) and the medians of number factors split at the median.
 *
 * A group's code comes from the raw value the same way `makeGrouping` labels it: bands by
 * `width_bucket` over the cut points, the median split against `percentile_cont(0.5)` of the cohort's
 * rows, the date made by decade, a place by the name of the child of the filtered place it lies under.
 */

/** Keeps a row of rank `rn` (1-based) of `n` when it is one of `cap` ranks evenly spaced from the first to the last. */
export const pickEvenly = (rn: string, n: string, cap: string) =>
  `(${n} <= ${cap} OR (${rn} - 1) = round(round((${rn} - 1) * (${cap} - 1)::numeric / (${n} - 1)) * (${n} - 1) / (${cap} - 1)::numeric))`;

/**
 * The quartiles of each group's rate from its sorted values (`s`: the array `vs` of the group's
 * values in ascending order, one row per group and rate), as `percentile_cont(ARRAY[0.25, 0.5, 0.75])`
 * computes them, without a sort of its own: for each p, h = p·(n − 1) in float8, the values at ranks
 * 1 + floor(h) and 1 + ceil(h), and lo + (h − floor(h))·(hi − lo) (PostgreSQL's float8 interpolation,
 * operation for operation), or lo when h is whole; R's type 7, the rule of `describe`.
 * `cohort-aggregate.test.ts` checks it equals `percentile_cont` exactly. `d`: n, min, max and the quartiles.
 */
export const QUARTILES = `SELECT k0, k1, metric, qs, json_build_array(cardinality(vs), vs[1], vs[cardinality(vs)], qs) AS d
    FROM (SELECT k0, k1, metric, vs, json_build_array(${[0.25, 0.5, 0.75].map((p) => {
  const h = `${p}::float8 * (cardinality(vs) - 1)::float8`;
  const lo = `vs[(1 + floor(${h}))::int]`;
  const hi = `vs[(1 + ceil(${h}))::int]`;
  return `CASE WHEN ceil(${h}) > floor(${h}) THEN ${lo} + ((${h} - floor(${h})) * (${hi} - ${lo})) ELSE ${lo} END`;
}).join(', ')}) AS qs
            FROM s) q`;

/**
 * The ranks `pickEvenly` keeps of `n` (the column `n` of the row), as rows `rn`, without testing
 * every rank: with the step d = (n − 1)/(cap − 1) > 1 (n > cap), rank r + 1 is kept exactly when
 * r = round(j·d) for a j in 0..cap − 1. Such an r is kept, since |r − j·d| ≤ ½ gives |r/d − j| ≤ ½/d < ½,
 * so round(r/d) = j and round(j·d) = r; and a kept r is one of them, with j = round(r/d). (The
 * margin ½ − ½/d is at least 1/(2·cap), far above the rounding of `numeric`.) Every rank when `cap`
 * is NULL (the export) or n ≤ cap. `cohort-aggregate.test.ts` compares it with `pickEvenly` over every rank.
 */
export const keptRanks = (cap: string) => `SELECT rn FROM generate_series(1, CASE WHEN ${cap}::int IS NULL OR n <= ${cap}::int THEN n ELSE 0 END) AS rn
    UNION ALL
    SELECT (1 + round(j * (n - 1)::numeric / (${cap}::int - 1)))::int AS rn FROM generate_series(0, CASE WHEN n > ${cap}::int THEN ${cap}::int - 1 ELSE -1 END) AS j`;

/**
 * The strip-plot points of each group and rate, as a CTE `pt` (kept rank `rn`, value `v`, print
 * `id`) over `s`: per group and metric the sorted values `vs` and, unsorted, the values `vs0` with
 * their prints `ids0`. The print at each rank `keptRanks` keeps when a group's prints are ordered by
 * value, then id, without sorting the ids: a rank's value is read from the sorted array, and `j` is the
 * rank's place among the prints holding that value (1 unless the value is tied: the rank less the
 * first rank holding the value, plus one); the prints holding a kept value are picked from the
 * unsorted pairs by a hashed semi-join and numbered by id.
 * `cohort-aggregate.test.ts` compares it with `array_agg(id ORDER BY value, id)` read at the ranks.
 */
export const pointRows = (cap: string) => `sn AS MATERIALIZED (SELECT s.*, cardinality(s.vs) AS n FROM s),
pk AS MATERIALIZED (SELECT s.k0, s.k1, s.metric, kr.rn, s.vs[kr.rn] AS v,
         kr.rn - CASE WHEN kr.rn = 1 OR s.vs[kr.rn - 1] <> s.vs[kr.rn] THEN kr.rn ELSE array_position(s.vs, s.vs[kr.rn]) END + 1 AS j
    FROM sn s CROSS JOIN LATERAL (${keptRanks(cap)}) kr),
pid AS (SELECT s.k0, s.k1, s.metric, u.v, u.id, row_number() OVER (PARTITION BY s.k0, s.k1, s.metric, u.v ORDER BY u.id) AS j
    FROM (SELECT sn.*, (SELECT array_agg(DISTINCT pk.v) FROM pk WHERE pk.metric = sn.metric AND pk.k0 IS NOT DISTINCT FROM sn.k0 AND pk.k1 IS NOT DISTINCT FROM sn.k1) AS kv FROM sn) s
    CROSS JOIN LATERAL (SELECT u.v, s.ids0[u.i] AS id FROM (SELECT unnest(s.vs0) AS v, generate_subscripts(s.vs0, 1) AS i) u
                          JOIN unnest(s.kv) AS kv(v) ON kv.v = u.v) u),
pt AS (SELECT pk.k0, pk.k1, pk.metric, pk.rn, pk.v, pid.id FROM pk
    JOIN pid ON pid.metric = pk.metric AND pid.v = pk.v AND pid.j = pk.j AND pid.k0 IS NOT DISTINCT FROM pk.k0 AND pid.k1 IS NOT DISTINCT FROM pk.k1)`;

/** A rate with no values: n 0, no min, max or quartiles. */
const NO_DIST = 'json_build_array(0, NULL, NULL, NULL)';

export interface AggregateOptions {
  /** Location id → the name of the place under the filter it lies in (`placeGroups`). */
  places: Map<string, string>;
  /** Points per group and rate; null for every print. */
  pointsCap: number | null;
  /** The figures to compute (all when left out); the statement leaves out what the others need. */
  figures?: readonly CohortFigure[];
}

export function buildAggregateSql(q: CohortQuery, threshold: number, options: AggregateOptions): CohortSql {
  const { head, c, values, bind } = cohortBase(q, threshold, { narrow: true });
  const want = new Set<CohortFigure>(options.figures ?? COHORT_FIGURES);
  const rates = want.has('fading');
  const needsMedian = q.groupBy.some((f) => COHORT_FACTORS[f].kind === 'number' && !q.bands?.[f]);
  // Without a median split the group codes need nothing but the row: the cohort carries them itself
  // (one materialised pass over the prints instead of two), reading the inner rows as c0.
  const code = (i: 0 | 1, factor: CohortFactorCode | undefined): string => {
    const g = `${needsMedian ? 'c' : 'c0'}.g${i}`;
    if (!factor) return 'NULL::text';
    const kind = COHORT_FACTORS[factor].kind;
    if (kind === 'number') {
      const cuts = q.bands?.[factor];
      if (cuts) return `width_bucket(${g}::float8, ${bind(cuts, 'float8[]')})::text`;
      return `CASE WHEN ${g} IS NULL OR m.g${i} IS NULL THEN NULL WHEN ${g}::float8 < m.g${i} THEN 'below' ELSE 'above' END`;
    }
    if (kind === 'year') return `(floor(${g}::float8 / 10) * 10)::int::text`;
    if (kind === 'place') {
      const ids = [...options.places.keys()];
      return `(${bind(ids.map((id) => options.places.get(id)), 'text[]')})[array_position(${bind(ids, 'uuid[]')}, ${g}::uuid)]`;
    }
    if (kind === 'flag') return `coalesce(${g}, 'unknown')`;
    return g;
  };
  const k0 = code(0, q.groupBy[0]);
  const k1 = code(1, q.groupBy[1]);
  const med = `m AS (SELECT ${q.groupBy.map((f, i) => (COHORT_FACTORS[f].kind === 'number' && !q.bands?.[f] ? `(SELECT percentile_cont(0.5) WITHIN GROUP (ORDER BY g${i}::float8) FROM c)` : 'NULL::float8') + ` AS g${i}`).concat(q.groupBy.length < 1 ? ['NULL::float8 AS g0'] : [], q.groupBy.length < 2 ? ['NULL::float8 AS g1'] : []).join(', ')})`;
  const cap = options.pointsCap === null || !rates ? 'NULL' : bind(options.pointsCap, 'int');
  // The Cox rows, one per print, in columns: the distinct covariate patterns once, then per print its
  // pattern's index, time and event (the five factors and the day made 181,688 patterns of 200,000
  // prints, so grouping by pattern saved nothing and its rows of JSON cost more than the rest). Sent
  // in the order `coxPH` sorts them (latest time first), so its sort finds one run.
  const coxRows = `SELECT x, time, event FROM c WHERE time IS NOT NULL${q.groupBy.includes('tonerClass') ? ' AND first' : ''}`;
  const cox = q.coxFactors.length && want.has('cox')
    ? `(WITH cr AS MATERIALIZED (${coxRows}),
             pat AS MATERIALIZED (SELECT x, (row_number() OVER ())::int - 1 AS i FROM (SELECT DISTINCT x FROM cr) d)
        SELECT json_build_array((SELECT json_agg(x ORDER BY i) FROM pat), ${['pat.i', 'cr.time', 'cr.event'].map((col) => `array_agg(${col} ORDER BY cr.time DESC, pat.i, cr.event)`).join(', ')})
          FROM cr JOIN pat ON pat.x = cr.x)`
    : 'NULL::json';
  // One pass over the rows per group (`a`): the counts, and each rate's values with their prints as
  // arrays in no order; then each rate's values sorted as plain numbers (`unnest` … `ORDER BY`: a
  // sort of float8 datums, with no group codes to compare; `s`) for the quartiles (`QUARTILES`) and
  // the strip-plot points (`pointRows`).
  // A rate's n, min, max and quartiles come from its sorted array (`qs`); a group with no value of it has none.
  const dist = (metric: string) => `coalesce((SELECT q.d FROM qs q WHERE q.metric = '${metric}' AND q.k0 IS NOT DISTINCT FROM a.k0 AND q.k1 IS NOT DISTINCT FROM a.k1),
                   ${NO_DIST})`;
  // The group codes in the "C" collation: grouping and sorting by them compares bytes (equality is the same).
  const text = `${head}c AS MATERIALIZED (${needsMedian ? c : `SELECT c0.*, (${k0}) COLLATE "C" AS k0, (${k1}) COLLATE "C" AS k1 FROM (${c}) c0`}),
${med},
k AS ${needsMedian ? `MATERIALIZED (SELECT c.*, (${k0}) COLLATE "C" AS k0, (${k1}) COLLATE "C" AS k1 FROM c CROSS JOIN m)` : 'NOT MATERIALIZED (SELECT * FROM c)'},
a AS MATERIALIZED (SELECT k0, k1, count(*)::int AS size, count(de_per_year)::int AS with_rate, count(time)::int AS with_survival,
             (count(*) FILTER (WHERE has_report))::int AS reports, count(*) FILTER (WHERE first) AS prints, min(computed_at) AS as_of${rates ? `,
             ${[['de', 'de_per_year'], ['dl', 'density_loss_per_year']].map(([m, col]) => `array_agg(${col}) FILTER (WHERE ${col} IS NOT NULL) AS ${m}_v, array_agg(id) FILTER (WHERE ${col} IS NOT NULL) AS ${m}_i`).join(',\n             ')}` : ''}
        FROM k GROUP BY k0, k1),
${rates ? `s AS MATERIALIZED (SELECT a.k0, a.k1, r.metric, r.vs0, r.ids0, (SELECT array_agg(v ORDER BY v) FROM (SELECT unnest(r.vs0) AS v) u) AS vs
        FROM a CROSS JOIN LATERAL (VALUES ('de'::text, a.de_v, a.de_i), ('dl'::text, a.dl_v, a.dl_i)) AS r(metric, vs0, ids0) WHERE r.vs0 IS NOT NULL),
qs AS MATERIALIZED (${QUARTILES}),
${pointRows(cap)},` : ''}
g AS (SELECT a.k0, a.k1, a.size, a.with_rate, a.with_survival, a.reports, a.prints, a.as_of, ${rates ? `${dist('de')} AS de, ${dist('dl')} AS dl` : `${NO_DIST} AS de, ${NO_DIST} AS dl`} FROM a)
SELECT (SELECT coalesce(sum(prints), 0) FROM g)::int AS total,
       (SELECT min(as_of) FROM g) AS as_of,
       (SELECT json_build_array(g0, g1) FROM m) AS medians,
       (SELECT json_agg(json_build_array(k0, k1, size, with_rate, with_survival, reports, de, dl)) FROM g) AS groups,
       ${rates ? `(SELECT json_agg(json_build_array(k0, k1, metric, id, (SELECT pc.accession_number FROM print_cohort pc WHERE pc.print_id = pt.id), v) ORDER BY metric, k0, k1, rn)
          FROM pt)` : 'NULL::json'} AS points,
       ${want.has('survival') ? `(SELECT json_agg(json_build_array(k0, k1, times, events, ns)) FROM (
          SELECT k0, k1, array_agg(time) AS times, array_agg(event) AS events, array_agg(n) AS ns FROM (
            SELECT k0, k1, time, event, count(*)::int AS n FROM k WHERE time IS NOT NULL GROUP BY k0, k1, time, event) s GROUP BY k0, k1) s)` : 'NULL::json'} AS survival,
       ${want.has('incidence') ? `(SELECT json_agg(json_build_array(k0, k1, term, n)) FROM (
          SELECT k0, k1, term, count(*)::int AS n FROM (SELECT k0, k1, unnest(terms) AS term FROM k WHERE has_report) u GROUP BY k0, k1, term) t)` : 'NULL::json'} AS terms,
       ${cox} AS cox`;
  return { text, values };
}

type Num = number | null;
/** One group's row of the answer: codes, size, with rate, with survival, with a report, and [n, min, max, [q1, median, q3]] per rate. */
export type AggregateGroup = [string | null, string | null, number, number, number, number, [number, Num, Num, Num[] | null], [number, Num, Num, Num[] | null]];
export interface AggregateAnswer {
  total: number;
  as_of: number | null;
  medians: [Num, Num] | null;
  groups: AggregateGroup[] | null;
  points: [string | null, string | null, 'de' | 'dl', string, string, number][] | null;
  /** Per group, its (time, event, count) rows as three columns. */
  survival: [string | null, string | null, number[], boolean[], number[]][] | null;
  terms: [string | null, string | null, string, number][] | null;
  /** The Cox rows: the covariate patterns, then per print its pattern's index, time and event. */
  cox: [(string | null)[][] | null, number[], number[], boolean[]] | null;
}
