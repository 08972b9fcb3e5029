import { QueryTypes, type Transaction } from 'sequelize';
import type { Grade } from '@toneledger/common/schemas/condition';
import type { ClimateSettings } from '@toneledger/common/schemas/climate';
import type { RiskInputs } from '@toneledger/common/domain/inspection-risk';
import { DEFAULT_CLIMATE_SETTINGS, timeWeightedPermanence } from '@toneledger/common/domain/isoperm';
import { db } from '../db';
import { Setting } from '../models';
import { analysePrintSpots, type SpotAnalyses } from './spot-histories';

/**
 * The risk model's inputs for a batch of prints, in a few set-based statements (never one query per
 * print): the print's own columns with its last two signed reports, next loan out and next display;
 * the store's climate over the last 365 days (the nearest place up the location tree with readings);
 * and the measured fading of its fastest-fading spot. Every statement takes the whole batch.
 */

interface PrintRow {
  id: string;
  recorded_on: string;
  process: string;
  toner_classes: string[];
  warning_codes: string[];
  over_light_budget: boolean;
  location_id: string | null;
  enclosure_name: string | null;
  grades: Grade[] | null;
  last_checked_on: string | null;
  next_check_on: string | null;
  loan_dispatch_on: string | null;
  loan_institution: string | null;
  display_starts_on: string | null;
  display_exhibition: string | null;
}

/** Loans out that will still leave: a check is due before dispatch (or the opening when no dispatch day is set). */
const LOAN_WAITING = `('proposed','approved','agreed')`;

async function printRows(ids: readonly string[], asOf: string, t?: Transaction): Promise<PrintRow[]> {
  return db().query<PrintRow>(
    `SELECT p.id, to_char(p.created_at AT TIME ZONE 'UTC', 'YYYY-MM-DD') AS recorded_on, p.process, p.toner_classes, p.warning_codes,
            p.over_light_budget, p.location_id, e.name AS enclosure_name,
            r.grades, r.last_checked_on, r.next_check_on,
            l.dispatch_on AS loan_dispatch_on, l.other_institution AS loan_institution,
            d.starts_on AS display_starts_on, d.title AS display_exhibition
       FROM prints p
       LEFT JOIN enclosure_types e ON e.id = p.enclosure_id
       LEFT JOIN LATERAL (
         SELECT array_agg(x.grade ORDER BY x.n) AS grades, (array_agg(x.examined_on ORDER BY x.n))[1]::text AS last_checked_on,
                (array_agg(x.next_check_on ORDER BY x.n))[1]::text AS next_check_on
           FROM (SELECT c.grade, c.examined_on, c.next_check_on, row_number() OVER (ORDER BY c.examined_on DESC, c.signed_at DESC) AS n
                   FROM condition_reports c WHERE c.print_id = p.id AND c.status = 'signed'
                  ORDER BY c.examined_on DESC, c.signed_at DESC LIMIT 2) x
       ) r ON true
       LEFT JOIN LATERAL (
         SELECT coalesce(lo.dispatch_on, lo.opens_on)::text AS dispatch_on, lo.other_institution
           FROM loan_objects o JOIN loans lo ON lo.id = o.loan_id
          WHERE o.print_id = p.id AND lo.direction = 'out' AND lo.status IN ${LOAN_WAITING} AND coalesce(lo.dispatch_on, lo.opens_on) >= $2::date
          ORDER BY coalesce(lo.dispatch_on, lo.opens_on) LIMIT 1
       ) l ON true
       LEFT JOIN LATERAL (
         SELECT dp.starts_on::text AS starts_on, ex.title
           FROM display_periods dp JOIN exhibitions ex ON ex.id = dp.exhibition_id
          WHERE dp.print_id = p.id AND dp.starts_on >= $2::date
          ORDER BY dp.starts_on LIMIT 1
       ) d ON true
      WHERE p.id = ANY ($1::uuid[])`,
    { bind: [ids, asOf], transaction: t, type: QueryTypes.SELECT },
  );
}

export async function getClimateSettings(t?: Transaction): Promise<ClimateSettings> {
  const row = await Setting.findByPk('climate', { transaction: t });
  return { ...DEFAULT_CLIMATE_SETTINGS, ...((row?.value as Partial<ClimateSettings> | undefined) ?? {}) };
}

/**
 * The relative permanence of each place's climate over the 365 days before `asOf`, time-weighted
 * (isoperm.ts), for the given places: each takes the nearest place up its tree that has readings
 * (a room's logger speaks for its cabinets and boxes). The readings are summed in SQL into
 * (minutes, °C to 0.1, %RH to 0.5) cells per place, each reading holding until the next one and
 * a step longer than the settings' gap counting as no record; the model then weighs the cells.
 */
export async function placePermanence(locationIds: readonly string[], asOf: string, t?: Transaction): Promise<Map<string, number>> {
  const out = new Map<string, number>();
  if (!locationIds.length) return out;
  const chain = await db().query<{ loc: string; anc: string; depth: number }>(
    `WITH RECURSIVE chain AS (
       SELECT l.id AS loc, l.id AS anc, 0 AS depth, l.parent_id FROM locations l WHERE l.id = ANY ($1::uuid[])
       UNION ALL
       SELECT c.loc, p.id, c.depth + 1, p.parent_id FROM chain c JOIN locations p ON p.id = c.parent_id WHERE c.depth < 20
     ) SELECT loc, anc, depth FROM chain`,
    { bind: [locationIds], transaction: t, type: QueryTypes.SELECT },
  );
  const ancestors = [...new Set(chain.map((c) => c.anc))];
  const settings = await getClimateSettings(t);
  const cells = await db().query<{ location_id: string; t: number; rh: number; minutes: number }>(
    `SELECT location_id, round(temperature_c::numeric, 1)::float8 AS t, (round(rh_percent::numeric * 2) / 2)::float8 AS rh, sum(minutes)::float8 AS minutes
       FROM (SELECT location_id, temperature_c, rh_percent,
                    extract(epoch FROM lead(taken_at) OVER (PARTITION BY location_id ORDER BY taken_at) - taken_at) / 60 AS minutes
               FROM climate_readings
              WHERE location_id = ANY ($1::uuid[]) AND taken_at >= $2::date - 365 AND taken_at < $2::date + 1) x
      WHERE minutes > 0 AND minutes <= $3
      GROUP BY 1, 2, 3`,
    { bind: [ancestors, asOf, settings.gapMinutes], transaction: t, type: QueryTypes.SELECT },
  );
  const byPlace = new Map<string, { minutes: number; temperatureC: number; rhPercent: number }[]>();
  for (const c of cells) {
    const list = byPlace.get(c.location_id) ?? [];
    list.push({ minutes: c.minutes, temperatureC: c.t, rhPercent: c.rh });
    byPlace.set(c.location_id, list);
  }
  const ownPermanence = new Map<string, number | null>();
  for (const [place, spans] of byPlace) ownPermanence.set(place, timeWeightedPermanence(spans, settings));
  const nearest = new Map<string, { depth: number; p: number }>();
  for (const c of chain) {
    const p = ownPermanence.get(c.anc);
    if (p == null) continue;
    const seen = nearest.get(c.loc);
    if (!seen || c.depth < seen.depth) nearest.set(c.loc, { depth: c.depth, p });
  }
  for (const [loc, v] of nearest) out.set(loc, v.p);
  return out;
}

/**
 * Each print's fastest-fading spot (spot-analysis.ts): its ΔE00 per year and when its trend is
 * noticeable. `spots`: the batch's analyses when the caller has them already (`schedule-jobs.ts`
 * shares them with the research outcomes); else they are read here.
 */
export async function printFading(ids: readonly string[], t?: Transaction, spots?: SpotAnalyses): Promise<Map<string, RiskInputs['fading']>> {
  const { byPrint } = spots ?? await analysePrintSpots(ids, t);
  const out = new Map<string, RiskInputs['fading']>();
  for (const id of ids) {
    for (const { analysis: a } of byPrint.get(id) ?? []) {
      if (!a.rate?.ok || !(a.rate.slopePerYear > 0)) continue;
      const p = a.projection;
      // A very slow rate projects past the last day a Date can hold (year 275760): never noticeable, for the model.
      const on = p?.reached === true && !p.alreadyReached && Number.isFinite(p.date.getTime()) ? p.date.toISOString().slice(0, 10) : null;
      const fading = {
        ratePerYear: a.rate.slopePerYear,
        alreadyNoticeable: p?.reached === true && p.alreadyReached,
        noticeableOn: on,
      };
      const seen = out.get(id);
      if (!seen || fading.ratePerYear > seen.ratePerYear) out.set(id, fading);
    }
  }
  return out;
}

/** The model's inputs for each print of the batch that exists, by id. */
export async function loadRiskInputs(ids: readonly string[], asOf: string, t?: Transaction, spots?: SpotAnalyses): Promise<Map<string, RiskInputs & { lastCheckedOn: string | null }>> {
  // One after the other: inside a transaction they share its one connection.
  const prints = await printRows(ids, asOf, t);
  const places = [...new Set(prints.flatMap((p) => (p.location_id ? [p.location_id] : [])))];
  const permanence = await placePermanence(places, asOf, t);
  const fading = await printFading(ids, t, spots);
  const out = new Map<string, RiskInputs>();
  for (const p of prints) {
    out.set(p.id, {
      asOf, recordedOn: p.recorded_on,
      grade: p.grades?.[0] ?? null, previousGrade: p.grades?.[1] ?? null,
      lastCheckedOn: p.last_checked_on, nextCheckOn: p.next_check_on,
      process: p.process, tonerClasses: p.toner_classes, warningCodes: p.warning_codes, enclosureName: p.enclosure_name,
      // The stored warning is what the print carries; the share of budget is not stored, so only "over" is known here.
      lightShareOfBudget: p.over_light_budget ? 1 : null,
      permanence: p.location_id ? permanence.get(p.location_id) ?? null : null,
      fading: fading.get(p.id) ?? null,
      nextLoan: p.loan_dispatch_on ? { dispatchOn: p.loan_dispatch_on, institution: p.loan_institution ?? 'another institution' } : null,
      nextDisplay: p.display_starts_on ? { startsOn: p.display_starts_on, exhibition: p.display_exhibition ?? 'an exhibition' } : null,
    });
  }
  return out;
}
