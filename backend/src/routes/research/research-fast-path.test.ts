import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { testApp } from '../../../test/app';
import { createLocation } from '../../../test/factories';
import { db } from '../../db';
import { getMeasurementSettings } from '../../services/measurement.service';
import { recomputeOutcomes } from '../../services/print-outcomes';
import { recomputePrints } from '../../services/schedule-jobs';
import { paths, researchClient, settleOutcomes } from './research-helpers';

// The cohort statement reads stored values where it can (migration 20261203100000): the day the
// settings' threshold was first reached, the terms' keys, the process-step factors. Each is checked
// here against the general path it replaces, on the same prints.
const t = testApp();
const { api, signInAll, newPrint, addStep, signedReport, newSpot, session } = researchClient(t);
const base = `2096.${Date.now() % 100000}`;
let place: string;
const ids: Record<string, string> = {};

const years = (from: string, to: string) => (Date.parse(to) - Date.parse(from)) / 86_400_000 / 365.25;
const START = '2010-01-01';
// Sharma, Wu & Dalal (2005), Table 1, pair 1: ΔE00 = 2.0425 (REFERENCES.md §1).
const SHARMA_1_BASE = { L: 50, a: 2.6772, b: -79.7751 };
const SHARMA_1_LATER = { L: 50, a: 0, b: -82.7485 };

beforeAll(async () => {
  await signInAll();
  const room = await createLocation(`Fast path room ${base}`);
  place = room.id;
  // f1: reaches Sharma pair 1 on 2012-06-01; f2: a smaller step first, pair 1 only on 2014-06-01; f3: barely changes.
  const series: Record<string, { L: number; a: number; b: number }[]> = {
    f1: [SHARMA_1_BASE, SHARMA_1_LATER, SHARMA_1_LATER],
    f2: [SHARMA_1_BASE, { L: 50, a: 1.8, b: -80.6 }, SHARMA_1_LATER],
    f3: [SHARMA_1_BASE, { L: 50, a: 2.6, b: -79.8 }, { L: 50, a: 2.55, b: -79.85 }],
  };
  let n = 0;
  for (const [key, labs] of Object.entries(series)) {
    const p = await newPrint(`${base}.${++n}`, room.id);
    ids[key] = p.id;
    await addStep(p.id, 1, 'development');
    await addStep(p.id, 2, 'toning', { tonerClass: n === 1 ? 'selenium' : 'iron_blue', timeSeconds: 120 * n });
    await addStep(p.id, 3, 'after_bath', { alkaline: n === 2 });
    await addStep(p.id, 4, 'washing', { timeSeconds: 600 });
    await signedReport(p.id, START, 'good');
    await signedReport(p.id, '2015-01-01', n === 3 ? 'good' : 'fair', n === 3 ? [] : ['fading', 'silver_mirroring']);
    const dmax = await newSpot(p.id, 'Shadow', 'dmax');
    for (const [i, lab] of labs.entries()) await session(p.id, ['2010-06-01', '2012-06-01', '2014-06-01'][i]!, [{ spotId: dmax.id, lab, density: 2 - i / 10 }]);
  }
  await settleOutcomes(Object.values(ids));
}, 120_000);
afterAll(() => t.close());

const inPlace = (extra: Record<string, unknown> = {}) => ({ filters: [{ factor: 'location', locationId: place }], ...extra });
async function run(body: object) {
  const res = await api('researcher').post('/api/research/cohort', body);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.data;
}
const outcomes = async () => db().query<{ print_id: string; noticeable_on: string | null; noticeable_threshold: number | null; de_dates: string[]; de_values: number[]; last_measured_on: string; terms: string[] | null }>(
  `SELECT print_id, noticeable_on::text, noticeable_threshold, de_dates::text[] AS de_dates, de_values, last_measured_on::text, terms
     FROM print_outcomes WHERE print_id = ANY ($1::uuid[])`,
  { bind: [Object.values(ids)], type: QueryTypes.SELECT },
);
/** The general path: outcomes as a row written before the stored day and terms existed. */
const forgetStored = () => db().query('UPDATE print_outcomes SET noticeable_threshold = NULL, terms = NULL WHERE print_id = ANY ($1::uuid[])', { bind: [Object.values(ids)] });

describe('the fading event at the settings\' threshold', () => {
  it('reads the stored day, and gives the figures the fitted points give', async () => {
    const { noticeableDeltaE } = await getMeasurementSettings();
    const rows = await outcomes();
    expect(rows).toHaveLength(3);
    for (const r of rows) expect(r.noticeable_threshold).toBe(noticeableDeltaE);
    const query = inPlace({ groupBy: ['alkalineAfterBath'], coxFactors: ['alkalineAfterBath'], event: { kind: 'fading', thresholdDeltaE: noticeableDeltaE } });
    const fast = await run(query);
    // Without a threshold in the query the settings' one is used: the same figures.
    const implicit = await run(inPlace({ groupBy: ['alkalineAfterBath'], coxFactors: ['alkalineAfterBath'], event: { kind: 'fading' } }));
    expect({ ...implicit, query: null }).toEqual({ ...fast, query: null });
    await forgetStored();
    try {
      const general = await run(query);
      expect(general).toEqual(fast);
    } finally {
      await recomputeAll();
    }
    // By hand, if the settings keep the default 2.0 (fading.ts): f1 reaches 2.0425 on 2012-06-01, f2 on 2014-06-01; f3 never.
    if (noticeableDeltaE === 2) {
      const times = fast.survival.groups.flatMap((g: { steps: { t: number; events: number }[] }) => g.steps.filter((s) => s.events > 0).map((s) => s.t)).sort();
      expect(times).toEqual([expect.closeTo(years(START, '2012-06-01'), 10), expect.closeTo(years(START, '2014-06-01'), 10)]);
    }
  });

  it('another threshold takes the first fitted point reaching it, never the stored day', async () => {
    const rows = await outcomes();
    for (const threshold of [0.5, 1, 1.5, 2.5]) {
      const r = await run(inPlace({ event: { kind: 'fading', thresholdDeltaE: threshold } }));
      // Expected from the stored fitted points themselves: the first date at or above the threshold, else censored at the last session.
      const expected = rows.map((o) => {
        const i = o.de_values.findIndex((v) => v >= threshold);
        return { t: years(START, i >= 0 ? o.de_dates[i]! : o.last_measured_on), event: i >= 0 };
      });
      const steps = r.survival.groups[0].steps as { t: number; events: number; censored: number }[];
      const events = expected.filter((e) => e.event).length;
      expect(steps.reduce((s, x) => s + x.events, 0), `threshold ${threshold}`).toBe(events);
      expect(steps.reduce((s, x) => s + x.censored, 0)).toBe(3 - events);
      for (const e of expected) expect(steps.some((s) => Math.abs(s.t - e.t) < 1e-9 && (e.event ? s.events > 0 : s.censored > 0)), `threshold ${threshold}`).toBe(true);
    }
  });
});

describe('the stored terms', () => {
  it('give the incidence and the observation event the term_first keys give', async () => {
    const query = inPlace({ groupBy: ['tonerSequence'], event: { kind: 'observation', term: 'fading' } });
    const stored = await run(query);
    expect((await outcomes()).find((o) => o.print_id === ids.f1)!.terms!.sort()).toEqual(['fading', 'silver_mirroring']);
    await forgetStored();
    try {
      expect(await run(query)).toEqual(stored);
    } finally {
      await recomputeAll();
    }
    const fading = stored.incidence.find((x: { term: string }) => x.term === 'fading');
    // Selenium: f1 with fading; iron blue: f2 with fading, f3 without [by hand].
    expect(Object.fromEntries(fading.groups.map((g: { key: string; n: number; count: number }) => [g.key, [g.n, g.count]])))
      .toEqual({ 'tonerSequence=selenium': [1, 1], 'tonerSequence=iron_blue': [2, 1] });
  });
});

describe('the process-step factors', () => {
  const factors = async (id: string) => (await db().query<Record<string, unknown>>(
    'SELECT n, toned, seq, toning_min, extent, wash_min, hypo, alk_yes, alk_unknown FROM print_step_factors WHERE print_id = $1', { bind: [id], type: QueryTypes.SELECT }))[0] ?? null;

  it('follow inserts, updates and deletes of the steps in the same transaction', async () => {
    const p = await newPrint(`${base}.9`, place);
    expect(await factors(p.id)).toBeNull();
    await addStep(p.id, 1, 'toning', { tonerClass: 'selenium', timeSeconds: 90 });
    await addStep(p.id, 2, 'toning', { tonerClass: 'iron_blue', timeSeconds: 150 });
    await addStep(p.id, 3, 'after_bath', { alkaline: null });
    await addStep(p.id, 4, 'final_wash', { timeSeconds: 1200 });
    // By hand: 4 steps, toned, selenium then iron blue, 4 minutes toning, 20 minutes washing, no hypo clearing, an after-bath of unknown alkalinity.
    expect(await factors(p.id)).toEqual({ n: 4, toned: true, seq: 'selenium → iron_blue', toning_min: 4, extent: null, wash_min: 20, hypo: false, alk_yes: false, alk_unknown: true });
    await db().query(`UPDATE process_steps SET alkaline = true WHERE print_id = $1 AND type = 'after_bath'`, { bind: [p.id] });
    await db().query(`UPDATE process_steps SET toner_class = 'gold', extent = 'full' WHERE print_id = $1 AND position = 1`, { bind: [p.id] });
    expect(await factors(p.id)).toMatchObject({ seq: 'gold → iron_blue', extent: 'full', alk_yes: true, alk_unknown: false });
    await db().query(`DELETE FROM process_steps WHERE print_id = $1 AND type = 'toning'`, { bind: [p.id] });
    expect(await factors(p.id)).toEqual({ n: 2, toned: false, seq: null, toning_min: null, extent: null, wash_min: 20, hypo: false, alk_yes: true, alk_unknown: false });
    // The cohort reads them: not toned, alkaline after-bath.
    const r = await run({ filters: [{ factor: 'location', locationId: place }, { factor: 'alkalineAfterBath', values: ['yes'] }], groupBy: ['toned'] });
    expect(r.groups.map((g: { key: string; size: number }) => [g.key, g.size]).sort()).toEqual([['toned=no', 1], ['toned=yes', 1]]);
    await db().query('DELETE FROM process_steps WHERE print_id = $1', { bind: [p.id] });
    expect(await factors(p.id)).toBeNull();
  });

  it('equal the aggregate over process_steps for every print that has steps', async () => {
    const [{ differ }] = await db().query<{ differ: number }>(
      `SELECT count(*)::int AS differ FROM (
         SELECT s.print_id, count(*)::int AS n, coalesce(bool_or(s.type = 'toning'), false) AS toned,
                string_agg(s.toner_class, ' → ' ORDER BY s.position) FILTER (WHERE s.type = 'toning') AS seq,
                (sum(s.time_seconds) FILTER (WHERE s.type = 'toning') / 60.0)::float8 AS toning_min,
                (array_agg(s.extent ORDER BY s.position) FILTER (WHERE s.type = 'toning'))[1] AS extent,
                (sum(s.time_seconds) FILTER (WHERE s.type IN ('washing','final_wash')) / 60.0)::float8 AS wash_min,
                coalesce(bool_or(s.type = 'hypo_clearing'), false) AS hypo,
                coalesce(bool_or(s.alkaline) FILTER (WHERE s.type = 'after_bath'), false) AS alk_yes,
                coalesce(bool_or(s.alkaline IS NULL) FILTER (WHERE s.type = 'after_bath'), false) AS alk_unknown
           FROM process_steps s WHERE s.print_id = ANY ($1::uuid[]) GROUP BY s.print_id) a
       FULL JOIN (SELECT * FROM print_step_factors WHERE print_id = ANY ($1::uuid[])) f USING (print_id)
      WHERE (a.n, a.toned, a.seq, a.toning_min, a.extent, a.wash_min, a.hypo, a.alk_yes, a.alk_unknown)
            IS DISTINCT FROM (f.n, f.toned, f.seq, f.toning_min, f.extent, f.wash_min, f.hypo, f.alk_yes, f.alk_unknown)`,
      { bind: [Object.values(ids)], type: QueryTypes.SELECT },
    );
    expect(differ).toBe(0);
    expect(await factors(ids.f2!)).toMatchObject({ n: 4, toned: true, seq: 'iron_blue', toning_min: 4, wash_min: 10, alk_yes: true });
  });
});

describe('the figures asked for', () => {
  it('each part equals the same part of a run asking for every figure, with the groups in every part', async () => {
    const query = inPlace({ groupBy: ['alkalineAfterBath'], coxFactors: ['alkalineAfterBath'], event: { kind: 'fading', thresholdDeltaE: 1 } });
    const all = await run(query);
    expect(all.figures).toEqual(['fading', 'survival', 'incidence', 'cox']);
    const part = async (figures: string) => {
      const res = await api('researcher').post(`/api/research/cohort?figures=${figures}`, query);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.data.groups).toEqual(all.groups);
      expect(res.body.data.total).toBe(all.total);
      return res.body.data;
    };
    const fading = await part('fading');
    expect(fading.figures).toEqual(['fading']);
    expect(fading.fading).toEqual(all.fading);
    expect(fading.fading.some((f: { deltaEPerYear: { n: number } }) => f.deltaEPerYear.n > 0)).toBe(true);
    expect([fading.survival.groups, fading.survival.logRank, fading.incidence, fading.cox]).toEqual([[], null, [], null]);
    // Any order, each once: answered in the list's order.
    const survival = await part('incidence,survival');
    expect(survival.figures).toEqual(['survival', 'incidence']);
    expect(survival.survival).toEqual(all.survival);
    expect(survival.survival.groups.length).toBe(2);
    expect(survival.incidence).toEqual(all.incidence);
    expect([survival.fading, survival.cox]).toEqual([[], null]);
    const cox = await part('cox');
    expect(cox.cox).toEqual(all.cox);
    expect(cox.cox).not.toBeNull();
    expect([cox.fading, cox.survival.groups, cox.incidence]).toEqual([[], [], []]);
  });

  it('an unknown figure is a 400 naming the parameter', async () => {
    for (const figures of ['nope', 'fading,points', 'fading;cox']) {
      const res = await api('researcher').post(`/api/research/cohort?figures=${encodeURIComponent(figures)}`, inPlace());
      expect(res.status, figures).toBe(400);
      expect(paths(res)).toContain('query.figures');
    }
  });
});

describe('one spot analysis for the schedule and the outcomes', () => {
  it('a batch recomputed with shared analyses stores the outcomes the outcomes alone store', async () => {
    const read = async () => db().query('SELECT * FROM print_outcomes WHERE print_id = ANY ($1::uuid[]) ORDER BY print_id', { bind: [Object.values(ids)], type: QueryTypes.SELECT });
    const strip = (rows: object[]) => rows.map((r) => ({ ...r, computed_at: null }));
    await db().transaction((tx) => recomputeOutcomes(Object.values(ids), tx));
    const alone = strip(await read());
    await db().transaction((tx) => recomputePrints(Object.values(ids), tx));
    expect(strip(await read())).toEqual(alone);
    expect(alone.length).toBe(3);
  });
});

async function recomputeAll(): Promise<void> {
  await db().transaction((tx) => recomputePrints(Object.values(ids), tx));
}
