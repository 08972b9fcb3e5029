import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { DateTime } from 'luxon';
import { testApp } from '../../../test/app';
import { daysFromToday, exhibitionClient, paths } from '../../../test/exhibition-helpers';
import { AuditEventModel, Setting, User } from '../../models';
import { accession, createLocation } from '../../../test/factories';
import { db } from '../../db';
import { settleScheduleRecompute, settleSchedules } from '../../services/schedule-jobs';

const t = testApp();
let h: Awaited<ReturnType<typeof exhibitionClient>>;

beforeAll(async () => {
  h = await exhibitionClient(t);
});
afterAll(() => t.close());

/** A calendar date n months after a day, by luxon (a general-purpose date library), not the model's own helper. */
const monthsAfter = (day: string, n: number) => DateTime.fromISO(day, { zone: 'utc' }).plus({ months: n }).toISODate();
const daysBefore = (day: string, n: number) => DateTime.fromISO(day, { zone: 'utc' }).minus({ days: n }).toISODate();

async function schedule(printId: string, who: Parameters<typeof h.as>[0] = 'conservator') {
  const res = await h.as(who).get(`/api/prints/${printId}/inspection`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.data as { dueOn: string; computedDueOn: string; intervalMonths: number; risk: string; factors: { code: string; text: string; months: number | null; dueBy: string | null }[]; explanation: string; lastCheckedOn: string | null; version: number; override: unknown };
}

async function signReport(printId: string, grade: string, examinedOn: string) {
  const draft = await h.as('conservator').post(`/api/prints/${printId}/condition-reports`, { examinedOn, context: 'routine', grade });
  expect(draft.status, JSON.stringify(draft.body)).toBe(201);
  const signed = await h.as('conservator').post(`/api/condition-reports/${draft.body.data.id}/sign`, { version: draft.body.data.version });
  expect(signed.status, JSON.stringify(signed.body)).toBe(200);
}

describe("a print's next inspection", () => {
  it('is computed on first asking; a signed report moves it, as the model says', async () => {
    const p = await h.newPrint();
    const first = await schedule(p.id, 'researcher');
    // Never checked: 60 − 36 = 24 months from the day it was recorded (today).
    expect(first.lastCheckedOn).toBeNull();
    expect(first.factors.map((f) => f.code)).toEqual(['never_checked']);
    expect(first.dueOn).toBe(monthsAfter(daysFromToday(0), 24));
    expect(first.explanation).toBe(`due ${first.dueOn.slice(0, 7)}: never checked (−36 months)`);

    await signReport(p.id, 'fair', '2025-03-14');
    await settleSchedules();
    const after = await schedule(p.id);
    // Checked 2025-03-14, graded fair: 60 − 12 = 48 months → 2029-03-14.
    expect(after.lastCheckedOn).toBe('2025-03-14');
    expect(after.intervalMonths).toBe(48);
    expect(after.dueOn).toBe('2029-03-14');
    expect(after.factors).toEqual([{ code: 'condition', text: 'last graded fair', months: -12, dueBy: null }]);
    expect(after.version).toBe(first.version + 1);
    const [mark] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM schedule_stale WHERE print_id = $1', { bind: [p.id], type: QueryTypes.SELECT });
    expect(mark!.n).toBe(0);
  });

  it('a planned loan brings the date to six weeks before dispatch; cancelling it takes it away', async () => {
    const p = await h.newPrint();
    await signReport(p.id, 'good', daysFromToday(-30));
    await settleSchedules();
    const dispatchOn = daysFromToday(200);
    const loan = await h.as('registrar').post('/api/loans', {
      direction: 'out', reference: `SCH-${Math.random().toString(36).slice(2, 8)}`, otherInstitution: 'Hollin Gallery', purpose: 'exhibition',
      dispatchOn, opensOn: daysFromToday(210), closesOn: daysFromToday(300), returnOn: daysFromToday(310),
    });
    expect(loan.status, JSON.stringify(loan.body)).toBe(201);
    const withPrint = await h.as('registrar').put(`/api/loans/${loan.body.data.id}/objects`, { objects: [{ printId: p.id }], version: loan.body.data.version });
    expect(withPrint.status, JSON.stringify(withPrint.body)).toBe(200);
    await settleSchedules();
    const s = await schedule(p.id);
    expect(s.dueOn).toBe(daysBefore(dispatchOn, 42));
    expect(s.factors[0]).toMatchObject({ code: 'loan', months: null, dueBy: daysBefore(dispatchOn, 42), text: `loan to Hollin Gallery on ${dispatchOn.slice(0, 7)}` });

    const cancel = await h.as('registrar').post(`/api/loans/${loan.body.data.id}/status`, { to: 'cancelled', version: withPrint.body.data.version });
    expect(cancel.status, JSON.stringify(cancel.body)).toBe(200);
    await settleSchedules();
    const back = await schedule(p.id);
    expect(back.factors.map((f) => f.code)).toEqual([]);
    expect(back.dueOn).toBe(monthsAfter(daysFromToday(-30), 60));
  });

  it('an iron-blue toned print put in a buffered enclosure is due before a plain print, with both reasons in its words', async () => {
    const enc = await h.as('registrar').post('/api/enclosures', { name: `Buffered folder ${Math.random().toString(36).slice(2, 6)}`, alkalineBuffered: true, patResult: 'passed' });
    expect(enc.status, JSON.stringify(enc.body)).toBe(201);
    const blue = await h.newPrint();
    const steps = await h.as('registrar').put(`/api/prints/${blue.id}/steps`, { version: blue.version, steps: [{ type: 'toning', tonerClass: 'iron_blue' }] });
    expect(steps.status, JSON.stringify(steps.body)).toBe(200);
    const housed = await h.as('registrar').patch(`/api/prints/${blue.id}`, { enclosureId: enc.body.data.id, version: steps.body.data.version });
    expect(housed.status, JSON.stringify(housed.body)).toBe(200);
    expect(housed.body.data.warnings.map((w: { code: string }) => w.code)).toContain('prussian_blue_in_buffered_enclosure');
    const plain = await h.newPrint();
    await settleSchedules();
    const b = await schedule(blue.id);
    const q = await schedule(plain.id);
    expect(b.dueOn < q.dueOn).toBe(true);
    expect(b.factors.map((f) => f.code)).toEqual(['never_checked', 'vulnerable_process', 'enclosure']);
    expect(b.explanation).toContain('iron-blue print in a buffered enclosure');
  });
});

describe('storage climate', () => {
  it('a warm room (25 °C, 50 % RH) shortens the interval of a print in a box inside it, by its isoperm permanence', async () => {
    const room = await createLocation();
    const box = await createLocation(undefined, room);
    const res = await h.as('registrar').post('/api/prints', { accessionNumber: accession(), title: 'Warm room print', process: 'gelatin_silver_developing_out', locationId: box.id });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const p = res.body.data;
    await signReport(p.id, 'good', daysFromToday(-5));
    // A logger in the room (not the box): two days of readings every 10 minutes at 25 °C / 50 % RH, written as an accepted file would be.
    const user = (await User.findOne({ where: { role: 'conservator' } }))!;
    const [[file]] = (await db().query(
      `INSERT INTO climate_files (location_id, file_name, status, uploaded_by, accepted_at) VALUES ($1, 'logger.csv', 'accepted', $2, now()) RETURNING id`,
      { bind: [room.id, user.id] },
    )) as unknown as [[{ id: string }]];
    await db().query(
      `INSERT INTO climate_readings (location_id, taken_at, temperature_c, rh_percent, file_id)
       SELECT $1, now() - interval '3 days' + g * interval '10 minutes', 25, 50, $2 FROM generate_series(0, 288) g`,
      { bind: [room.id, file.id] },
    );
    await h.as('registrar').patch(`/api/prints/${p.id}`, { title: 'Warm room print, read again', version: p.version });
    await settleSchedules();
    const s = await schedule(p.id);
    // REFERENCES.md §3: 25 °C / 50 % against 20 °C / 50 % at Ea 83.68 kJ/mol → permanence 0.562; 12 × log2(0.562) = −9.98 → −10 months.
    const climate = s.factors.find((f) => f.code === 'climate');
    expect(climate?.months).toBe(-10);
    expect(climate?.text).toMatch(/permanence 0\.6\)/);
    expect(s.intervalMonths).toBe(50);
    expect(s.dueOn).toBe(monthsAfter(daysFromToday(-5), 50));

    // An administrator raises the activation energy: the stores with readings are rescheduled without any other change.
    // REFERENCES.md §3: 25 °C / 50 % at Ea 104.6 kJ/mol → permanence 0.487; 12 × log2(0.487) = −12.46 → −12 months.
    const before = (await h.as('admin').get('/api/settings/climate')).body.data;
    const put = await h.as('admin').put('/api/settings/climate', { ...before, activationEnergyKjMol: 104.6 });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    try {
      await settleSchedules();
      const after = await schedule(p.id);
      expect(after.factors.find((f) => f.code === 'climate')?.months).toBe(-12);
      expect(after.intervalMonths).toBe(48);
    } finally {
      expect((await h.as('admin').put('/api/settings/climate', before)).status).toBe(200);
      await settleSchedules();
    }
  });
});

describe('override', () => {
  it('only conservators write (viewer 403 on reading too); researcher reads; audited; a stale version is 409; null returns to the computed date', async () => {
    const p = await h.newPrint();
    const s = await schedule(p.id);
    expect((await h.as('viewer').get(`/api/prints/${p.id}/inspection`)).status).toBe(403);
    expect((await h.as(null).get(`/api/prints/${p.id}/inspection`)).status).toBe(401);
    for (const who of ['viewer', 'researcher', 'registrar', 'admin'] as const) {
      const res = await h.as(who).put(`/api/prints/${p.id}/inspection-override`, { dueOn: '2027-01-10', reason: 'Mount lifting', version: s.version });
      expect(res.status, who).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    const set = await h.as('conservator').put(`/api/prints/${p.id}/inspection-override`, { dueOn: '2027-01-10', reason: 'Mount lifting at one corner', version: s.version });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body.data).toMatchObject({ dueOn: '2027-01-10', computedDueOn: s.computedDueOn, version: s.version + 1, override: { dueOn: '2027-01-10', reason: 'Mount lifting at one corner' } });
    const audit = await AuditEventModel.findOne({ where: { entityType: 'print_schedule', entityId: p.id, action: 'print_schedule.overridden' } });
    expect(audit?.after).toMatchObject({ overrideDueOn: '2027-01-10', reason: 'Mount lifting at one corner' });

    // A recompute keeps the override.
    await h.as('registrar').patch(`/api/prints/${p.id}`, { title: 'Retitled', version: p.version });
    await settleSchedules();
    expect((await schedule(p.id, 'researcher')).dueOn).toBe('2027-01-10');

    const stale = await h.as('conservator').put(`/api/prints/${p.id}/inspection-override`, { dueOn: '2027-02-01', reason: 'Later', version: s.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current.dueOn).toBe('2027-01-10');

    const current = await schedule(p.id);
    const cleared = await h.as('conservator').put(`/api/prints/${p.id}/inspection-override`, { dueOn: null, version: current.version });
    expect(cleared.status, JSON.stringify(cleared.body)).toBe(200);
    expect(cleared.body.data).toMatchObject({ dueOn: current.computedDueOn, override: null });
  });

  it('bad input is a 4xx in the envelope', async () => {
    const p = await h.newPrint();
    const s = await schedule(p.id);
    const noReason = await h.as('conservator').put(`/api/prints/${p.id}/inspection-override`, { dueOn: '2027-01-10', version: s.version });
    expect(noReason.status).toBe(400);
    expect(paths(noReason)).toContain('reason');
    const badDay = await h.as('conservator').put(`/api/prints/${p.id}/inspection-override`, { dueOn: '2027-02-30', reason: 'x', version: s.version });
    expect(badDay.status).toBe(400);
    expect(paths(badDay)).toContain('dueOn');
    const noVersion = await h.as('conservator').put(`/api/prints/${p.id}/inspection-override`, { dueOn: null });
    expect(noVersion.status).toBe(400);
    const unknown = await h.as('conservator').put('/api/prints/00000000-0000-4000-8000-00000000000f/inspection-override', { dueOn: null, version: 1 });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('not_found');
    expect((await h.as('researcher').get('/api/prints/00000000-0000-4000-8000-00000000000f/inspection')).status).toBe(404);
    expect((await h.as('researcher').get('/api/prints/not-a-uuid/inspection')).status).toBe(400);
  });
});

describe('full recompute', () => {
  it('runs every print once, reports progress with a rate; 409 while one runs; conservators only', async () => {
    await h.newPrint();
    expect((await h.as('registrar').post('/api/inspections/recompute')).status).toBe(403);
    const start = await h.as('conservator').post('/api/inspections/recompute');
    expect(start.status, JSON.stringify(start.body)).toBe(202);
    expect(start.body.data.status).toBe('running');
    await settleScheduleRecompute();
    const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM prints', { type: QueryTypes.SELECT });
    // Every print is walked; every one but a deaccessioned print (no longer inspected) has its date.
    const [{ m, kept }] = await db().query<{ m: number; kept: number }>(
      "SELECT count(*) FILTER (WHERE EXISTS (SELECT 1 FROM print_schedules s WHERE s.print_id = p.id))::int AS m, count(*) FILTER (WHERE p.status <> 'deaccessioned')::int AS kept FROM prints p",
      { type: QueryTypes.SELECT },
    );
    expect(m).toBe(kept);
    const progress = (await h.as('researcher').get('/api/inspections/recompute')).body.data;
    expect(progress).toMatchObject({ status: 'done', done: n, total: n });
    expect(progress.finishedAt).not.toBeNull();

    // While one runs (a server stopped mid-way leaves it so), a second start is refused.
    const row = await Setting.findByPk('schedule-recompute');
    await row!.update({ value: { ...(row!.value as object), status: 'running', finishedAt: null } });
    const again = await h.as('conservator').post('/api/inspections/recompute');
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('conflict');
    await row!.update({ value: { ...(row!.value as object), status: 'done', finishedAt: new Date().toISOString() } });
  });
});
