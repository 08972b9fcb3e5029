import { QueryTypes, type Transaction } from 'sequelize';
import { chronological, densityOf, fittedPoints } from '@toneledger/common/domain/spot-analysis';
import { normaliseRecipe, type Recipe } from '@toneledger/common/domain/recipes';
import { db } from '../db';
import { analysePrintSpots, type AnalysedSpot, type SpotAnalyses } from './spot-histories';
import { placePermanence } from './schedule-inputs';

/**
 * Each print's outcomes for longevity research (`print_outcomes`), for a batch of prints in a few
 * set-based statements and one upsert. Called with the schedule's batches (`schedule-jobs.ts`): the
 * stale marks, the full recompute, and when the workers start (prints without a row are marked).
 *
 * - Fading: the maximum-density spot (purpose `dmax`; else the spot with the highest baseline
 *   density) analysed by `spot-analysis.ts` with the settings' noticeable threshold: the rates, the
 *   fitted points' dates and ΔE00 (so any other threshold is answered in SQL), and the first day the
 *   threshold was reached.
 * - Examinations: first and last of the measurement sessions and signed reports; the first signed
 *   report per observed term; the first signed report graded at or below each grade.
 * - Toner chemistry: ferricyanide and acid per litre of working toner (the recipe per litre through
 *   `recipes.ts`, divided by the step's dilution "1+9" or "1:9"), summed over the toning steps.
 * - The current store's relative permanence (`placePermanence`, as the schedule does).
 */

interface FadingOutcome {
  spotId: string; baselineOn: string; dePerYear: number | null; densityLossPerYear: number | null;
  dates: string[]; values: number[]; noticeableOn: string | null;
}

/**
 * Per print, the maximum-density spot's outcome from the batch's analyses (`spot-histories.ts`,
 * made with the settings' noticeable threshold). The spot is chosen before looking at any result:
 * purpose dmax first, then the highest baseline density (the chosen baseline session, else the first
 * session by date), ties by spot id.
 */
function fadingOutcomes(ids: readonly string[], spots: SpotAnalyses): Map<string, FadingOutcome> {
  const { byPrint, threshold } = spots;
  const out = new Map<string, FadingOutcome>();
  for (const printId of ids) {
    let chosen: { rank: [number, number, string]; spot: AnalysedSpot } | null = null;
    for (const spot of byPrint.get(printId) ?? []) {
      const ordered = [...spot.observations].sort(chronological);
      const base = ordered.find((o) => o.sessionId === spot.baselineSessionId) ?? ordered[0]!;
      const rank: [number, number, string] = [spot.purpose === 'dmax' ? 1 : 0, densityOf(base) ?? -1, spot.spotId];
      const seen = chosen?.rank;
      const better = !seen || rank[0] > seen[0] || (rank[0] === seen[0] && (rank[1] > seen[1] || (rank[1] === seen[1] && rank[2] < seen[2])));
      if (better) chosen = { rank, spot };
    }
    if (!chosen) continue;
    const a = chosen.spot.analysis;
    if (!a.baseline) continue;
    const fitted = fittedPoints(a);
    out.set(printId, {
      spotId: chosen.spot.spotId, baselineOn: a.baseline.measuredOn,
      dePerYear: a.rate?.ok ? a.rate.slopePerYear : null,
      densityLossPerYear: a.densityLossRate?.ok ? a.densityLossRate.slopePerYear : null,
      dates: fitted.map((p) => p.measuredOn), values: fitted.map((p) => p.dE00),
      noticeableOn: fitted.find((p) => p.dE00 >= threshold)?.measuredOn ?? null,
    });
  }
  return out;
}

/** "1+9", "1:9" → 10 (one part stock in ten of working bath); none → 1. Anything else: unknown. */
export function dilutionFactor(dilution: string | null): number | null {
  if (!dilution || !dilution.trim()) return 1;
  const m = /^\s*(\d+(?:[.,]\d+)?)\s*[+:]\s*(\d+(?:[.,]\d+)?)\s*$/.exec(dilution);
  if (!m) return null;
  const a = Number(m[1]!.replace(',', '.'));
  const b = Number(m[2]!.replace(',', '.'));
  return a > 0 ? (a + b) / a : null;
}

interface StepRow { print_id: string; dilution: string | null; name: string; volume_ml: number; ingredients: Recipe['ingredients'] }

/** Grams per litre of working toner of the chemicals matching `pattern`, summed over the print's toning steps; null without a recipe. */
function chemistry(steps: StepRow[], pattern: RegExp): number | null {
  let total: number | null = null;
  for (const s of steps) {
    const factor = dilutionFactor(s.dilution);
    if (factor === null) continue;
    let perLitre: ReturnType<typeof normaliseRecipe>;
    try { perLitre = normaliseRecipe({ name: s.name, volumeMl: s.volume_ml, ingredients: s.ingredients }); } catch { continue; }
    const grams = perLitre.filter((i) => pattern.test(i.chemical)).reduce((sum, i) => sum + (i.pureGramsPerLitre ?? 0), 0);
    total = (total ?? 0) + grams / factor;
  }
  return total;
}

interface ExamRow {
  id: string; location_id: string | null; first_exam_on: string | null; last_exam_on: string | null; last_report_on: string | null;
  term_first: Record<string, string> | null; good_on: string | null; fair_on: string | null; poor_on: string | null; unacceptable_on: string | null;
}

/**
 * Recomputes and stores the outcomes of these prints (one upsert). `spots`: the batch's spot
 * analyses when the caller has them already (the schedule's batches share them); else read here.
 */
export async function recomputeOutcomes(ids: readonly string[], t?: Transaction, spots?: SpotAnalyses): Promise<void> {
  if (!ids.length) return;
  const exams = await db().query<ExamRow>(
    `SELECT p.id, p.location_id,
            least(m.first_on, r.first_on)::text AS first_exam_on, greatest(m.last_on, r.last_on)::text AS last_exam_on, r.last_on::text AS last_report_on,
            tf.terms AS term_first, r.good_on::text AS good_on, r.fair_on::text AS fair_on, r.poor_on::text AS poor_on, r.unacceptable_on::text AS unacceptable_on
       FROM prints p
       LEFT JOIN LATERAL (SELECT min(s.measured_on) AS first_on, max(s.measured_on) AS last_on FROM measurement_sessions s WHERE s.print_id = p.id
         AND NOT EXISTS (SELECT 1 FROM measurement_session_voids v WHERE v.session_id = s.id)) m ON true
       LEFT JOIN LATERAL (
         SELECT min(c.examined_on) AS first_on, max(c.examined_on) AS last_on,
                min(c.examined_on) FILTER (WHERE c.grade IN ('good','fair','poor','unacceptable')) AS good_on,
                min(c.examined_on) FILTER (WHERE c.grade IN ('fair','poor','unacceptable')) AS fair_on,
                min(c.examined_on) FILTER (WHERE c.grade IN ('poor','unacceptable')) AS poor_on,
                min(c.examined_on) FILTER (WHERE c.grade = 'unacceptable') AS unacceptable_on
           FROM condition_reports c WHERE c.print_id = p.id AND c.status = 'signed') r ON true
       LEFT JOIN LATERAL (
         SELECT jsonb_object_agg(x.term_code, x.first_on) AS terms
           FROM (SELECT o.term_code, min(c.examined_on)::text AS first_on
                   FROM condition_reports c JOIN observations o ON o.report_id = c.id
                  WHERE c.print_id = p.id AND c.status = 'signed' GROUP BY o.term_code) x) tf ON true
      WHERE p.id = ANY ($1::uuid[])`,
    { bind: [ids], transaction: t, type: QueryTypes.SELECT },
  );
  const steps = await db().query<StepRow>(
    `SELECT s.print_id, s.dilution, b.name, b.volume_ml::float8 AS volume_ml, b.ingredients
       FROM process_steps s JOIN bath_recipes b ON b.id = s.recipe_id
      WHERE s.print_id = ANY ($1::uuid[]) AND s.type = 'toning'`,
    { bind: [ids], transaction: t, type: QueryTypes.SELECT },
  );
  const stepsOf = new Map<string, StepRow[]>();
  for (const s of steps) stepsOf.set(s.print_id, [...(stepsOf.get(s.print_id) ?? []), s]);
  const analyses = spots ?? await analysePrintSpots(ids, t);
  const fading = fadingOutcomes(ids, analyses);
  const today = new Date().toISOString().slice(0, 10);
  const places = [...new Set(exams.flatMap((e) => (e.location_id ? [e.location_id] : [])))];
  const permanence = await placePermanence(places, today, t);

  const rows = exams.map((e) => {
    const f = fading.get(e.id);
    const s = stepsOf.get(e.id) ?? [];
    return {
      print_id: e.id, spot_id: f?.spotId ?? null, baseline_on: f?.baselineOn ?? null,
      de_per_year: f?.dePerYear ?? null, density_loss_per_year: f?.densityLossPerYear ?? null,
      de_dates: f?.dates ?? [], de_values: f?.values ?? [], noticeable_on: f?.noticeableOn ?? null,
      first_exam_on: e.first_exam_on, last_exam_on: e.last_exam_on, last_report_on: e.last_report_on, last_measured_on: f?.dates.at(-1) ?? null,
      term_first: e.term_first ?? {}, good_on: e.good_on, fair_on: e.fair_on, poor_on: e.poor_on, unacceptable_on: e.unacceptable_on,
      ferricyanide_gl: chemistry(s, /ferricyanide/i), acid_gl: chemistry(s, /acid/i),
      climate_permanence: e.location_id ? permanence.get(e.location_id) ?? null : null,
    };
  });
  if (!rows.length) return;
  await db().query(
    `INSERT INTO print_outcomes (print_id, spot_id, baseline_on, de_per_year, density_loss_per_year, de_dates, de_values, noticeable_on, noticeable_threshold,
        first_exam_on, last_exam_on, last_report_on, last_measured_on, term_first, terms, good_on, fair_on, poor_on, unacceptable_on,
        ferricyanide_gl, acid_gl, climate_permanence, computed_at)
     SELECT (r->>'print_id')::uuid, (r->>'spot_id')::uuid, (r->>'baseline_on')::date, (r->>'de_per_year')::float8, (r->>'density_loss_per_year')::float8,
            ARRAY(SELECT jsonb_array_elements_text(r->'de_dates'))::date[], ARRAY(SELECT jsonb_array_elements_text(r->'de_values'))::float8[],
            (r->>'noticeable_on')::date, $2::float8,
            (r->>'first_exam_on')::date, (r->>'last_exam_on')::date, (r->>'last_report_on')::date, (r->>'last_measured_on')::date,
            r->'term_first', CASE WHEN r->'term_first' <> '{}'::jsonb THEN ARRAY(SELECT jsonb_object_keys(r->'term_first')) END,
            (r->>'good_on')::date, (r->>'fair_on')::date, (r->>'poor_on')::date, (r->>'unacceptable_on')::date,
            (r->>'ferricyanide_gl')::float8, (r->>'acid_gl')::float8, (r->>'climate_permanence')::float8, now()
       FROM jsonb_array_elements($1::jsonb) r
     ON CONFLICT (print_id) DO UPDATE SET spot_id = EXCLUDED.spot_id, baseline_on = EXCLUDED.baseline_on, de_per_year = EXCLUDED.de_per_year,
       density_loss_per_year = EXCLUDED.density_loss_per_year, de_dates = EXCLUDED.de_dates, de_values = EXCLUDED.de_values,
       noticeable_on = EXCLUDED.noticeable_on, noticeable_threshold = EXCLUDED.noticeable_threshold, terms = EXCLUDED.terms, first_exam_on = EXCLUDED.first_exam_on, last_exam_on = EXCLUDED.last_exam_on,
       last_report_on = EXCLUDED.last_report_on, last_measured_on = EXCLUDED.last_measured_on, term_first = EXCLUDED.term_first,
       good_on = EXCLUDED.good_on, fair_on = EXCLUDED.fair_on, poor_on = EXCLUDED.poor_on, unacceptable_on = EXCLUDED.unacceptable_on,
       ferricyanide_gl = EXCLUDED.ferricyanide_gl, acid_gl = EXCLUDED.acid_gl, climate_permanence = EXCLUDED.climate_permanence, computed_at = now()`,
    { bind: [JSON.stringify(rows), analyses.threshold], transaction: t },
  );
}
