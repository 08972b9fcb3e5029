import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { deltaE00, type Lab } from '@toneledger/common/domain/colour';
import { DEFAULT_NOTICEABLE_DELTA_E, NOTICEABLE_DELTA_E_GUIDANCE, fadingRate, projectThreshold } from '@toneledger/common/domain/fading';
import { testApp, sessionFor } from '../../../test/app';
import { accession, createImageRecord } from '../../../test/factories';
import { DEMO_ACCOUNTS } from '../../seed/demo-accounts';
import { AuditEventModel, MeasurementSession, SpotReading } from '../../models';

const t = testApp();
const c = {} as Record<Role, string>;
const conservatorName = DEMO_ACCOUNTS.find((a) => a.role === 'conservator')!.name;

beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
});
afterAll(() => t.close());

const api = (who: Role | null) => ({
  get: (url: string) => (who ? supertest(t.app).get(url).set('Cookie', c[who]) : supertest(t.app).get(url)),
  post: (url: string, body?: object) => {
    const r = supertest(t.app).post(url).set('Origin', t.origin);
    return (who ? r.set('Cookie', c[who]) : r).send(body ?? {});
  },
  patch: (url: string, body: object) => {
    const r = supertest(t.app).patch(url).set('Origin', t.origin);
    return (who ? r.set('Cookie', c[who]) : r).send(body);
  },
  put: (url: string, body: object) => {
    const r = supertest(t.app).put(url).set('Origin', t.origin);
    return (who ? r.set('Cookie', c[who]) : r).send(body);
  },
});

const UNKNOWN = '00000000-0000-4000-8000-00000000000f';
const paths = (res: { body: { error: { details: { path: string }[] } } }) => res.body.error.details.map((d) => d.path);

async function newPrint(process = 'gelatin_silver_developing_out', title = 'Harbour wall at low tide') {
  const res = await api('registrar').post('/api/prints', { accessionNumber: accession(), title, process });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; version: number };
}

async function newSpot(printId: string, name: string, purpose = 'dmax', extra: Record<string, unknown> = {}) {
  const res = await api('conservator').post(`/api/prints/${printId}/measurement-spots`, { name, purpose, ...extra });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; version: number; name: string };
}

const sessionBody = (measuredOn: string, readings: object[], extra: Record<string, unknown> = {}) => ({
  measuredOn, instrument: 'Spectrodensitometer, 4 mm aperture', serial: 'SN-0417', illuminant: 'D50', observer: '2', geometry: '45/0',
  condition: 'M1', readings, ...extra,
});

async function record(printId: string, body: object) {
  const res = await api('conservator').post(`/api/prints/${printId}/measurement-sessions`, body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; readings: { spotId: string; mean: Lab; n: number; sd: Lab | null; maxPairwiseDeltaE00: number; density: number | null }[] };
}

async function analysis(printId: string, who: Role = 'researcher') {
  const res = await api(who).get(`/api/prints/${printId}/measurements`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.data;
}

const spotOf = (data: { spots: { spot: { id: string } }[] }, id: string) => data.spots.find((s) => s.spot.id === id)! as any;

function isoDay(offsetDays: number) {
  return new Date(Date.now() + offsetDays * 86_400_000).toISOString().slice(0, 10);
}

const csvUpload = (printId: string, csv: string, mapping?: object | string, who: Role = 'conservator') => {
  let r = supertest(t.app).post(`/api/prints/${printId}/measurement-sessions/csv-preview`).set('Cookie', c[who]).set('Origin', t.origin)
    .attach('file', Buffer.from(csv, 'utf8'), 'readings.csv');
  if (mapping !== undefined) r = r.field('mapping', typeof mapping === 'string' ? mapping : JSON.stringify(mapping));
  return r;
};

// Sharma, Wu & Dalal (2005), Table 1, pair 1: ΔE00 = 2.0425 (REFERENCES.md §1). CIE76 for the same pair: 4.0011 [computed].
const SHARMA_1_BASE: Lab = { L: 50, a: 2.6772, b: -79.7751 };
const SHARMA_1_LATER: Lab = { L: 50, a: 0, b: -82.7485 };

describe('access', () => {
  it('401 without a session; a viewer cannot read; researcher and registrar cannot write; unknown print is 404', async () => {
    const print = await newPrint();
    expect((await api(null).get(`/api/prints/${print.id}/measurements`)).status).toBe(401);
    expect((await api(null).post(`/api/prints/${print.id}/measurement-spots`, { name: 'Dmax', purpose: 'dmax' })).status).toBe(401);
    expect((await api('viewer').get(`/api/prints/${print.id}/measurements`)).status).toBe(403);
    expect((await api('viewer').get('/api/measurements/leaders')).status).toBe(403);
    expect((await api('viewer').get('/api/settings/measurements')).status).toBe(403);
    for (const who of ['researcher', 'registrar', 'admin'] as const) {
      expect((await api(who).post(`/api/prints/${print.id}/measurement-spots`, { name: 'Dmax', purpose: 'dmax' })).status).toBe(403);
      expect((await api(who).post(`/api/prints/${print.id}/measurement-sessions`, sessionBody('2020-01-01', []))).status).toBe(403);
      expect((await csvUpload(print.id, 'Sample,L,a,b\n', undefined, who)).status).toBe(403);
    }
    for (const who of ['admin', 'registrar', 'conservator', 'researcher'] as const) {
      expect((await api(who).get(`/api/prints/${print.id}/measurements`)).status).toBe(200);
    }
    const empty = await analysis(print.id);
    expect(empty).toEqual({ threshold: DEFAULT_NOTICEABLE_DELTA_E, thresholdGuidance: NOTICEABLE_DELTA_E_GUIDANCE, spots: [], sessions: [] });
    expect((await api('researcher').get(`/api/prints/${UNKNOWN}/measurements`)).status).toBe(404);
    expect((await api('conservator').post(`/api/prints/${UNKNOWN}/measurement-spots`, { name: 'Dmax', purpose: 'dmax' })).status).toBe(404);
    expect((await api('conservator').post(`/api/prints/${UNKNOWN}/measurement-sessions`, sessionBody('2020-01-01', [{ spotId: UNKNOWN, readings: [{ L: 50, a: 0, b: 0 }] }]))).status).toBe(404);
    expect((await api('conservator').patch(`/api/measurement-spots/${UNKNOWN}`, { version: 1, notes: 'x' })).status).toBe(404);
  });

  it('sessions are the record: no route deletes one, and the database refuses changes and out-of-range readings', async () => {
    const print = await newPrint();
    const spot = await newSpot(print.id, 'Shadow');
    const s = await record(print.id, sessionBody('2020-01-01', [{ spotId: spot.id, readings: [{ L: 20, a: 0, b: 0 }] }]));
    const del = await supertest(t.app).delete(`/api/measurement-sessions/${s.id}`).set('Cookie', c.conservator).set('Origin', t.origin);
    expect(del.status).toBe(404);
    await expect(MeasurementSession.destroy({ where: { id: s.id } })).rejects.toThrow(/kept as recorded/);
    await expect(SpotReading.update({ meanL: 21 }, { where: { sessionId: s.id } })).rejects.toThrow(/kept as recorded/);
    expect(await MeasurementSession.count({ where: { id: s.id } })).toBe(1);
    const other = await MeasurementSession.create({
      printId: print.id, measuredOn: '2020-02-01', measuredBy: null, measuredByName: null, instrument: 'x', serial: null, illuminant: 'D50',
      observer: '2', geometry: '45/0', condition: null, aperture: null, backing: null, notes: null,
    });
    const row = { sessionId: other.id, spotId: spot.id, printId: print.id, meanL: 50, meanA: 0, meanB: 0, n: 1, sd: null, maxPairwiseDe: 0, density: null, densityType: null, reflectance: null };
    await expect(SpotReading.create({ ...row, readings: [{ L: 120, a: 0, b: 0 }] })).rejects.toThrow(/check constraint/);
    // A reading's spot and session must be of the same print.
    const elsewhere = await newSpot((await newPrint()).id, 'Shadow');
    await expect(SpotReading.create({ ...row, spotId: elsewhere.id, readings: [{ L: 50, a: 0, b: 0 }] })).rejects.toThrow(/foreign key/);
  });
});

describe('spots', () => {
  it('a conservator registers spots; names are unique per print ignoring case; the point is on an image of the same print; audited', async () => {
    const print = await newPrint();
    const other = await newPrint();
    const image = await createImageRecord(print.id);
    const foreign = await createImageRecord(other.id);
    const bad = await api('conservator').post(`/api/prints/${print.id}/measurement-spots`, { name: '', purpose: 'corner' });
    expect(bad.status).toBe(400);
    expect(paths(bad)).toEqual(expect.arrayContaining(['name', 'purpose']));
    const wrongImage = await api('conservator').post(`/api/prints/${print.id}/measurement-spots`, { name: 'Dmax', purpose: 'dmax', point: { imageId: foreign.id, x: 0.2, y: 0.3 } });
    expect(wrongImage.status).toBe(400);
    expect(paths(wrongImage)).toEqual(['point.imageId']);
    const noImage = await api('conservator').post(`/api/prints/${print.id}/measurement-spots`, { name: 'Dmax', purpose: 'dmax', point: { imageId: UNKNOWN, x: 0.2, y: 0.3 } });
    expect(paths(noImage)).toEqual(['point.imageId']);

    const spot = await newSpot(print.id, 'Dmax, coat', 'dmax', { point: { imageId: image.id, x: 0.25, y: 0.75 }, notes: 'Darkest area of the coat' });
    expect(spot).toEqual({
      id: expect.any(String), printId: print.id, name: 'Dmax, coat', purpose: 'dmax', point: { imageId: image.id, x: 0.25, y: 0.75 },
      notes: 'Darkest area of the coat', baseline: null, version: 1,
    });
    const dup = await api('conservator').post(`/api/prints/${print.id}/measurement-spots`, { name: 'DMAX, COAT', purpose: 'mid_tone' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.details[0].path).toBe('name');
    // The same name on another print is fine.
    await newSpot(other.id, 'Dmax, coat');
    const audit = await AuditEventModel.findOne({ where: { entityType: 'measurement_spot', entityId: spot.id, action: 'measurement_spot.created' } });
    expect(audit).toMatchObject({ actorName: conservatorName, after: { printId: print.id, name: 'Dmax, coat' } });
  });

  it('edits need the current version (409 when stale, with the record as it is now); the point rule applies', async () => {
    const print = await newPrint();
    const foreign = await createImageRecord((await newPrint()).id);
    const spot = await newSpot(print.id, 'Highlight, sky', 'highlight');
    expect((await api('researcher').patch(`/api/measurement-spots/${spot.id}`, { version: 1, notes: 'x' })).status).toBe(403);
    const ok = await api('conservator').patch(`/api/measurement-spots/${spot.id}`, { version: 1, name: 'Highlight, upper sky', notes: 'Left of the cloud' });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body.data).toMatchObject({ name: 'Highlight, upper sky', notes: 'Left of the cloud', purpose: 'highlight', version: 2 });
    const stale = await api('conservator').patch(`/api/measurement-spots/${spot.id}`, { version: 1, notes: 'Older view' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details).toMatchObject({ current: { name: 'Highlight, upper sky', version: 2 }, lastChangedBy: conservatorName });
    const wrong = await api('conservator').patch(`/api/measurement-spots/${spot.id}`, { version: 2, point: { imageId: foreign.id, x: 0.5, y: 0.5 } });
    expect(wrong.status).toBe(400);
    expect(paths(wrong)).toEqual(['point.imageId']);
    const audit = await AuditEventModel.findOne({ where: { entityType: 'measurement_spot', entityId: spot.id, action: 'measurement_spot.updated' } });
    expect(audit).toMatchObject({ before: { name: 'Highlight, sky', printId: print.id }, after: { name: 'Highlight, upper sky', printId: print.id } });
  });
});

describe('sessions, change against the baseline, rate and projection', () => {
  let print: { id: string };
  let dmax: { id: string; version: number };
  let margin: { id: string; version: number };
  const sessions: Record<string, string> = {};

  beforeAll(async () => {
    print = await newPrint('gelatin_silver_developing_out', 'Net lofts, selenium-toned');
    dmax = await newSpot(print.id, 'Dmax shadow', 'dmax');
    margin = await newSpot(print.id, 'Paper margin', 'paper_base');
  });

  it('two sessions a year apart: ΔE00 from the averaged means equals deltaE00 (Sharma pair 1); no rate yet', async () => {
    const first = await record(print.id, sessionBody('2019-06-01', [
      { spotId: dmax.id, readings: [SHARMA_1_BASE], density: 1.2, densityType: 'visual' },
      { spotId: margin.id, readings: [{ L: 95, a: 0.5, b: 3 }] },
    ]));
    sessions.s1 = first.id;
    // Two readings whose mean is the later colour of pair 1.
    const second = await record(print.id, sessionBody('2020-06-01', [
      { spotId: dmax.id, readings: [{ L: 50, a: 0.5, b: -82.7485 }, { L: 50, a: -0.5, b: -82.7485 }], reflectance: 0.1, densityType: 'visual' },
    ]));
    sessions.s2 = second.id;
    const r = second.readings[0];
    expect(r.mean.L).toBe(50);
    expect(r.mean.a).toBeCloseTo(0, 12);
    expect(r.mean.b).toBeCloseTo(-82.7485, 12);
    expect(r.n).toBe(2);
    expect(r.sd!.a).toBeCloseTo(Math.SQRT1_2, 12); // sample SD of ±0.5
    expect(r.sd!.L).toBe(0);
    expect(r.maxPairwiseDeltaE00).toBeCloseTo(deltaE00({ L: 50, a: 0.5, b: -82.7485 }, { L: 50, a: -0.5, b: -82.7485 }), 10);
    // Density from reflectance only: D = −log10(0.1) = 1.000 (REFERENCES.md §7).
    expect(r.density).toBeCloseTo(1, 12);
    const stored = await SpotReading.findOne({ where: { sessionId: second.id, spotId: dmax.id } });
    expect(stored!.readings).toEqual([{ L: 50, a: 0.5, b: -82.7485 }, { L: 50, a: -0.5, b: -82.7485 }]);

    const data = await analysis(print.id);
    const a = spotOf(data, dmax.id);
    expect(a.baseline).toEqual({ sessionId: first.id, measuredOn: '2019-06-01', lab: SHARMA_1_BASE, density: 1.2, chosen: false });
    expect(a.points.map((p: { sessionId: string }) => p.sessionId)).toEqual([first.id, second.id]);
    expect(a.points[0]).toMatchObject({ comparable: true, reason: null, dE00: 0, dE76: 0, dD: 0, densityLossPercent: 0 });
    const later = a.points[1];
    expect(later.comparable).toBe(true);
    expect(later.dE00).toBeCloseTo(deltaE00(SHARMA_1_BASE, SHARMA_1_LATER), 10);
    expect(later.dE00).toBeCloseTo(2.0425, 4);
    expect(later.dE76).toBeCloseTo(4.0011, 4);
    expect(later.dL).toBeCloseTo(0, 10);
    expect(later.dC).toBeCloseTo(Math.hypot(0, -82.7485) - Math.hypot(2.6772, -79.7751), 10);
    expect(later.dominant).toBe('gain of chroma');
    expect(later.density).toBeCloseTo(1, 12);
    expect(later.dD).toBeCloseTo(-0.2, 10);
    expect(later.densityLossPercent).toBeCloseTo((0.2 / 1.2) * 100, 10);
    expect(a.rate).toMatchObject({ ok: false, reason: 'not_enough_sessions' });
    expect(a.projection).toBeNull();
    // The margin was measured once: it is its own baseline, with nothing to fit.
    const m = spotOf(data, margin.id);
    expect(m.points).toHaveLength(1);
    expect(m.densityChangeRate).toBeNull();
    expect(m.densityLossRate).toBeNull();
    expect(m.rate).toMatchObject({ ok: false, reason: 'not_enough_sessions' });
    expect(data.sessions.map((s: { id: string }) => s.id)).toEqual([second.id, first.id]);
    expect(data.sessions[1].readings.map((x: { spotName: string }) => x.spotName)).toEqual(['Dmax shadow', 'Paper margin']);
    expect(data.sessions[1].measuredBy).toBe(conservatorName);

    const audit = await AuditEventModel.findOne({ where: { entityType: 'measurement_session', entityId: first.id } });
    expect(audit).toMatchObject({ action: 'measurement_session.recorded', actorName: conservatorName, after: { printId: print.id, measuredOn: '2019-06-01' } });
  });

  it('a third session gives a rate (the same fit as fadingRate) and a projection with ISO dates', async () => {
    const third = await record(print.id, sessionBody('2021-09-01', [{ spotId: dmax.id, readings: [{ L: 49, a: -1, b: -84 }], density: 0.95, densityType: 'visual' }]));
    sessions.s3 = third.id;
    const a = spotOf(await analysis(print.id), dmax.id);
    const series = [
      { t: '2019-06-01', value: 0 },
      { t: '2020-06-01', value: deltaE00(SHARMA_1_BASE, SHARMA_1_LATER) },
      { t: '2021-09-01', value: deltaE00(SHARMA_1_BASE, { L: 49, a: -1, b: -84 }) },
    ];
    const expected = fadingRate(series);
    if (!expected.ok) throw new Error('the expected fit should succeed');
    expect(a.rate.ok).toBe(true);
    expect(a.rate.n).toBe(3);
    expect(a.rate.slopePerYear).toBeCloseTo(expected.slopePerYear, 10);
    expect(a.rate.ci95[0]).toBeCloseTo(expected.ci95[0], 10);
    expect(a.rate.ci95[1]).toBeCloseTo(expected.ci95[1], 10);
    expect(a.rate.spanYears).toBeCloseTo(expected.spanYears, 10);
    // Density loss: 0 %, 16.7 %, 20.8 % of the baseline 1.2.
    expect(a.densityLossRate.ok).toBe(true);
    const expectedDensity = fadingRate([
      { t: '2019-06-01', value: 0 }, { t: '2020-06-01', value: (0.2 / 1.2) * 100 }, { t: '2021-09-01', value: (0.25 / 1.2) * 100 },
    ]);
    expect(a.densityLossRate.slopePerYear).toBeCloseTo((expectedDensity as { slopePerYear: number }).slopePerYear, 8);
    // Density change in D per year: 1.20, 1.00, 0.95 (ΔD 0, −0.20, −0.25), a fall of about a tenth of a D a year.
    expect(a.densityChangeRate.ok).toBe(true);
    const expectedChange = fadingRate([{ t: '2019-06-01', value: 0 }, { t: '2020-06-01', value: -0.2 }, { t: '2021-09-01', value: -0.25 }]);
    expect(a.densityChangeRate.slopePerYear).toBeCloseTo((expectedChange as { slopePerYear: number }).slopePerYear, 8);
    expect(a.densityChangeRate.slopePerYear).toBeCloseTo((-1.2 / 100) * a.densityLossRate.slopePerYear, 10);
    // The threshold (ΔE00 2.0 by default) was first met at the second session.
    expect(a.projection).toEqual({ reached: true, alreadyReached: true, threshold: 2, firstDate: '2020-06-01T00:00:00.000Z' });
    const expectedProjection = projectThreshold(expected, { t: '2019-06-01' }, 2, series);
    expect(expectedProjection).toMatchObject({ alreadyReached: true, firstDate: new Date('2020-06-01T00:00:00.000Z') });
  });

  it('a session under D65 after a D50 baseline is stored, but its point is not comparable and stays out of the rate', async () => {
    const fourth = await record(print.id, sessionBody('2022-06-01', [{ spotId: dmax.id, readings: [{ L: 47, a: -2, b: -86 }] }], { illuminant: 'D65' }));
    sessions.s4 = fourth.id;
    const data = await analysis(print.id);
    const a = spotOf(data, dmax.id);
    const p = a.points.find((x: { sessionId: string }) => x.sessionId === fourth.id);
    expect(p).toMatchObject({ comparable: false, dE00: null, dE76: null, dL: null, dominant: null, dD: null, lab: { L: 47, a: -2, b: -86 } });
    expect(p.reason).toMatch(/D50.*D65.*not comparable/);
    expect(a.rate.n).toBe(3);
    expect(data.sessions[0].id).toBe(fourth.id);
    expect(data.sessions[0].illuminant).toBe('D65');
  });

  it('the noticeable ΔE00 is a setting: researchers read it, an administrator changes it (audited), the projection follows', async () => {
    expect((await api('researcher').get('/api/settings/measurements')).body.data).toEqual({ noticeableDeltaE: DEFAULT_NOTICEABLE_DELTA_E });
    expect((await api('conservator').put('/api/settings/measurements', { noticeableDeltaE: 10 })).status).toBe(403);
    const bad = await api('admin').put('/api/settings/measurements', { noticeableDeltaE: 0 });
    expect(bad.status).toBe(400);
    expect(paths(bad)).toEqual(['noticeableDeltaE']);
    try {
      expect((await api('admin').put('/api/settings/measurements', { noticeableDeltaE: 10 })).status).toBe(200);
      const audit = await AuditEventModel.findOne({ where: { action: 'settings.updated', entityId: 'measurements' }, order: [['id', 'DESC']] });
      expect(audit).toMatchObject({ before: { noticeableDeltaE: 2 }, after: { noticeableDeltaE: 10 } });
      const data = await analysis(print.id);
      expect(data.threshold).toBe(10);
      const a = spotOf(data, dmax.id);
      const series = a.points.filter((p: { comparable: boolean }) => p.comparable).map((p: { measuredOn: string; dE00: number }) => ({ t: p.measuredOn, value: p.dE00 }));
      const fit = fadingRate(series);
      if (!fit.ok) throw new Error('the fit should succeed');
      const expected = projectThreshold(fit, { t: '2019-06-01' }, 10, series);
      if (!expected.reached || expected.alreadyReached) throw new Error('the trend should reach 10 later');
      expect(a.projection).toEqual({
        reached: true, alreadyReached: false, threshold: 10, date: expected.date.toISOString(),
        interval: { earliest: expected.interval.earliest.toISOString(), latest: expected.interval.latest ? expected.interval.latest.toISOString() : null },
      });
    } finally {
      expect((await api('admin').put('/api/settings/measurements', { noticeableDeltaE: DEFAULT_NOTICEABLE_DELTA_E })).status).toBe(200);
    }
  });

  it('choosing a baseline records who, when and why; earlier points are shown but the clock restarts; null returns to the first session', async () => {
    const reason = 'Rehoused in a new folder after surface cleaning; later readings compare with this one';
    expect((await api('researcher').put(`/api/measurement-spots/${dmax.id}/baseline`, { sessionId: sessions.s2, reason, version: dmax.version })).status).toBe(403);
    const notMeasured = await api('conservator').put(`/api/measurement-spots/${margin.id}/baseline`, { sessionId: sessions.s2, reason, version: margin.version });
    expect(notMeasured.status).toBe(400);
    expect(paths(notMeasured)).toEqual(['sessionId']);
    const noReason = await api('conservator').put(`/api/measurement-spots/${dmax.id}/baseline`, { sessionId: sessions.s2, reason: '', version: dmax.version });
    expect(paths(noReason)).toEqual(['reason']);

    const before = Date.now();
    const res = await api('conservator').put(`/api/measurement-spots/${dmax.id}/baseline`, { sessionId: sessions.s2, reason, version: dmax.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data.baseline).toEqual({ sessionId: sessions.s2, chosenBy: conservatorName, chosenAt: expect.any(String), reason });
    expect(Date.parse(res.body.data.baseline.chosenAt)).toBeGreaterThanOrEqual(before - 1000);
    const stale = await api('conservator').put(`/api/measurement-spots/${dmax.id}/baseline`, { sessionId: null, reason: 'Back to the first', version: dmax.version });
    expect(stale.status).toBe(409);

    const a = spotOf(await analysis(print.id), dmax.id);
    expect(a.spot.baseline.reason).toBe(reason);
    expect(a.baseline).toMatchObject({ sessionId: sessions.s2, measuredOn: '2020-06-01', chosen: true });
    expect(a.points.find((p: { sessionId: string }) => p.sessionId === sessions.s2).dE00).toBe(0);
    // ΔE00 is symmetric: the first session, seen from the chosen baseline, is Sharma pair 1 again.
    expect(a.points.find((p: { sessionId: string }) => p.sessionId === sessions.s1).dE00).toBeCloseTo(2.0425, 4);
    // From the chosen baseline on there are two comparable sessions: no rate.
    expect(a.rate).toMatchObject({ ok: false, reason: 'not_enough_sessions' });
    const audit = await AuditEventModel.findOne({ where: { entityType: 'measurement_spot', entityId: dmax.id, action: 'measurement_spot.baseline_chosen' } });
    expect(audit).toMatchObject({ actorName: conservatorName, after: { printId: print.id, reason, baseline: { sessionId: sessions.s2 } } });

    const reset = await api('conservator').put(`/api/measurement-spots/${dmax.id}/baseline`, { sessionId: null, reason: 'The cleaning changed nothing measurable', version: res.body.data.version });
    expect(reset.status).toBe(200);
    expect(reset.body.data.baseline).toBeNull();
    const back = spotOf(await analysis(print.id), dmax.id);
    expect(back.baseline).toMatchObject({ sessionId: sessions.s1, chosen: false });
    expect(back.rate.ok).toBe(true);
    expect(await AuditEventModel.count({ where: { entityId: dmax.id, action: 'measurement_spot.baseline_reset' } })).toBe(1);
  });
});

describe('bad input is refused with the field named, and nothing is written', () => {
  it('L* out of range, text in numeric fields, empty numbers, a future date, a spot of another print, a spot twice', async () => {
    const print = await newPrint();
    const spot = await newSpot(print.id, 'Mid-tone, face', 'mid_tone');
    const otherSpot = await newSpot((await newPrint()).id, 'Elsewhere');
    const count = () => MeasurementSession.count({ where: { printId: print.id } });
    const post = (body: object) => api('conservator').post(`/api/prints/${print.id}/measurement-sessions`, body);
    const good = { spotId: spot.id, readings: [{ L: 55, a: 1, b: 4 }] };

    const tooLight = await post(sessionBody('2021-01-01', [{ ...good, readings: [{ L: 120, a: 1, b: 4 }] }]));
    expect(tooLight.status).toBe(400);
    expect(paths(tooLight)).toEqual(['readings.0.readings.0.L']);
    const text = await post(sessionBody('2021-01-01', [{ ...good, readings: [{ L: 55, a: 'pinkish', b: 4 }] }]));
    expect(paths(text)).toEqual(['readings.0.readings.0.a']);
    expect(text.body.error.details[0].message).toBe('a* must be a number');
    const empty = await post(sessionBody('2021-01-01', [{ ...good, readings: [{ L: '', a: 1, b: 4 }] }]));
    expect(paths(empty)).toEqual(['readings.0.readings.0.L']);
    const density = await post(sessionBody('2021-01-01', [{ ...good, density: 'dark' }]));
    expect(paths(density)).toEqual(['readings.0.density']);
    const future = await post(sessionBody(isoDay(10), [good]));
    expect(future.status).toBe(400);
    expect(paths(future)).toEqual(['measuredOn']);
    const unreal = await post(sessionBody('2021-02-30', [good]));
    expect(paths(unreal)).toEqual(['measuredOn']);
    const foreign = await post(sessionBody('2021-01-01', [good, { spotId: otherSpot.id, readings: [{ L: 50, a: 0, b: 0 }] }]));
    expect(paths(foreign)).toEqual(['readings.1.spotId']);
    const twice = await post(sessionBody('2021-01-01', [good, good]));
    expect(paths(twice)).toEqual(['readings.1.spotId']);
    const geometry = await post(sessionBody('2021-01-01', [good], { geometry: 'sideways' }));
    expect(paths(geometry)).toEqual(['geometry']);
    expect(await count()).toBe(0);

    // Numbers sent as strings (as forms do) are read as numbers.
    const ok = await post(sessionBody('2021-01-01', [{ ...good, readings: [{ L: '55.5', a: '1', b: '4' }] }]));
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body.data.readings[0].mean).toEqual({ L: 55.5, a: 1, b: 4 });
    expect(await count()).toBe(1);
  });
});

describe('CSV from an instrument', () => {
  let print: { id: string };
  let dmax: { id: string };
  let margin: { id: string };
  const mapping = { spot: 'Sample', L: 'L*', a: 'a*', b: 'b*', density: 'D' };

  beforeAll(async () => {
    print = await newPrint('gelatin_silver_developing_out', 'Ferry at the slip');
    dmax = await newSpot(print.id, 'Dmax shadow', 'dmax');
    margin = await newSpot(print.id, 'Paper margin', 'paper_base');
  });

  it('needs multipart; without a mapping it shows the columns, row count and a sample', async () => {
    const json = await api('conservator').post(`/api/prints/${print.id}/measurement-sessions/csv-preview`, { file: 'x' });
    expect(json.status).toBe(415);
    const noFile = await supertest(t.app).post(`/api/prints/${print.id}/measurement-sessions/csv-preview`).set('Cookie', c.conservator)
      .set('Origin', t.origin).field('mapping', JSON.stringify(mapping));
    expect(noFile.status).toBe(400);
    expect(paths(noFile)).toEqual(['file']);
    const big = await csvUpload(print.id, `Sample,L*,a*,b*\n${'x'.repeat(5 * 1024 * 1024)}`);
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('payload_too_large');
    const res = await csvUpload(print.id, 'Sample,L*,a*,b*,D\nDmax shadow,40.2,1,-3,1.61\nPaper margin,94,0.3,2.5,0.06\n');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data).toEqual({
      columns: ['Sample', 'L*', 'a*', 'b*', 'D'], rowCount: 2,
      sample: [
        { Sample: 'Dmax shadow', 'L*': '40.2', 'a*': '1', 'b*': '-3', D: '1.61' },
        { Sample: 'Paper margin', 'L*': '94', 'a*': '0.3', 'b*': '2.5', D: '0.06' },
      ],
      readings: null, errors: [],
    });
  });

  it('a mapping that is not JSON, or names a missing column, is refused by field', async () => {
    const notJson = await csvUpload(print.id, 'Sample,L*,a*,b*\n', '{spot:');
    expect(notJson.status).toBe(400);
    expect(paths(notJson)).toEqual(['mapping']);
    const incomplete = await csvUpload(print.id, 'Sample,L*,a*,b*\n', { spot: 'Sample', L: 'L*', a: 'a*' });
    expect(paths(incomplete)).toEqual(['mapping.b']);
    const missing = await csvUpload(print.id, 'Sample,L*,a*,b*\n', { ...mapping, L: 'Lightness' });
    expect(missing.status).toBe(400);
    expect(paths(missing)).toEqual(['mapping.L', 'mapping.density']);
  });

  it('names the row (header = row 1) and column of every problem, and writes nothing', async () => {
    const before = await MeasurementSession.count();
    const csv = [
      'Sample,L*,a*,b*,D',
      'Dmax shadow,40.1,0.2,-3.1,1.6',
      'Nowhere,50,0,0,',
      'Paper margin,120,0,0,',
      'Paper margin,abc,0,1,',
      ',50,0,0,',
      'Dmax shadow,40.3,,-3,dark',
    ].join('\n');
    const res = await csvUpload(print.id, csv, mapping);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const where = res.body.data.errors.map((e: { row: number; column: string }) => `${e.row}:${e.column}`);
    expect(where).toEqual(['3:Sample', '4:L*', '5:L*', '6:Sample', '7:a*', '7:D']);
    expect(res.body.data.errors[1]).toEqual({ row: 4, column: 'L*', value: '120', message: 'L* is between 0 and 100' });
    expect(res.body.data.errors[2]).toMatchObject({ row: 5, column: 'L*', value: 'abc', message: 'L* must be a number' });
    expect(res.body.data.errors[0].message).toMatch(/"Nowhere" is not a measurement spot of this print/);
    expect(res.body.data.rowCount).toBe(6);
    // Only the good row makes a reading.
    expect(res.body.data.readings).toEqual([{ spotId: dmax.id, readings: [{ L: 40.1, a: 0.2, b: -3.1 }], density: 1.6, densityType: null, reflectance: null }]);
    expect(await MeasurementSession.count()).toBe(before);
    expect(await SpotReading.count({ where: { printId: print.id } })).toBe(0);
  });

  it('several rows for one spot are several readings, averaged when the session is recorded', async () => {
    const csv = 'Sample,L*,a*,b*,D\ndmax shadow,40.2,1.0,-3.0,1.60\nPaper margin,94.0,0.3,2.5,\n DMAX SHADOW ,40.6,1.4,-2.0,1.64\n';
    const res = await csvUpload(print.id, csv, mapping);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data.errors).toEqual([]);
    const readings = res.body.data.readings;
    expect(readings.map((r: { spotId: string }) => r.spotId)).toEqual([dmax.id, margin.id]);
    expect(readings[0].readings).toEqual([{ L: 40.2, a: 1, b: -3 }, { L: 40.6, a: 1.4, b: -2 }]);
    expect(readings[0].density).toBeCloseTo(1.62, 12);
    const session = await record(print.id, sessionBody('2023-01-10', readings));
    const d = session.readings.find((r) => r.spotId === dmax.id)!;
    expect(d.n).toBe(2);
    expect(d.mean.L).toBeCloseTo(40.4, 12);
    expect(d.mean.a).toBeCloseTo(1.2, 12);
    expect(d.mean.b).toBeCloseTo(-2.5, 12);
    expect(d.density).toBeCloseTo(1.62, 12);
  });

  it('reads semicolon-separated files with decimal commas, and reflectance in percent', async () => {
    const csv = 'Sample;L;a;b;R %\nPaper margin;93,8;0,2;2,6;81,5\n';
    const res = await csvUpload(print.id, csv, { spot: 'Sample', L: 'L', a: 'a', b: 'b', reflectance: 'R %', reflectanceIsPercent: true });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data.errors).toEqual([]);
    expect(res.body.data.readings).toEqual([{ spotId: margin.id, readings: [{ L: 93.8, a: 0.2, b: 2.6 }], density: null, densityType: null, reflectance: 0.815 }]);
  });
});

describe('leaders', () => {
  it('ranks spots by fading rate or by latest ΔE00, filtered by process and toner class', async () => {
    expect((await api(null).get('/api/measurements/leaders')).status).toBe(401);
    const slowPrint = await newPrint('albumen', 'Slow: quay at dusk');
    const fastPrint = await newPrint('albumen', 'Fast: nets drying');
    const twoPrint = await newPrint('albumen', 'Two sessions only');
    const slow = await newSpot(slowPrint.id, 'Mid-tone', 'mid_tone');
    const fast = await newSpot(fastPrint.id, 'Mid-tone', 'mid_tone');
    const two = await newSpot(twoPrint.id, 'Mid-tone', 'mid_tone');
    const dates = ['2018-05-01', '2019-05-01', '2020-05-01'];
    for (const [i, date] of dates.entries()) {
      await record(slowPrint.id, sessionBody(date, [{ spotId: slow.id, readings: [{ L: 60 - 0.2 * i, a: 2, b: 10 }] }]));
      await record(fastPrint.id, sessionBody(date, [{ spotId: fast.id, readings: [{ L: 60 - 2 * i, a: 2, b: 10 + i }] }]));
    }
    // A large change but only two sessions: no rate, so last by rate and first by change.
    await record(twoPrint.id, sessionBody('2019-01-01', [{ spotId: two.id, readings: [{ L: 60, a: 2, b: 10 }] }]));
    await record(twoPrint.id, sessionBody('2021-01-01', [{ spotId: two.id, readings: [{ L: 50, a: 2, b: 16 }] }]));
    // Gold toning on the fast print only.
    await api('registrar').put(`/api/prints/${fastPrint.id}/steps`, { version: fastPrint.version, steps: [{ type: 'toning', tonerClass: 'gold' }] }).expect(200);

    const mine = new Set([slow.id, fast.id, two.id]);
    const byRate = await api('researcher').get('/api/measurements/leaders?process=albumen&sort=rate');
    expect(byRate.status, JSON.stringify(byRate.body)).toBe(200);
    const rateOrder = byRate.body.data.filter((r: { spotId: string }) => mine.has(r.spotId)).map((r: { spotId: string }) => r.spotId);
    expect(rateOrder).toEqual([fast.id, slow.id, two.id]);
    const top = byRate.body.data.find((r: { spotId: string }) => r.spotId === fast.id);
    const expectedSeries = dates.map((d, i) => ({ t: d, value: deltaE00({ L: 60, a: 2, b: 10 }, { L: 60 - 2 * i, a: 2, b: 10 + i }) }));
    const expected = fadingRate(expectedSeries);
    if (!expected.ok) throw new Error('the fit should succeed');
    expect(top).toMatchObject({
      printId: fastPrint.id, title: 'Fast: nets drying', process: 'albumen', tonerClasses: ['gold'], spotName: 'Mid-tone', sessions: 3, lastMeasuredOn: '2020-05-01',
    });
    expect(top.ratePerYear).toBeCloseTo(expected.slopePerYear, 10);
    expect(top.latestDeltaE00).toBeCloseTo(expectedSeries[2].value, 10);
    expect(byRate.body.data.find((r: { spotId: string }) => r.spotId === two.id)).toMatchObject({ ratePerYear: null, rateCi95: null, sessions: 2 });

    const byChange = await api('researcher').get('/api/measurements/leaders?process=albumen&sort=change');
    expect(byChange.body.data.filter((r: { spotId: string }) => mine.has(r.spotId)).map((r: { spotId: string }) => r.spotId)).toEqual([two.id, fast.id, slow.id]);

    const gold = await api('conservator').get('/api/measurements/leaders?process=albumen&tonerClass=gold');
    expect(gold.body.data.map((r: { spotId: string }) => r.spotId)).toEqual([fast.id]);
    expect(gold.body.pagination).toEqual({ page: 1, pageSize: 50, total: 1 });

    const paged = await api('researcher').get('/api/measurements/leaders?process=albumen&sort=rate&pageSize=1&page=2');
    expect(paged.body.pagination).toMatchObject({ page: 2, pageSize: 1 });
    expect(paged.body.data).toHaveLength(1);
    const badSort = await api('researcher').get('/api/measurements/leaders?sort=fastest');
    expect(badSort.status).toBe(400);
    expect(paths(badSort)).toEqual(['query.sort']);
  });
});
