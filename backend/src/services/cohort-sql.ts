import { COHORT_FACTORS, type CohortFactorCode } from '@toneledger/common/fields/cohort';
import type { CohortQuery } from '@toneledger/common/schemas/research';

/**
 * The cohort statement: one parameterised SELECT per question, built from `COHORT_FACTORS`. Each
 * factor has one SQL expression here (never text from the request; every value of the query is a
 * bind parameter) and names the joins it needs, so a query over the catalogue alone joins nothing
 * else. The statement returns one row per print of the cohort (one per toner class when grouping by
 * `tonerClass`: a print toned twice belongs to both groups) with the raw values of the grouping and
 * Cox factors, its fading rates from `print_outcomes`, and its survival time and event for the
 * question's event and origin. Groups, bands and figures are assembled by `cohort.service.ts`.
 */

type Need = 'steps' | 'paper' | 'enclosure' | 'outcomes';
/** The aggregates over a print's process steps a factor reads (columns of `print_step_factors`). */
type StepColumn = 'n' | 'toned' | 'seq' | 'toning_min' | 'extent' | 'wash_min' | 'hypo' | 'alk_yes' | 'alk_unknown';
interface FactorSql { expr: string; needs: Need[]; steps?: StepColumn[] }

const flag = (yes: string, no: string) => `CASE WHEN ${yes} THEN 'yes' WHEN ${no} THEN 'no' ELSE 'unknown' END`;

/** The expression of each factor (text for choice/text/flag, float8 for number and year, uuid for place). */
export const FACTOR_SQL: Record<CohortFactorCode, FactorSql> = {
  process: { expr: 'p.process', needs: [] },
  support: { expr: 'p.support', needs: [] },
  paperBase: { expr: 'pa.base', needs: ['paper'] },
  paperSurface: { expr: 'pa.surface', needs: ['paper'] },
  paperTint: { expr: 'pa.base_tint', needs: ['paper'] },
  // A print toned with two classes has both; the Cox model and a single value take the first.
  tonerClass: { expr: 'p.toner_classes[1]', needs: [] },
  toned: { expr: flag('st.toned', 'st.n > 0'), needs: ['steps'], steps: ['n', 'toned'] },
  tonerSequence: { expr: 'st.seq', needs: ['steps'], steps: ['seq'] },
  ferricyanideGL: { expr: 'o.ferricyanide_gl', needs: ['outcomes'] },
  acidGL: { expr: 'o.acid_gl', needs: ['outcomes'] },
  toningMinutes: { expr: 'st.toning_min', needs: ['steps'], steps: ['toning_min'] },
  toningExtent: { expr: 'st.extent', needs: ['steps'], steps: ['extent'] },
  washingMinutes: { expr: 'st.wash_min', needs: ['steps'], steps: ['wash_min'] },
  hypoClearing: { expr: flag('st.hypo', 'st.n > 0'), needs: ['steps'], steps: ['n', 'hypo'] },
  alkalineAfterBath: { expr: flag('st.alk_yes', 'st.n > 0 AND NOT st.alk_unknown'), needs: ['steps'], steps: ['n', 'alk_yes', 'alk_unknown'] },
  enclosureType: { expr: 'et.name', needs: ['enclosure'] },
  enclosureBuffered: { expr: flag('et.alkaline_buffered', 'et.alkaline_buffered = false'), needs: ['enclosure'] },
  location: { expr: 'p.location_id', needs: [] },
  climatePermanence: { expr: 'o.climate_permanence', needs: ['outcomes'] },
  lightBand: { expr: `CASE WHEN p.over_light_budget THEN 'over' WHEN EXISTS (SELECT 1 FROM display_periods d WHERE d.print_id = p.id) THEN 'within' ELSE 'none' END`, needs: [] },
  dateMade: { expr: 'extract(year FROM p.date_earliest)::float8', needs: [] },
  maker: { expr: 'p.maker_name', needs: [] },
};

/**
 * The step aggregates come from `print_step_factors`, one row per print with steps, kept by triggers
 * on `process_steps` in the transaction that changes them (migration 20261203100000): a cohort query
 * never aggregates the steps. A print without steps has no row, so every step factor reads "unknown"
 * or null for it.
 */
const STEPS_JOIN = 'LEFT JOIN print_step_factors st ON st.print_id = p.id';

const JOINS: Record<Need, string> = {
  paper: 'LEFT JOIN papers pa ON pa.id = p.paper_id',
  enclosure: 'LEFT JOIN enclosure_types et ON et.id = p.enclosure_id',
  outcomes: 'LEFT JOIN print_outcomes o ON o.print_id = p.id',
  steps: STEPS_JOIN,
};

export const GRADE_COLUMN = { good: 'o.good_on', fair: 'o.fair_on', poor: 'o.poor_on', unacceptable: 'o.unacceptable_on' } as const;

export interface CohortRow {
  id: string;
  accession_number: string;
  accession_sort: string;
  title: string | null;
  /** Raw values of the group factors, g0 and g1 (text, number or a location id). */
  g0: string | number | null;
  g1: string | number | null;
  /** Raw values of the Cox factors, in the query's order. */
  x: (string | number | null)[] | null;
  de_per_year: number | null;
  density_loss_per_year: number | null;
  /** Years from the origin to the event or the last observation; null when the print does not count for survival. */
  time: number | null;
  event: boolean | null;
  terms: string[] | null;
  has_report: boolean;
  /** When the outcomes row was computed, in seconds since 1970 (a number parses faster than a timestamp). */
  computed_at: number | null;
  /** How many prints the row stands for: 1, or (aggregated) the prints of that group value carrying no figure. */
  weight: number;
  /** Of those, how many have a signed report (the denominator of incidence). */
  reports: number;
  /** Distinct prints of the cohort (aggregated statements only). */
  cohort_total: number;
}

export interface CohortSql { text: string; values: unknown[] }

/** The cohort as a CTE `c` (one row per print, or per toner class), with its bind values; `head` opens the WITH. */
export interface CohortBase { head: string; c: string; values: unknown[]; bind: (v: unknown, cast: string) => string }

/**
 * The cohort CTE for a query. `threshold` is the ΔE00 for the fading event (the query's or the
 * settings'). Further binds may be added through `bind` by the caller. `narrow` leaves out the accession number and title.
 */
export function cohortBase(q: CohortQuery, threshold: number, options: { narrow?: boolean } = {}): CohortBase {
  const values: unknown[] = [];
  const bind = (v: unknown, cast: string) => { values.push(v); return `$${values.length}::${cast}`; };
  const needs = new Set<Need>(['outcomes']);
  const used = [...q.filters.map((f) => f.factor), ...q.groupBy, ...q.coxFactors];
  for (const code of used) for (const n of FACTOR_SQL[code].needs) needs.add(n);

  const ctes: string[] = [];
  const where: string[] = [];
  for (const [i, f] of q.filters.entries()) {
    const kind = COHORT_FACTORS[f.factor].kind;
    const e = FACTOR_SQL[f.factor].expr;
    if (f.factor === 'tonerClass') where.push(`p.toner_classes && ${bind(f.values, 'text[]')}`);
    else if (kind === 'choice' || kind === 'text' || kind === 'flag') where.push(`${e} = ANY (${bind(f.values, 'text[]')})`);
    else if (kind === 'number') {
      if (f.min !== undefined) where.push(`${e} >= ${bind(f.min, 'float8')}`);
      if (f.max !== undefined) where.push(`${e} <= ${bind(f.max, 'float8')}`);
    } else if (kind === 'place') {
      ctes.push(`sub${i} AS (SELECT id FROM locations WHERE id = ${bind(f.locationId, 'uuid')} UNION ALL SELECT l.id FROM locations l JOIN sub${i} ON l.parent_id = sub${i}.id)`);
      where.push(`p.location_id IN (SELECT id FROM sub${i})`);
    } else if (kind === 'year') {
      where.push('p.date_earliest IS NOT NULL');
      if (f.fromYear !== undefined) where.push(`extract(year FROM coalesce(p.date_latest, p.date_earliest)) >= ${bind(f.fromYear, 'int')}`);
      if (f.toYear !== undefined) where.push(`extract(year FROM p.date_earliest) <= ${bind(f.toYear, 'int')}`);
    }
  }

  const tonerGroup = q.groupBy.includes('tonerClass');
  const groupExpr = (code: CohortFactorCode | undefined) => (!code ? 'NULL' : code === 'tonerClass' ? 'tc.v' : FACTOR_SQL[code].expr);

  const origin = q.origin === 'made' ? 'p.date_earliest' : 'o.first_exam_on';
  let eventOn: string;
  let censorOn: string;
  if (q.event.kind === 'fading') {
    // The stored day when the outcomes were computed with this very threshold; else the first fitted point reaching it.
    const t = bind(threshold, 'float8');
    eventOn = `CASE WHEN o.noticeable_threshold = ${t} THEN o.noticeable_on
                    WHEN cardinality(o.de_dates) > 0 THEN (SELECT min(u.d) FROM unnest(o.de_dates, o.de_values) AS u(d, v) WHERE u.v >= ${t}) END`;
    censorOn = 'o.last_measured_on';
  } else if (q.event.kind === 'observation') {
    eventOn = `(o.term_first ->> ${bind(q.event.term, 'text')})::date`;
    censorOn = 'o.last_report_on';
  } else {
    eventOn = GRADE_COLUMN[q.event.grade!];
    censorOn = 'o.last_report_on';
  }
  const cox = q.coxFactors.length ? `ARRAY[${q.coxFactors.map((c) => `(${FACTOR_SQL[c].expr})::text`).join(', ')}]` : 'NULL::text[]';

  const joins = (['paper', 'enclosure', 'outcomes', 'steps'] as Need[]).filter((n) => needs.has(n)).map((n) => JOINS[n]).join('\n');
  // Narrow: without the print's accession number and title (the figures read them for a few prints only).
  // Narrow: `first` marks one row per print (a print toned twice has a row per toner class), so counting prints needs no DISTINCT.
  const inner = `SELECT p.id, ${options.narrow ? `${tonerGroup ? 'tc.ord = 1' : 'true'} AS first,` : 'p.accession_number, p.accession_sort, p.title,'}
               (${groupExpr(q.groupBy[0])})::text AS g0, (${groupExpr(q.groupBy[1])})::text AS g1, ${cox} AS x,
               o.de_per_year, o.density_loss_per_year,
               ${origin} AS origin_on, coalesce(ev.on_, ${censorOn}) AS end_on, ev.on_ AS event_on,
               coalesce(o.terms, CASE WHEN o.term_first <> '{}'::jsonb THEN ARRAY(SELECT jsonb_object_keys(o.term_first)) END) AS terms,
               o.last_report_on IS NOT NULL AS has_report, extract(epoch FROM o.computed_at)::float8 AS computed_at
          FROM prints p
          ${joins}
          ${tonerGroup ? "CROSS JOIN LATERAL unnest(CASE WHEN cardinality(p.toner_classes) = 0 THEN ARRAY[NULL::text] ELSE p.toner_classes END) WITH ORDINALITY AS tc(v, ord)" : ''}
          LEFT JOIN LATERAL (SELECT ${eventOn} AS on_ OFFSET 0) ev ON true
         ${where.length ? `WHERE ${where.join('\n           AND ')}` : ''}`;
  const columns = `id, ${options.narrow ? 'first,' : 'accession_number, accession_sort, title,'} g0, g1, x, de_per_year, density_loss_per_year,
       CASE WHEN origin_on IS NOT NULL AND end_on > origin_on THEN ((end_on - origin_on) / 365.25)::float8 END AS time,
       CASE WHEN origin_on IS NOT NULL AND end_on > origin_on THEN event_on IS NOT NULL END AS event,
       terms, has_report, computed_at`;
  const head = ctes.length ? `WITH RECURSIVE ${ctes.join(', ')},\n` : 'WITH ';
  return { head, c: `SELECT ${columns} FROM (${inner}) i`, values, bind };
}

/** Every print of the cohort with its figures (the prints behind a figure, the export), in accession order when `ordered`. */
export function buildCohortSql(q: CohortQuery, threshold: number, options: { ordered?: boolean } = {}): CohortSql {
  const { head, c, values } = cohortBase(q, threshold);
  const text = `${head}c AS (${c})
SELECT c.*, 1 AS weight, has_report::int AS reports, 0 AS cohort_total FROM c${options.ordered ? ' ORDER BY accession_sort, id' : ''}`;
  return { text, values };
}
