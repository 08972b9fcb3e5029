import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { kaplanMeier, logRank, type SurvivalObs } from '@toneledger/common/domain/survival';
import { coxPH } from '@toneledger/common/domain/cox';
import { testApp } from '../../../test/app';
import { createLocation } from '../../../test/factories';
import { QueryTypes } from 'sequelize';
import { db } from '../../db';
import { processStale } from '../../services/schedule-jobs';
import { paths, researchClient, settleOutcomes } from './research-helpers';

const t = testApp();
const { api, signInAll, newPrint, addStep, signedReport, newSpot, session } = researchClient(t);
const base = `2097.${Date.now() % 100000}`;
let place: string;
const ids: Record<string, string> = {};

// Years as the server counts them: days between the two dates / 365.25.
const years = (from: string, to: string) => (Date.parse(to) - Date.parse(from)) / 86_400_000 / 365.25;
const START = '2010-01-01';
// The constructed cohort: after-bath alkaline (yes) or not (no); the second signed report shows silver mirroring (event) or not (censored).
const YES: [string, string, boolean][] = [['y1', '2011-01-01', true], ['y2', '2012-01-01', true], ['y3', '2013-01-01', false], ['y4', '2014-01-01', true]];
const NO: [string, string, boolean][] = [['n1', '2012-01-01', false], ['n2', '2013-01-01', true], ['n3', '2014-01-01', false], ['n4', '2015-01-01', false], ['n5', '2016-01-01', true]];
const obs = (rows: [string, string, boolean][]): SurvivalObs[] => rows.map(([, on, event]) => ({ time: years(START, on), event }));

// Sharma, Wu & Dalal (2005), Table 1, pair 1: ΔE00 = 2.0425 (REFERENCES.md §1).
const SHARMA_1_BASE = { L: 50, a: 2.6772, b: -79.7751 };
const SHARMA_1_LATER = { L: 50, a: 0, b: -82.7485 };

beforeAll(async () => {
  await signInAll();
  const wing = await createLocation(`Research wing ${base}`);
  const north = await createLocation('North cabinet', wing);
  const south = await createLocation('South cabinet', wing);
  place = wing.id;
  let n = 0;
  for (const [rows, loc, alkaline] of [[YES, north.id, true], [NO, south.id, false]] as const) {
    for (const [key, on, event] of rows) {
      const p = await newPrint(`${base}.${++n}`, loc);
      ids[key] = p.id;
      await addStep(p.id, 1, 'development');
      await addStep(p.id, 2, 'after_bath', { alkaline });
      await addStep(p.id, 3, 'washing', { timeSeconds: n * 5 * 60 }); // 5, 10, … 45 minutes
      await signedReport(p.id, START, 'good');
      await signedReport(p.id, on, event ? 'fair' : 'good', event ? ['silver_mirroring'] : []);
    }
  }
  // z1: no process history (after-bath unknown), one report, measured three times: the dmax spot changes by ΔE00 2.0425; a highlight changes more but is not the maximum-density spot.
  const z = await newPrint(`${base}.${++n}`, south.id);
  ids.z1 = z.id;
  await signedReport(z.id, START, 'good');
  const dmax = await newSpot(z.id, 'Shadow', 'dmax');
  const high = await newSpot(z.id, 'Sky', 'highlight');
  await session(z.id, '2010-06-01', [{ spotId: dmax.id, lab: SHARMA_1_BASE, density: 2.0 }, { spotId: high.id, lab: { L: 90, a: 0, b: 0 } }]);
  await session(z.id, '2012-06-01', [{ spotId: dmax.id, lab: SHARMA_1_LATER, density: 1.9 }, { spotId: high.id, lab: { L: 80, a: 5, b: 10 } }]);
  await session(z.id, '2014-06-01', [{ spotId: dmax.id, lab: SHARMA_1_LATER, density: 1.8 }, { spotId: high.id, lab: { L: 70, a: 5, b: 10 } }]);
  await settleOutcomes(Object.values(ids));
}, 120_000);
afterAll(() => t.close());

const inPlace = (extra: Record<string, unknown> = {}) => ({ filters: [{ factor: 'location', locationId: place }], ...extra });
async function run(body: object, who: 'researcher' | 'admin' | 'conservator' = 'researcher') {
  const res = await api(who).post('/api/research/cohort', body);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.data;
}
const observationEvent = { kind: 'observation', term: 'silver_mirroring' };

describe('cohort query', () => {
  it('groups the prints by a flag and by the place below the filtered one, with sizes and survival counts', async () => {
    const r = await run(inPlace({ groupBy: ['alkalineAfterBath'], event: observationEvent }));
    expect(r.total).toBe(10);
    const sizes = Object.fromEntries(r.groups.map((g: { key: string; size: number; withSurvival: number; withRate: number }) => [g.key, [g.size, g.withSurvival, g.withRate]]));
    expect(sizes).toEqual({ 'alkalineAfterBath=no': [5, 5, 0], 'alkalineAfterBath=yes': [4, 4, 0], 'alkalineAfterBath=unknown': [1, 0, 1] });
    const byPlace = await run(inPlace({ groupBy: ['location'] }));
    expect(byPlace.groups.map((g: { label: string; size: number }) => [g.label, g.size])).toEqual([['Storage place: South cabinet', 6], ['Storage place: North cabinet', 4]]);
  });

  it('Kaplan–Meier per group and the log-rank test match the statistics module on the raw times, and one curve by hand', async () => {
    const r = await run(inPlace({ groupBy: ['alkalineAfterBath'], event: observationEvent }));
    const curve = (key: string) => r.survival.groups.find((g: { key: string }) => g.key === key);
    const yes = curve('alkalineAfterBath=yes');
    const expectedYes = kaplanMeier(obs(YES), { ci: 'log-log' });
    expect(yes.steps).toHaveLength(expectedYes.steps.length);
    yes.steps.forEach((s: { s: number; atRisk: number }, i: number) => {
      expect(s.s).toBeCloseTo(expectedYes.steps[i]!.s, 12);
      expect(s.atRisk).toBe(expectedYes.steps[i]!.atRisk);
    });
    // By hand (product-limit, Kaplan & Meier 1958): 4 at risk, an event → 3/4; 3 at risk, an event → 3/4 · 2/3 = 1/2; a censoring leaves 1/2; the last at risk has the event → 0.
    expect(yes.steps.map((s: { s: number }) => s.s)).toEqual([0.75, 0.5, 0.5, 0].map((x) => expect.closeTo(x, 12)));
    expect(yes.median.value).toBeCloseTo(years(START, '2012-01-01'), 12);
    const no = curve('alkalineAfterBath=no');
    expect(no.steps.map((s: { s: number }) => s.s)).toEqual(kaplanMeier(obs(NO)).steps.map((s) => expect.closeTo(s.s, 12)));
    expect(no.atRisk[0]).toEqual({ t: 0, n: 5 });
    const lr = logRank([obs(NO), obs(YES)]);
    expect(r.survival.logRank.chi2).toBeCloseTo(lr.chi2, 10);
    expect(r.survival.logRank.p).toBeCloseTo(lr.p, 10);
    expect(r.survival.logRank.groups.map((g: { observed: number }) => g.observed)).toEqual([2, 3]);
    expect(r.survival.logRank.assumptions.join(' ')).toMatch(/independent/);
    // Groups of fewer than 10 prints and 5 events are flagged.
    expect(r.survival.logRank.warnings.length).toBe(4);
  });

  it('the Cox model on a flag is the statistics module\'s fit with the largest level as reference', async () => {
    const r = await run(inPlace({ event: observationEvent, coxFactors: ['alkalineAfterBath'] }));
    const fit = coxPH([...obs(YES).map((o) => ({ ...o, x: [1] })), ...obs(NO).map((o) => ({ ...o, x: [0] }))], { ties: 'efron' });
    expect(r.cox.terms).toHaveLength(1);
    expect(r.cox.terms[0]).toMatchObject({ factor: 'alkalineAfterBath', level: 'yes', reference: 'no' });
    expect(r.cox.terms[0].beta).toBeCloseTo(fit.beta[0]!, 8);
    expect(r.cox.n).toBe(9);
    expect(r.cox.events).toBe(5);
  });

  it('incidence of a term per group with the Wilson interval', async () => {
    const r = await run(inPlace({ groupBy: ['alkalineAfterBath'] }));
    const inc = r.incidence.find((i: { term: string }) => i.term === 'silver_mirroring');
    const yes = inc.groups.find((g: { key: string }) => g.key === 'alkalineAfterBath=yes');
    // Wilson (1927) score interval for 3 of 4 at z = 1.959964: (p + z²/2n ± z√(p(1−p)/n + z²/4n²)) / (1 + z²/n).
    const z = 1.959964; const p = 0.75; const nn = 4;
    const centre = (p + (z * z) / (2 * nn)) / (1 + (z * z) / nn);
    const half = (z * Math.sqrt((p * (1 - p)) / nn + (z * z) / (4 * nn * nn))) / (1 + (z * z) / nn);
    expect(yes).toMatchObject({ n: 4, count: 3, share: 0.75 });
    expect(yes.lower).toBeCloseTo(centre - half, 4);
    expect(yes.upper).toBeCloseTo(centre + half, 4);
  });

  it('fading at the maximum-density spot: the rate the measurements page shows, and the event at any threshold', async () => {
    const m = await api('researcher').get(`/api/prints/${ids.z1}/measurements`);
    const shadow = m.body.data.spots.find((s: { spot: { name: string } }) => s.spot.name === 'Shadow');
    const r = await run(inPlace({ event: { kind: 'fading', thresholdDeltaE: 2 } }));
    const point = r.fading[0].deltaEPerYear.points.find((x: { printId: string }) => x.printId === ids.z1);
    expect(point.value).toBeCloseTo(shadow.rate.slopePerYear, 10);
    expect(r.fading[0].densityLossPerYear.points[0].value).toBeCloseTo(shadow.densityLossRate.slopePerYear, 10);
    // ΔE00 2.0425 ≥ 2 on 2012-06-01: the event, from the first examination (the report of 2010-01-01).
    expect(r.survival.groups[0].steps).toEqual([expect.objectContaining({ t: expect.closeTo(years(START, '2012-06-01'), 10), events: 1 })]);
    // 2.0425 < 3: censored at the last session.
    const higher = await run(inPlace({ event: { kind: 'fading', thresholdDeltaE: 3 } }));
    expect(higher.survival.groups[0].steps).toEqual([expect.objectContaining({ t: expect.closeTo(years(START, '2014-06-01'), 10), events: 0, censored: 1 })]);
    expect(higher.outcomesAsOf).not.toBeNull();
  });

  it('a number factor by the median split and by bands: the groups the prints behind them have', async () => {
    // Washing 5, 10, … 45 minutes for the nine prints, none for z1. Median (R type 7 of 9 values: the
    // 5th) 25 → 4 below, 5 at or above; bands at 12 and 30 → 5, 10 | 15, 20, 25 | 30 … 45 [by hand].
    const split = await run(inPlace({ groupBy: ['washingMinutes'] }));
    expect(split.groups.map((g: { label: string; size: number }) => [g.label, g.size])).toEqual([
      ['Washing time: the median (25) or above', 5], ['Washing time: below the median (25)', 4], ['Washing time: none', 1],
    ]);
    const banded = await run(inPlace({ groupBy: ['washingMinutes'], bands: { washingMinutes: [12, 30] } }));
    const sizes = Object.fromEntries(banded.groups.map((g: { key: string; size: number }) => [g.key, g.size]));
    expect(sizes).toEqual({ 'washingMinutes=< 12': 2, 'washingMinutes=12–30': 3, 'washingMinutes=≥ 30': 4, 'washingMinutes=none': 1 });
    // The keys are the ones the prints behind a figure are asked by (grouped there from each print's value).
    for (const [query, r] of [[inPlace({ groupBy: ['washingMinutes'] }), split], [inPlace({ groupBy: ['washingMinutes'], bands: { washingMinutes: [12, 30] } }), banded]] as const) {
      for (const g of r.groups as { key: string; size: number }[]) {
        const res = await api('researcher').post('/api/research/cohort/prints', { query, groupKey: g.key });
        expect(res.body.pagination.total, g.key).toBe(g.size);
      }
    }
  });

  it('without a filter (process steps aggregated for every print at once) the prints fall in the same groups as under one', async () => {
    const keyOf = new Map<string, string>();
    for (let page = 1; ; page += 1) {
      const res = await api('researcher').post('/api/research/cohort/prints', { query: { groupBy: ['alkalineAfterBath'] }, page, pageSize: 200 });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      for (const p of res.body.data as { printId: string; group: string }[]) keyOf.set(p.printId, p.group);
      if (page * 200 >= res.body.pagination.total) break;
    }
    for (const k of ['y1', 'y2', 'y3', 'y4']) expect(keyOf.get(ids[k]!), k).toBe('alkalineAfterBath=yes');
    for (const k of ['n1', 'n2', 'n3', 'n4', 'n5']) expect(keyOf.get(ids[k]!), k).toBe('alkalineAfterBath=no');
    // z1 has no process steps at all: unknown, as under the place filter.
    expect(keyOf.get(ids.z1!)).toBe('alkalineAfterBath=unknown');
  });

  it('the prints behind a figure: the events of a group, and those at risk at a time', async () => {
    const query = inPlace({ groupBy: ['alkalineAfterBath'], event: observationEvent });
    const res = await api('researcher').post('/api/research/cohort/prints', { query, groupKey: 'alkalineAfterBath=yes', which: 'events' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data.map((p: { printId: string }) => p.printId).sort()).toEqual([ids.y1, ids.y2, ids.y4].sort());
    expect(res.body.pagination.total).toBe(3);
    const atRisk = await api('researcher').post('/api/research/cohort/prints', { query, which: 'at_risk', time: 3.5 });
    // Still observed 3.5 years after 2010-01-01: y4 (2014), n3, n4, n5.
    expect(atRisk.body.data.map((p: { printId: string }) => p.printId).sort()).toEqual([ids.y4, ids.n3, ids.n4, ids.n5].sort());
  });
});

describe('the outcome table', () => {
  const row = async (id: string) => (await db().query<{ term_first: Record<string, string>; last_report_on: string; de_values: number[] }>(
    'SELECT term_first, last_report_on::text, de_values FROM print_outcomes WHERE print_id = $1', { bind: [id], type: QueryTypes.SELECT }))[0];

  it('follows a newly signed report through the stale marks, and a print without a row gets one from its mark', async () => {
    await signedReport(ids.n4!, '2017-01-01', 'poor', ['silver_mirroring']);
    await settleOutcomes([ids.n4!]);
    const after = await row(ids.n4!);
    expect(after!.term_first).toEqual({ silver_mirroring: '2017-01-01' });
    expect(after!.last_report_on).toBe('2017-01-01');
    await db().query('DELETE FROM print_outcomes WHERE print_id = $1', { bind: [ids.z1] });
    await db().query('INSERT INTO schedule_stale (print_id) VALUES ($1) ON CONFLICT DO NOTHING', { bind: [ids.z1] });
    await processStale();
    await settleOutcomes([ids.z1!]);
    // The fitted ΔE00 of the dmax spot: 0 at the baseline, then Sharma pair 1 (2.0425) twice.
    expect((await row(ids.z1!))!.de_values.map((v) => Number(v.toFixed(4)))).toEqual([0, 2.0425, 2.0425]);
  });
});

describe('access and malformed queries', () => {
  it('researchers, conservators and admins run; viewers and registrars get 403 in the envelope', async () => {
    for (const who of ['researcher', 'admin'] as const) expect((await api(who).post('/api/research/cohort', inPlace())).status).toBe(200);
    for (const who of ['viewer', 'registrar'] as const) {
      const res = await api(who).post('/api/research/cohort', inPlace());
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
      expect((await api(who).post('/api/research/cohort/export', inPlace())).status).toBe(403);
      expect((await api(who).get('/api/research/queries')).status).toBe(403);
    }
    expect((await api(null).post('/api/research/cohort', inPlace())).status).toBe(401);
  });

  it('a malformed query is a 400 naming the field', async () => {
    const cases: [object, string][] = [
      [{ filters: [{ factor: 'favouriteColour', values: ['x'] }] }, 'filters.0.factor'],
      [{ filters: [{ factor: 'process', values: ['daguerreotype'] }] }, 'filters.0.values.0'],
      [{ filters: [{ factor: 'toningMinutes', min: 10, max: 2 }] }, 'filters.0.max'],
      [{ groupBy: ['location'] }, 'groupBy.0'],
      [{ groupBy: ['washingMinutes'], bands: { washingMinutes: [30, 10] } }, 'bands.washingMinutes'],
      [{ groupBy: ['process'], bands: { process: [1] } }, 'bands.process'],
    ];
    for (const [body, path] of cases) {
      const res = await api('researcher').post('/api/research/cohort', body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(paths(res)).toContain(path);
    }
  });

  it('the factors endpoint lists the text factors\' values with counts', async () => {
    const res = await api('researcher').get('/api/research/factors');
    expect(res.status).toBe(200);
    expect(Object.keys(res.body.data).sort()).toEqual(['enclosureType', 'maker', 'paperSurface', 'paperTint', 'tonerSequence']);
  });
});
