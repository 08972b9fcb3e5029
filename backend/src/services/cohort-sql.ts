import { COHORT_FACTORS, type CohortFactorCode } from '@toneledger/common/fields/cohort';
import type { CohortQuery } from '@toneledger/common/schemas/research';

/**
 * The cohort statement: one parameterised SELECT per question, built from `COHORT_FACTORS`. Each
 * factor has one SQL expression here (never text from the request; every value of the query is a
 * bind parameter), a column of the flat `print_cohort` table, which the statement reads alone (it
 * joins `print_outcomes` for a term's first day, and `prints` for the accession order and title of
 * the prints behind a figure). The statement returns one row per print of the cohort (one per toner
 * class when grouping by `tonerClass`: a print toned twice belongs to both groups) with the raw
 * values of the grouping and Cox factors, its fading rates, and its survival time and event for the
 * question's event and origin. Groups, bands and figures are assembled by `cohort.service.ts`.
 */

/** The source tables a statement joins beside `print_cohort`: the outcomes' arrays and terms, the print's title. */
type Need = 'outcomes' | 'print';
interface FactorSql { expr: string }

/**
 * The expression of each factor (text for choice/text/flag, float8 for number and year, uuid for
 * place): a column of `print_cohort` (migration 20261203190000), which holds every factor already
 * derived (flags as 'yes'/'no'/'unknown', the light band, the year made) and the outcomes a cohort
 * reads, kept by triggers on every table a factor comes from, in the transaction that changes it.
 */
export const FACTOR_SQL: Record<CohortFactorCode, FactorSql> = {
  process: { expr: 'p.process' },
  support: { expr: 'p.support' },
  paperBase: { expr: 'p.paper_base' },
  paperSurface: { expr: 'p.paper_surface' },
  paperTint: { expr: 'p.paper_tint' },
  // A print toned with two classes has both; the Cox model and a single value take the first.
  tonerClass: { expr: 'p.toner_class' },
  toned: { expr: 'p.toned' },
  tonerSequence: { expr: 'p.toner_sequence' },
  ferricyanideGL: { expr: 'p.ferricyanide_gl' },
  acidGL: { expr: 'p.acid_gl' },
  toningMinutes: { expr: 'p.toning_min' },
  toningExtent: { expr: 'p.toning_extent' },
  washingMinutes: { expr: 'p.wash_min' },
  hypoClearing: { expr: 'p.hypo_clearing' },
  alkalineAfterBath: { expr: 'p.alkaline_after_bath' },
  enclosureType: { expr: 'p.enclosure_type' },
  enclosureBuffered: { expr: 'p.enclosure_buffered' },
  location: { expr: 'p.location_id' },
  climatePermanence: { expr: 'p.climate_permanence' },
  lightBand: { expr: 'p.light_band' },
  dateMade: { expr: 'p.date_made' },
  maker: { expr: 'p.maker' },
};

const JOINS: Record<Need, string> = {
  outcomes: 'LEFT JOIN print_outcomes o ON o.print_id = p.print_id',
  print: 'JOIN prints pr ON pr.id = p.print_id',
};

export const GRADE_COLUMN = { good: 'p.good_on', fair: 'p.fair_on', poor: 'p.poor_on', unacceptable: 'p.unacceptable_on' } as const;

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
  const needs = new Set<Need>(options.narrow ? [] : ['print']);

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

  const origin = q.origin === 'made' ? 'p.date_earliest' : 'p.first_exam_on';
  let eventOn: string;
  let censorOn: string;
  if (q.event.kind === 'fading') {
    // The stored day when the outcomes were computed with this very threshold; else the first fitted
    // point reaching it, from the arrays in `print_outcomes` (read only for such a row).
    const t = bind(threshold, 'float8');
    eventOn = `CASE WHEN p.noticeable_threshold = ${t} THEN p.noticeable_on
                    WHEN p.has_outcomes THEN (SELECT min(u.d) FROM print_outcomes o CROSS JOIN LATERAL unnest(o.de_dates, o.de_values) AS u(d, v)
                                               WHERE o.print_id = p.print_id AND u.v >= ${t}) END`;
    censorOn = 'p.last_measured_on';
  } else if (q.event.kind === 'observation') {
    needs.add('outcomes');
    eventOn = `(o.term_first ->> ${bind(q.event.term, 'text')})::date`;
    censorOn = 'p.last_report_on';
  } else {
    eventOn = GRADE_COLUMN[q.event.grade!];
    censorOn = 'p.last_report_on';
  }
  const cox = q.coxFactors.length ? `ARRAY[${q.coxFactors.map((c) => `(${FACTOR_SQL[c].expr})::text`).join(', ')}]` : 'NULL::text[]';

  const joins = (['print', 'outcomes'] as Need[]).filter((n) => needs.has(n)).map((n) => JOINS[n]).join('\n');
  // The event's day is computed once per row: `OFFSET 0` keeps the subquery from being merged into the
  // outer one, which would repeat the expression (and its search of the fitted points) in each use.
  // Narrow: without the print's accession number and title (the figures read them for a few prints only).
  // Narrow: `first` marks one row per print (a print toned twice has a row per toner class), so counting prints needs no DISTINCT.
  // Grouped by toner class, a row per print and toner class (`tc`; an untoned print has one row with
  // no class): the first class of every print from its stored column, then the second and later
  // classes of the few prints toned more than once (unnesting every print's array cost more than the
  // rest of the cohort).
  const branch = (tc: string, more: string[]) => `SELECT p.print_id AS id, ${options.narrow ? `${tonerGroup ? 'tc.ord = 1' : 'true'} AS first,` : 'pr.accession_number, pr.accession_sort, pr.title,'}
               (${groupExpr(q.groupBy[0])})::text AS g0, (${groupExpr(q.groupBy[1])})::text AS g1, ${cox} AS x,
               p.de_per_year, p.density_loss_per_year,
               ${origin} AS origin_on, ${eventOn} AS event_on, ${censorOn} AS censor_on,
               p.terms, p.last_report_on IS NOT NULL AS has_report, date_part('epoch', p.computed_at) AS computed_at
          FROM print_cohort p ${tc}
          ${joins}
         ${where.length || more.length ? `WHERE ${[...more, ...where].join('\n           AND ')}` : ''}
         OFFSET 0`;
  const inner = !tonerGroup ? branch('', [])
    : `(${branch('CROSS JOIN LATERAL (SELECT p.toner_class AS v, 1 AS ord) tc', ['p.toner_classes IS NOT NULL'])})
       UNION ALL
       (${branch('CROSS JOIN LATERAL unnest(p.toner_classes) WITH ORDINALITY AS tc(v, ord)', ['cardinality(p.toner_classes) > 1', 'tc.ord > 1'])})`;
  const columns = `id, ${options.narrow ? 'first,' : 'accession_number, accession_sort, title,'} g0, g1, x, de_per_year, density_loss_per_year,
       CASE WHEN origin_on IS NOT NULL AND coalesce(event_on, censor_on) > origin_on THEN (coalesce(event_on, censor_on) - origin_on)::float8 / 365.25::float8 END AS time,
       CASE WHEN origin_on IS NOT NULL AND coalesce(event_on, censor_on) > origin_on THEN event_on IS NOT NULL END AS event,
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
