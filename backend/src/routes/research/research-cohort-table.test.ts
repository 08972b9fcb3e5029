import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { testApp } from '../../../test/app';
import { createEnclosure, createLocation, createPaper } from '../../../test/factories';
import { db } from '../../db';
import { recomputeOutcomes } from '../../services/print-outcomes';
import { researchClient, settleOutcomes } from './research-helpers';

// The cohort statement reads `print_cohort` alone (migration 20261203190000): every factor already
// derived and the outcomes, kept by triggers on each table a factor comes from. Here the table is
// compared, after inserts, updates and deletes of each source, with the general derivation written
// out from the source tables: the expressions the cohort statement ran before the table existed.
const t = testApp();
const { signInAll, newPrint, addStep, signedReport, newSpot, session } = researchClient(t);
const base = `2097.${Date.now() % 100000}`;
const ids: string[] = [];
let room: string;

const COLUMNS = `accession_number, process, support, paper_base, paper_surface, paper_tint, toner_classes, toner_class, toned, toner_sequence,
  toning_min, toning_extent, wash_min, hypo_clearing, alkaline_after_bath, enclosure_type, enclosure_buffered, location_id, light_band,
  date_earliest::text, date_latest::text, date_made, maker, ferricyanide_gl, acid_gl, climate_permanence, de_per_year, density_loss_per_year,
  first_exam_on::text, last_report_on::text, last_measured_on::text, noticeable_on::text, noticeable_threshold, good_on::text, fair_on::text,
  poor_on::text, unacceptable_on::text, terms, has_outcomes, computed_at::text`;

/** The general derivation: the cohort statement's former expressions over prints, papers, enclosures, steps, display periods and outcomes. */
const GENERAL = `SELECT p.id AS print_id, p.accession_number, p.process, p.support, pa.base AS paper_base, pa.surface AS paper_surface, pa.base_tint AS paper_tint,
       p.toner_classes, p.toner_classes[1] AS toner_class,
       CASE WHEN st.toned THEN 'yes' WHEN st.n > 0 THEN 'no' ELSE 'unknown' END AS toned,
       st.seq AS toner_sequence, st.toning_min, st.extent AS toning_extent, st.wash_min,
       CASE WHEN st.hypo THEN 'yes' WHEN st.n > 0 THEN 'no' ELSE 'unknown' END AS hypo_clearing,
       CASE WHEN st.alk_yes THEN 'yes' WHEN st.n > 0 AND NOT st.alk_unknown THEN 'no' ELSE 'unknown' END AS alkaline_after_bath,
       et.name AS enclosure_type, CASE WHEN et.alkaline_buffered THEN 'yes' WHEN et.alkaline_buffered = false THEN 'no' ELSE 'unknown' END AS enclosure_buffered,
       p.location_id,
       CASE WHEN p.over_light_budget THEN 'over' WHEN EXISTS (SELECT 1 FROM display_periods d WHERE d.print_id = p.id) THEN 'within' ELSE 'none' END AS light_band,
       p.date_earliest, p.date_latest, extract(year FROM p.date_earliest)::float8 AS date_made, p.maker_name AS maker,
       o.ferricyanide_gl, o.acid_gl, o.climate_permanence, o.de_per_year, o.density_loss_per_year, o.first_exam_on, o.last_report_on,
       o.last_measured_on, o.noticeable_on, o.noticeable_threshold, o.good_on, o.fair_on, o.poor_on, o.unacceptable_on,
       coalesce(o.terms, CASE WHEN o.term_first <> '{}'::jsonb THEN ARRAY(SELECT jsonb_object_keys(o.term_first)) END) AS terms,
       o.print_id IS NOT NULL AS has_outcomes, o.computed_at
  FROM prints p
  LEFT JOIN papers pa ON pa.id = p.paper_id
  LEFT JOIN enclosure_types et ON et.id = p.enclosure_id
  LEFT JOIN (SELECT s.print_id, count(*) AS n, coalesce(bool_or(s.type = 'toning'), false) AS toned,
                    string_agg(s.toner_class, ' → ' ORDER BY s.position) FILTER (WHERE s.type = 'toning') AS seq,
                    (sum(s.time_seconds) FILTER (WHERE s.type = 'toning') / 60.0)::float8 AS toning_min,
                    (array_agg(s.extent ORDER BY s.position) FILTER (WHERE s.type = 'toning'))[1] AS extent,
                    (sum(s.time_seconds) FILTER (WHERE s.type IN ('washing','final_wash')) / 60.0)::float8 AS wash_min,
                    coalesce(bool_or(s.type = 'hypo_clearing'), false) AS hypo,
                    coalesce(bool_or(s.alkaline) FILTER (WHERE s.type = 'after_bath'), false) AS alk_yes,
                    coalesce(bool_or(s.alkaline IS NULL) FILTER (WHERE s.type = 'after_bath'), false) AS alk_unknown
               FROM process_steps s GROUP BY s.print_id) st ON st.print_id = p.id
  LEFT JOIN print_outcomes o ON o.print_id = p.id`;

type Row = Record<string, unknown> & { print_id: string };
const stored = () => db().query<Row>(`SELECT print_id, ${COLUMNS} FROM print_cohort WHERE print_id = ANY ($1::uuid[]) ORDER BY print_id`, { bind: [ids], type: QueryTypes.SELECT });
/** Both read in one statement (one snapshot): the schedule's worker may write outcomes meanwhile. */
async function expectCurrent(n: number) {
  const [{ s, g }] = await db().query<{ s: Row[] | null; g: Row[] | null }>(
    `SELECT (SELECT json_agg(x ORDER BY print_id) FROM (SELECT print_id, ${COLUMNS} FROM print_cohort WHERE print_id = ANY ($1::uuid[])) x) AS s,
            (SELECT json_agg(x ORDER BY print_id) FROM (SELECT print_id, ${COLUMNS} FROM (${GENERAL}) g WHERE print_id = ANY ($1::uuid[])) x) AS g`,
    { bind: [ids], type: QueryTypes.SELECT });
  expect(g ?? []).toHaveLength(n);
  expect(s ?? []).toEqual(g ?? []);
}
const row = async (id: string) => (await stored()).find((r) => r.print_id === id)!;

beforeAll(async () => {
  await signInAll();
  room = (await createLocation(`Cohort table room ${base}`)).id;
  for (let i = 1; i <= 3; i += 1) {
    const p = await newPrint(`${base}.${i}`, room);
    ids.push(p.id);
  }
  await addStep(ids[0]!, 1, 'development');
  await addStep(ids[0]!, 2, 'toning', { tonerClass: 'selenium', timeSeconds: 180 });
  await addStep(ids[0]!, 3, 'after_bath', { alkaline: true });
  await addStep(ids[1]!, 1, 'washing', { timeSeconds: 1200 });
  await signedReport(ids[0]!, '2012-03-01', 'good');
  await signedReport(ids[0]!, '2016-03-01', 'fair', ['fading']);
  const spot = await newSpot(ids[0]!, 'Shadow', 'dmax');
  for (const [i, on] of ['2012-03-01', '2014-03-01', '2016-03-01'].entries()) {
    await session(ids[0]!, on, [{ spotId: spot.id, lab: { L: 20 + i, a: 0.5, b: -1 - i }, density: 2 - i / 10 }]);
  }
  await settleOutcomes(ids);
}, 120_000);
afterAll(() => t.close());

describe('print_cohort', () => {
  it('holds what the general derivation gives for new prints, their steps, reports and outcomes', async () => {
    await expectCurrent(3);
    const first = await row(ids[0]!);
    // The values themselves, not only their agreement: the steps above and the reports signed above.
    expect(first).toMatchObject({ toned: 'yes', toner_sequence: 'selenium', toning_min: 3, alkaline_after_bath: 'yes', hypo_clearing: 'no', has_outcomes: true, last_report_on: '2016-03-01' });
    expect(await row(ids[2]!)).toMatchObject({ toned: 'unknown', hypo_clearing: 'unknown', light_band: 'none' });
  });

  it('follows updates of the print, its paper and its enclosure type', async () => {
    const paper = await createPaper({ surface: 'matt' });
    const folder = await createEnclosure({ alkalineBuffered: null });
    await db().query(`UPDATE prints SET paper_id = $2, enclosure_id = $3, toner_classes = ARRAY['gold', 'selenium'], date_earliest = '1931-01-01', date_latest = '1935-12-31',
                      maker_name = 'Tidewater Studio', support = 'resin_coated' WHERE id = $1`, { bind: [ids[1], paper.id, folder.id] });
    await expectCurrent(3);
    expect(await row(ids[1]!)).toMatchObject({ paper_surface: 'matt', enclosure_buffered: 'unknown', toner_class: 'gold', date_made: 1931, maker: 'Tidewater Studio' });
    await db().query(`UPDATE papers SET surface = 'semi-matt', base_tint = 'warm' WHERE id = $1`, { bind: [paper.id] });
    await db().query('UPDATE enclosure_types SET alkaline_buffered = true, name = $2 WHERE id = $1', { bind: [folder.id, `Buffered folder ${base}`] });
    await expectCurrent(3);
    expect(await row(ids[1]!)).toMatchObject({ paper_surface: 'semi-matt', paper_tint: 'warm', enclosure_buffered: 'yes', enclosure_type: `Buffered folder ${base}` });
    // An update that changes no factor's column leaves the row as it is.
    await db().query(`UPDATE prints SET title = title || ' (retitled)' WHERE id = $1`, { bind: [ids[1]] });
    await expectCurrent(3);
  });

  it('follows the display periods (the light band) and the budget flag', async () => {
    const [{ id: show }] = await db().query<{ id: string }>(`INSERT INTO exhibitions (title) VALUES ($1) RETURNING id`, { bind: [`Tideline ${base}`], type: QueryTypes.SELECT });
    // Every exhibition has a venue with its dates (other tests list the exhibitions through the contract).
    await db().query(`INSERT INTO exhibition_venues (exhibition_id, name, opens_on, closes_on, position) VALUES ($1, 'Tideline rooms', '2019-04-01', '2019-06-30', 0)`, { bind: [show] });
    await db().query('INSERT INTO exhibition_objects (exhibition_id, print_id) VALUES ($1, $2)', { bind: [show, ids[2]] });
    await db().query(`INSERT INTO display_periods (print_id, exhibition_id, starts_on, ends_on, lux, hours_per_day) VALUES ($1, $2, '2019-04-01', '2019-06-30', 50, 8)`, { bind: [ids[2], show] });
    await expectCurrent(3);
    expect((await row(ids[2]!)).light_band).toBe('within');
    await db().query('UPDATE prints SET over_light_budget = true WHERE id = $1', { bind: [ids[2]] });
    expect((await row(ids[2]!)).light_band).toBe('over');
    await db().query('UPDATE prints SET over_light_budget = false WHERE id = $1', { bind: [ids[2]] });
    await db().query('DELETE FROM display_periods WHERE print_id = $1', { bind: [ids[2]] });
    await expectCurrent(3);
    expect((await row(ids[2]!)).light_band).toBe('none');
  });

  it('follows inserts, updates and deletes of the steps and of the outcomes, in the same transaction', async () => {
    await db().transaction(async (tx) => {
      await db().query(`INSERT INTO process_steps (print_id, position, type, toner_class, time_seconds, extent) VALUES ($1, 1, 'toning', 'iron_blue', 240, 'full'), ($1, 2, 'hypo_clearing', NULL, 120, NULL)`, { bind: [ids[2]], transaction: tx });
      const [r] = await db().query<{ toned: string; hypo_clearing: string }>('SELECT toned, hypo_clearing FROM print_cohort WHERE print_id = $1', { bind: [ids[2]], type: QueryTypes.SELECT, transaction: tx });
      expect(r).toEqual({ toned: 'yes', hypo_clearing: 'yes' });
    });
    await db().query(`UPDATE process_steps SET alkaline = NULL WHERE print_id = $1 AND type = 'after_bath'`, { bind: [ids[0]] });
    await db().query(`UPDATE process_steps SET time_seconds = 600 WHERE print_id = $1 AND type = 'toning'`, { bind: [ids[2]] });
    await expectCurrent(3);
    expect(await row(ids[0]!)).toMatchObject({ alkaline_after_bath: 'unknown' });
    expect(await row(ids[2]!)).toMatchObject({ toning_min: 10, toning_extent: 'full' });
    await db().query('DELETE FROM process_steps WHERE print_id = $1', { bind: [ids[1]] });
    await expectCurrent(3);
    expect(await row(ids[1]!)).toMatchObject({ toned: 'unknown', wash_min: null });

    // Outcomes: a changed row, a deleted one, one written again by the outcomes' own code.
    await db().query(`UPDATE print_outcomes SET terms = NULL, noticeable_threshold = NULL, climate_permanence = 0.8 WHERE print_id = $1`, { bind: [ids[0]] });
    await expectCurrent(3);
    expect(await row(ids[0]!)).toMatchObject({ terms: ['fading'], climate_permanence: 0.8, noticeable_threshold: null });
    await db().query('DELETE FROM print_outcomes WHERE print_id = $1', { bind: [ids[0]] });
    await expectCurrent(3);
    expect(await row(ids[0]!)).toMatchObject({ has_outcomes: false, de_per_year: null, last_report_on: null });
    await db().transaction((tx) => recomputeOutcomes([ids[0]!], tx));
    await expectCurrent(3);
    expect(await row(ids[0]!)).toMatchObject({ has_outcomes: true, last_report_on: '2016-03-01' });
  });

  it('keeps both of two transactions changing different sources of one print at once', async () => {
    // The steps change in one transaction; the outcomes in another, whose trigger waits for the first's
    // lock on the row. Each source writes only its own columns, so neither overwrites the other's.
    const steps = await db().transaction();
    const outcomes = await db().transaction();
    try {
      await db().query(`UPDATE process_steps SET toner_class = 'gold' WHERE print_id = $1 AND type = 'toning'`, { bind: [ids[0]], transaction: steps });
      const waiting = db().query('UPDATE print_outcomes SET climate_permanence = 1.25 WHERE print_id = $1', { bind: [ids[0]], transaction: outcomes });
      await new Promise((r) => setTimeout(r, 300));
      await steps.commit();
      await waiting;
      await outcomes.commit();
    } catch (err) {
      await Promise.allSettled([steps.rollback(), outcomes.rollback()]);
      throw err;
    }
    await expectCurrent(3);
    expect(await row(ids[0]!)).toMatchObject({ toner_sequence: 'gold', climate_permanence: 1.25 });
  });

  it('loses the row of a deleted print', async () => {
    const gone = await newPrint(`${base}.9`, room);
    ids.push(gone.id);
    await addStep(gone.id, 1, 'toning', { tonerClass: 'sulfide' });
    await expectCurrent(4);
    await db().query('DELETE FROM prints WHERE id = $1', { bind: [gone.id] });
    await expectCurrent(3);
    const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM print_cohort WHERE print_id = $1', { bind: [gone.id], type: QueryTypes.SELECT });
    expect(n).toBe(0);
  });
});
