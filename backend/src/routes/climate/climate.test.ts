import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { QueryTypes } from 'sequelize';
import { testApp } from '../../../test/app';
import { exhibitionClient } from '../../../test/exhibition-helpers';
import { createLocation } from '../../../test/factories';
import { AuditEventModel } from '../../models';
import { db } from '../../db';

const t = testApp();
let h: Awaited<ReturnType<typeof exhibitionClient>>;
beforeAll(async () => { h = await exhibitionClient(t); });
afterAll(() => t.close());

const MAPPING = { timestampColumn: 'Time', timeZone: 'UTC', dateOrder: 'auto', temperatureColumn: 'Temp °C', temperatureUnit: 'C', rhColumn: 'RH %' } as const;

const upload = (locationId: string, csv: string | Buffer, who: 'conservator' | 'registrar' | 'researcher' = 'conservator') =>
  supertest(t.app).post(`/api/locations/${locationId}/climate-files`).set('Cookie', h.c[who]).set('Origin', t.origin)
    .attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv, 'utf8'), 'logger.csv');

const held = async (locationId: string) =>
  Number((await db().query<{ n: string }>('SELECT count(*) AS n FROM climate_readings WHERE location_id = $1', { bind: [locationId], type: QueryTypes.SELECT }))[0].n);

async function loaded(locationId: string, csv: string) {
  const up = await upload(locationId, csv);
  expect(up.status, JSON.stringify(up.body)).toBe(201);
  const chk = await h.as('conservator').post(`/api/climate-files/${up.body.data.id}/check`, { mapping: MAPPING });
  expect(chk.status, JSON.stringify(chk.body)).toBe(200);
  const acc = await h.as('conservator').post(`/api/climate-files/${up.body.data.id}/accept`, { mapping: MAPPING });
  expect(acc.status, JSON.stringify(acc.body)).toBe(200);
  return acc.body.data;
}

describe('a logger file from upload to accept', () => {
  it('names a bad row by number and column, writes nothing before accept, and refuses accept while a row is bad', async () => {
    const room = await createLocation();
    const csv = 'Time,Temp °C,RH %\n2026-01-10 00:00,17,45\n2026-01-10 01:00,17,104\n2026-01-10 02:00,17,45\n';
    const up = await upload(room.id, csv);
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    expect(up.body.data).toMatchObject({ status: 'uploaded', columns: ['Time', 'Temp °C', 'RH %'], rowCount: 3, check: null,
      suggestedMapping: { timestampColumn: 'Time', temperatureColumn: 'Temp °C', temperatureUnit: 'C', rhColumn: 'RH %' } });
    expect(up.body.data.sample[0]).toEqual(['2026-01-10 00:00', '17', '45']);
    const id = up.body.data.id;

    // Accept before a check: 409.
    expect((await h.as('conservator').post(`/api/climate-files/${id}/accept`, { mapping: MAPPING })).status).toBe(409);

    const chk = await h.as('conservator').post(`/api/climate-files/${id}/check`, { mapping: MAPPING });
    expect(chk.status, JSON.stringify(chk.body)).toBe(200);
    expect(chk.body.data.check).toMatchObject({ goodRows: 2, badRows: 1, duplicates: 0, problems: [{ row: 3, column: 'RH %', message: 'RH must be between 0 and 100 %' }],
      firstAt: '2026-01-10T00:00:00.000Z', lastAt: '2026-01-10T02:00:00.000Z' });
    expect(await held(room.id)).toBe(0);

    const acc = await h.as('conservator').post(`/api/climate-files/${id}/accept`, { mapping: MAPPING });
    expect(acc.status).toBe(409);
    expect(acc.body.error.code).toBe('conflict');
    expect(await held(room.id)).toBe(0);

    // Discard: audited, then gone from the waiting state.
    expect((await h.as('conservator').delete(`/api/climate-files/${id}`)).status).toBe(204);
    expect((await h.as('researcher').get(`/api/climate-files/${id}`)).body.data.status).toBe('discarded');
    expect(await AuditEventModel.count({ where: { action: 'climate_file.discarded', entityId: id } })).toBe(1);
  });

  it('keeps readings already held and counts them as duplicates; accept is audited and marks the prints there for rescheduling', async () => {
    const room = await createLocation();
    const p = await h.newPrint();
    await db().query('UPDATE prints SET location_id = $1 WHERE id = $2', { bind: [room.id, p.id] });
    await db().query('DELETE FROM schedule_stale WHERE print_id = $1', { bind: [p.id] });
    await loaded(room.id, 'Time,Temp °C,RH %\n2026-02-01 00:00,16,40\n2026-02-01 01:00,16,40\n');
    expect(await held(room.id)).toBe(2);
    const stale = await db().query('SELECT 1 FROM schedule_stale WHERE print_id = $1', { bind: [p.id], type: QueryTypes.SELECT });
    expect(stale).toHaveLength(1);

    // A second file overlapping the first: its reading at 01:00 says 25 °C, but the one held (16 °C) is kept.
    const up = await upload(room.id, 'Time,Temp °C,RH %\n2026-02-01 01:00,25,40\n2026-02-01 02:00,16,40\n');
    const chk = await h.as('conservator').post(`/api/climate-files/${up.body.data.id}/check`, { mapping: MAPPING });
    expect(chk.body.data.check).toMatchObject({ goodRows: 2, badRows: 0, duplicates: 1 });
    // Accepting with a mapping other than the one checked: 409.
    expect((await h.as('conservator').post(`/api/climate-files/${up.body.data.id}/accept`, { mapping: { ...MAPPING, timeZone: 'Europe/London' } })).status).toBe(409);
    const acc = await h.as('conservator').post(`/api/climate-files/${up.body.data.id}/accept`, { mapping: MAPPING });
    expect(acc.status, JSON.stringify(acc.body)).toBe(200);
    expect(acc.body.data).toMatchObject({ status: 'accepted', acceptedRows: 1 });
    const [{ temperature_c: kept }] = await db().query<{ temperature_c: number }>(
      `SELECT temperature_c FROM climate_readings WHERE location_id = $1 AND taken_at = '2026-02-01T01:00:00Z'`, { bind: [room.id], type: QueryTypes.SELECT });
    expect(kept).toBe(16);
    const audit = await AuditEventModel.findOne({ where: { action: 'climate_file.accepted', entityId: up.body.data.id } });
    expect(audit?.after).toMatchObject({ readings: 2, written: 1, alreadyHeld: 1 });
    // An accepted file cannot be discarded or checked again.
    expect((await h.as('conservator').delete(`/api/climate-files/${up.body.data.id}`)).status).toBe(409);
    expect((await h.as('conservator').post(`/api/climate-files/${up.body.data.id}/check`, { mapping: MAPPING })).status).toBe(409);
    const files = (await h.as('researcher').get(`/api/locations/${room.id}/climate-files`)).body.data;
    expect(files.map((f: { status: string }) => f.status)).toEqual(['accepted', 'accepted']);
  });
});

describe('a file larger than one insert batch', () => {
  it('writes every reading across batches (INSERT_BATCH = 25,000)', async () => {
    const room = await createLocation();
    const start = Date.parse('2025-01-01T00:00:00Z');
    const rows = Array.from({ length: 30_001 }, (_, i) => `${new Date(start + i * 60_000).toISOString()},17.5,45`);
    const acc = await loaded(room.id, ['Time,Temp °C,RH %', ...rows].join('\n'));
    expect(acc.acceptedRows).toBe(30_001);
    expect(await held(room.id)).toBe(30_001);
  });
});

describe('figures of a location', () => {
  it('summary over a small file, worked by hand', async () => {
    const room = await createLocation();
    // Hourly; 2–18 °C and 30–50 % are the default targets (DEFAULT_CLIMATE_SETTINGS, REFERENCES.md §5).
    await loaded(room.id, [
      'Time,Temp °C,RH %',
      '2026-03-01 00:00,16,45', '2026-03-01 01:00,20,45', '2026-03-01 02:00,16,55', '2026-03-01 03:00,16,45',
      // 03:00 → 08:00 is 300 minutes, past the 180-minute gap setting.
      '2026-03-01 08:00,16,45', '2026-03-01 09:00,16,45',
    ].join('\n'));
    const res = await h.as('researcher').get(`/api/locations/${room.id}/climate?from=2026-03-01&to=2026-03-01`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const s = res.body.data;
    // Spans of 60 min from 00, 01 and 02 (180) and from 08 (60) = 240 min; 03 → 08 is the gap, 09 is the last.
    expect(s.coveredMinutes).toBe(240);
    expect(s.gaps).toEqual([{ start: '2026-03-01T03:00:00.000Z', end: '2026-03-01T08:00:00.000Z', minutes: 300 }]);
    // Too warm 01–02 (60 min), too damp 02–03 (60 min): 60/240 each, 120/240 either.
    expect([s.outsideTemperature, s.outsideRh, s.outsideEither]).toEqual([0.25, 0.25, 0.5]);
    // Mean of six readings: (16 × 5 + 20)/6 = 100/6 °C; RH (45 × 5 + 55)/6 = 280/6.
    expect(s.temperature.mean).toBeCloseTo(100 / 6, 5);
    expect(s.rh.mean).toBeCloseTo(280 / 6, 5);
    expect(s.excursions.map((e: { quantity: string; minutes: number; peak: number; brief: boolean }) => [e.quantity, e.minutes, e.peak, e.brief]))
      .toEqual([['temperature', 60, 20, false], ['rh', 60, 55, false]]);
    expect(s.settings).toMatchObject({ activationEnergyKjMol: 83.68, rhExponent: 1, reference: { temperatureC: 20, rhPercent: 50 } });
    expect(s.permanence).toBeGreaterThan(1);

    const series = (await h.as('researcher').get(`/api/locations/${room.id}/climate/series?from=2026-03-01&to=2026-03-01`)).body.data;
    // One day = 1,440 min; 1,000 points at most → buckets of 2 min; one point per reading.
    expect(series.bucketMinutes).toBe(2);
    expect(series.points).toHaveLength(6);
    expect(series.points[1]).toMatchObject({ at: '2026-03-01T01:00:00.000Z', temperatureC: 20, temperatureMaxC: 20 });

    const rooms = (await h.as('researcher').get('/api/climate/rooms?from=2026-03-01&to=2026-03-01')).body.data;
    expect(rooms.find((r: { locationId: string }) => r.locationId === room.id)).toMatchObject({ readings: 6, outsideEither: 0.5, excursions: 2 });
  });
});

describe('roles and bad input', () => {
  it('researchers read, registrars cannot upload, viewers cannot read; settings change only for administrators', async () => {
    const room = await createLocation();
    expect((await h.as('researcher').get(`/api/locations/${room.id}/climate`)).status).toBe(200);
    expect((await h.as('viewer').get(`/api/locations/${room.id}/climate`)).status).toBe(403);
    expect((await h.as('viewer').get('/api/climate/rooms')).status).toBe(403);
    const reg = await upload(room.id, 'Time,Temp °C,RH %\n2026-01-01 00:00,17,45\n', 'registrar');
    expect(reg.status).toBe(403);
    expect(reg.body.error.code).toBe('forbidden');
    expect((await h.as('researcher').get('/api/settings/climate')).body.data.gapMinutes).toBe(180);
    const settings = (await h.as('admin').get('/api/settings/climate')).body.data;
    expect((await h.as('conservator').put('/api/settings/climate', settings)).status).toBe(403);
    const bad = await h.as('admin').put('/api/settings/climate', { ...settings, target: { ...settings.target, temperatureMaxC: 1 } });
    expect(bad.status).toBe(400);
  });

  it('NUL, broken UTF-8, huge numbers, impossible dates and unknown ids give a 4xx in the envelope', async () => {
    const room = await createLocation();
    const nul = await upload(room.id, Buffer.from('Time,Temp °C,RH %\n2026-01-01 00:00,17\u0000,45\n', 'utf8'));
    expect(nul.status).toBe(415);
    expect((await upload(room.id, Buffer.from([0x54, 0x69, 0xff, 0x0a]))).status).toBe(415);
    expect((await upload(room.id, 'Time,Temp °C,RH %\n')).status).toBe(400);
    const up = await upload(room.id, 'Time,Temp °C,RH %\n2026-02-30 00:00,17,45\n2026-01-01 01:00,1e308,45\n2026-01-01 02:00,99999999999,45\n');
    const chk = (await h.as('conservator').post(`/api/climate-files/${up.body.data.id}/check`, { mapping: MAPPING })).body.data.check;
    expect(chk.problems.map((p: { row: number; column: string }) => [p.row, p.column])).toEqual([[2, 'Time'], [3, 'Temp °C'], [4, 'Temp °C']]);
    const withNul = await h.as('conservator').post(`/api/climate-files/${up.body.data.id}/check`, { mapping: { ...MAPPING, timeZone: 'UTC\u0000' } });
    expect(withNul.status).toBe(400);
    expect((await h.as('researcher').get(`/api/locations/${room.id}/climate?from=2026-02-30`)).status).toBe(400);
    expect((await h.as('researcher').get(`/api/locations/${room.id}/climate?from=2026-03-02&to=2026-03-01`)).status).toBe(400);
    const missing = await h.as('researcher').get('/api/locations/00000000-0000-4000-8000-000000000000/climate');
    expect(missing.status).toBe(404);
    expect(missing.body.error).toMatchObject({ code: 'not_found' });
  });
});
