import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { periodExposure } from '@toneledger/common/domain/light-dose';
import { testApp } from '../../../test/app';
import { exhibitionClient, paths } from '../../../test/exhibition-helpers';
import { AuditEventModel } from '../../models';
import { db } from '../../db';

const t = testApp();
let h: Awaited<ReturnType<typeof exhibitionClient>>;

beforeAll(async () => {
  h = await exhibitionClient(t);
});
afterAll(() => t.close());

const TOUR = [
  { name: 'Calder Reach, East Gallery', place: 'Calder Reach', opensOn: '2025-03-01', closesOn: '2025-05-31' },
  { name: 'Lower Fenwick Arts Hall', place: 'Lower Fenwick', opensOn: '2025-07-01', closesOn: '2025-09-30' },
];

describe('exhibitions', () => {
  it('a registrar records a touring show with its venues; every role reads it; a conservator cannot create one', async () => {
    const e = await h.newExhibition(TOUR, 'Blue on silver: toned prints 1920–1960');
    expect(e.venues.map((v) => v.name)).toEqual(TOUR.map((v) => v.name));
    expect(e).toMatchObject({ opensOn: '2025-03-01', closesOn: '2025-09-30', objectCount: 0, version: 1 });
    for (const who of ['viewer', 'researcher', 'conservator'] as const) {
      expect((await h.as(who).get(`/api/exhibitions/${e.id}`)).status).toBe(200);
    }
    const list = await h.as('viewer').get('/api/exhibitions?q=toned%20prints&when=past');
    expect(list.status).toBe(200);
    expect(list.body.data.map((x: { id: string }) => x.id)).toContain(e.id);
    expect((await h.as('viewer').get('/api/exhibitions?q=toned%20prints&when=coming')).body.data.map((x: { id: string }) => x.id)).not.toContain(e.id);
    expect((await h.as('conservator').post('/api/exhibitions', { title: 'x', venues: TOUR })).status).toBe(403);
    expect((await h.as(null).get('/api/exhibitions')).status).toBe(401);
    const audit = await AuditEventModel.findOne({ where: { entityId: e.id, action: 'exhibition.created' } });
    expect(audit).not.toBeNull();
  });

  it('edits keep venue ids, refuse a stale version with 409 and the current record, and refuse a venue closing before it opens (400, field named)', async () => {
    const e = await h.newExhibition(TOUR);
    const venues = [{ ...TOUR[0], id: e.venues[0].id, closesOn: '2025-06-15' }, { name: 'Harrowgate Print Room', opensOn: '2025-10-01', closesOn: '2025-12-01' }];
    const ok = await h.as('registrar').patch(`/api/exhibitions/${e.id}`, { title: 'Renamed', venues, version: 1 });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body.data.venues[0].id).toBe(e.venues[0].id);
    expect(ok.body.data.venues.map((v: { name: string }) => v.name)).toEqual([TOUR[0].name, 'Harrowgate Print Room']);
    expect(ok.body.data).toMatchObject({ title: 'Renamed', version: 2, closesOn: '2025-12-01' });
    const stale = await h.as('registrar').patch(`/api/exhibitions/${e.id}`, { title: 'Older edit', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current.title).toBe('Renamed');
    const bad = await h.as('registrar').patch(`/api/exhibitions/${e.id}`, { venues: [{ name: 'Backwards', opensOn: '2025-05-01', closesOn: '2025-04-01' }], version: 2 });
    expect(bad.status).toBe(400);
    expect(paths(bad)).toContain('venues.0.closesOn');
  });

  it('an exhibition with display periods cannot be deleted (409); without them it can', async () => {
    const e = await h.newExhibition(TOUR);
    const p = await h.newPrint();
    await h.addObjects(e, [p.id]);
    const d = await h.display(e.id, { printId: p.id, startsOn: '2025-03-01', endsOn: '2025-03-10', lux: 50, hoursPerDay: 8 });
    const version = (await h.as('registrar').get(`/api/exhibitions/${e.id}`)).body.data.version;
    const refused = await h.as('registrar').delete(`/api/exhibitions/${e.id}?version=${version}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/1 display period/);
    expect((await h.as('registrar').delete(`/api/displays/${d.id}?version=${d.version}`)).status).toBe(200);
    expect((await h.as('registrar').delete(`/api/exhibitions/${e.id}?version=${version}`)).status).toBe(200);
    expect((await h.as('registrar').get(`/api/exhibitions/${e.id}`)).status).toBe(404);
  });

  it('the list read while exhibitions are being deleted answers 200 with whole exhibitions (one snapshot), never an exhibition without its venues', async () => {
    const statuses: number[] = [];
    const bad: unknown[] = [];
    for (let round = 0; round < 10; round += 1) {
      const made = await Promise.all(Array.from({ length: 8 }, () => h.newExhibition(TOUR, 'Snapshot race')));
      const lists = Array.from({ length: 8 }, () => h.as('viewer').get('/api/exhibitions?q=Snapshot%20race&pageSize=100'));
      const deletes = made.map((e) => h.as('registrar').delete(`/api/exhibitions/${e.id}?version=${e.version}`));
      for (const res of await Promise.all(lists)) {
        statuses.push(res.status);
        for (const x of res.body.data ?? []) if (!x.venues?.length || !x.opensOn) bad.push(x);
      }
      expect((await Promise.all(deletes)).map((r) => r.status)).toEqual(made.map(() => 200));
    }
    expect(statuses.filter((s) => s !== 200)).toEqual([]);
    expect(bad).toEqual([]);
  });

  it('the object list CSV has one row per display period with its lux-hours', async () => {
    const e = await h.newExhibition(TOUR, '=Checklist show');
    const p = await h.newPrint();
    await h.addObjects(e, [p.id]);
    // 50 lx × 8 h × 10 days (1–10 March 2025, every day open) = 4,000 lx·h.
    await h.display(e.id, { printId: p.id, venueId: e.venues[0].id, startsOn: '2025-03-01', endsOn: '2025-03-10', lux: 50, hoursPerDay: 8, caseOrFrame: '=frame' });
    const res = await h.as('viewer').get(`/api/exhibitions/${e.id}/objects.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const lines = res.text.trim().split(/\r?\n/);
    expect(lines[0]).toMatch(/^accession_number,title,light_responsivity,approval/);
    expect(lines).toHaveLength(2);
    expect(lines[1]).toContain(`${p.accessionNumber},`);
    expect(lines[1]).toContain(',4000,4000,');
    expect(lines[1]).toContain("'=frame");
  });
});

describe('display periods', () => {
  it('refuses end before start, negative lux and 25 hours a day, naming the field (400)', async () => {
    const e = await h.newExhibition(TOUR);
    const p = await h.newPrint();
    await h.addObjects(e, [p.id]);
    const base = { printId: p.id, startsOn: '2025-03-10', endsOn: '2025-03-20', lux: 50, hoursPerDay: 8 };
    for (const [body, field] of [
      [{ ...base, endsOn: '2025-03-09' }, 'endsOn'],
      [{ ...base, lux: -1 }, 'lux'],
      [{ ...base, hoursPerDay: 25 }, 'hoursPerDay'],
      [{ ...base, daysOpen: [1, 1] }, 'daysOpen'],
    ] as const) {
      const res = await h.as('registrar').post(`/api/exhibitions/${e.id}/displays`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(paths(res)).toContain(field);
    }
  });

  it('a display at a venue lies within its dates (400 naming the field)', async () => {
    const e = await h.newExhibition(TOUR);
    const p = await h.newPrint();
    await h.addObjects(e, [p.id]);
    const early = await h.as('registrar').post(`/api/exhibitions/${e.id}/displays`, { printId: p.id, venueId: e.venues[0].id, startsOn: '2025-02-20', endsOn: '2025-03-05', lux: 50, hoursPerDay: 8 });
    expect(early.status).toBe(400);
    expect(paths(early)).toEqual(['startsOn']);
    const late = await h.as('registrar').post(`/api/exhibitions/${e.id}/displays`, { printId: p.id, venueId: e.venues[1].id, startsOn: '2025-09-20', endsOn: '2025-10-05', lux: 50, hoursPerDay: 8 });
    expect(late.status).toBe(400);
    expect(paths(late)).toEqual(['endsOn']);
  });

  it('needs the print on the object list, and refuses a print a conservator refused (409)', async () => {
    const e = await h.newExhibition(TOUR);
    const [p, q] = [await h.newPrint(), await h.newPrint()];
    const body = (printId: string) => ({ printId, startsOn: '2025-03-10', endsOn: '2025-03-20', lux: 50, hoursPerDay: 8 });
    expect((await h.as('registrar').post(`/api/exhibitions/${e.id}/displays`, body(p.id))).status).toBe(409);
    await h.addObjects(e, [q.id]);
    const refuse = await h.as('conservator').put(`/api/exhibitions/${e.id}/objects/${q.id}/approval`, { decision: 'refused', reason: 'Iron blue has faded at the edges; rest it' });
    expect(refuse.status).toBe(200);
    const res = await h.as('registrar').post(`/api/exhibitions/${e.id}/displays`, body(q.id));
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/refused/);
  });

  it('refuses a period overlapping another of the same print, naming the other exhibition and its dates', async () => {
    const [a, b] = [await h.newExhibition(TOUR, 'Harbour light'), await h.newExhibition(TOUR, 'Tide tables')];
    const p = await h.newPrint();
    await h.addObjects(a, [p.id]);
    await h.addObjects(b, [p.id]);
    await h.display(a.id, { printId: p.id, startsOn: '2025-03-01', endsOn: '2025-03-31', lux: 50, hoursPerDay: 8 });
    const res = await h.as('registrar').post(`/api/exhibitions/${b.id}/displays`, { printId: p.id, startsOn: '2025-03-31', endsOn: '2025-04-10', lux: 50, hoursPerDay: 8 });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe('The print is already on display in “Harbour light” from 2025-03-01 to 2025-03-31; a print can be in one display at a time.');
    // The day after the other ends does not overlap (both ends are days on display).
    await h.display(b.id, { printId: p.id, startsOn: '2025-04-01', endsOn: '2025-04-10', lux: 50, hoursPerDay: 8 });
    // An edit into the other period is refused the same way.
    const mine = (await h.as('registrar').get(`/api/exhibitions/${b.id}`)).body.data.objects[0].displays[0];
    const edit = await h.as('registrar').patch(`/api/displays/${mine.id}`, { startsOn: '2025-03-25', version: mine.version });
    expect(edit.status).toBe(409);
    expect(edit.body.error.message).toMatch(/“Harbour light” from 2025-03-01 to 2025-03-31/);
  });

  it('two overlapping periods sent at the same moment: one is saved, the other is refused with 409, and the database refuses one written past the service', async () => {
    const [a, b] = [await h.newExhibition(TOUR, 'Night rooms'), await h.newExhibition(TOUR, 'Day rooms')];
    const p = await h.newPrint();
    await h.addObjects(a, [p.id]);
    await h.addObjects(b, [p.id]);
    const body = { printId: p.id, startsOn: '2025-05-01', endsOn: '2025-05-20', lux: 50, hoursPerDay: 8 };
    const answers = await Promise.all([a, b, a, b].map((e) => h.as('registrar').post(`/api/exhibitions/${e.id}/displays`, body)));
    expect(answers.map((r) => r.status).sort()).toEqual([201, 409, 409, 409]);
    for (const r of answers.filter((x) => x.status === 409)) expect(r.body.error.message).toMatch(/already on display/);
    // The exclusion constraint itself (daterange '[]' && with btree_gist), written past the service:
    await expect(db().query(
      `INSERT INTO display_periods (print_id, exhibition_id, starts_on, ends_on, lux, hours_per_day) VALUES ($1, $2, '2025-05-20', '2025-05-25', 50, 8)`,
      { bind: [p.id, a.id] },
    )).rejects.toMatchObject({ parent: { code: '23P01' } });
  });

  it('a stale edit of a display period is 409 with the current period; a conservator records the conditions', async () => {
    const e = await h.newExhibition(TOUR);
    const p = await h.newPrint();
    await h.addObjects(e, [p.id]);
    const d = await h.display(e.id, { printId: p.id, startsOn: '2025-03-01', endsOn: '2025-03-10', lux: 50, hoursPerDay: 8 });
    const ok = await h.as('conservator').patch(`/api/displays/${d.id}`, { lux: 45, uvMicrowattsPerLumen: 10, mountNotes: 'Window mat, unbuffered board', version: d.version });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    // 45 lx × 8 h × 10 days = 3,600 lx·h.
    expect(ok.body.data).toMatchObject({ lux: 45, uvMicrowattsPerLumen: 10, luxHours: 3600, version: 2 });
    const stale = await h.as('registrar').patch(`/api/displays/${d.id}`, { lux: 60, version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current.lux).toBe(45);
    expect((await h.as('viewer').patch(`/api/displays/${d.id}`, { lux: 60, version: 2 })).status).toBe(403);
  });

  it('lux-hours of a period with closed weekdays and a holiday: 30 lx × 7.5 h × 9 days = 2,025 lx·h, as the pure module sums it', async () => {
    const e = await h.newExhibition(TOUR);
    const p = await h.newPrint();
    await h.addObjects(e, [p.id]);
    // 2 March 2025 is a Sunday; use 3–16 March 2025 (Monday to Sunday, 14 days), open Tuesday to Saturday
    // (10 days), closed on Friday 7 March: 9 open days.
    const body = { printId: p.id, startsOn: '2025-03-03', endsOn: '2025-03-16', lux: 30, hoursPerDay: 7.5, daysOpen: [2, 3, 4, 5, 6], closedDates: ['2025-03-07'] };
    const d = await h.display(e.id, body);
    expect(d.luxHours).toBe(2025);
    expect(d.luxHours).toBe(periodExposure({ start: body.startsOn, end: body.endsOn, lux: 30, hoursPerDay: 7.5, daysOpen: body.daysOpen, closedDates: body.closedDates }));
  });
});

describe('approval for display', () => {
  it('conservators approve or refuse (a reason is required to refuse); registrars cannot; every decision is audited; a change of the light after approval asks again', async () => {
    const e = await h.newExhibition(TOUR);
    const p = await h.newPrint();
    await h.addObjects(e, [p.id]);
    const url = `/api/exhibitions/${e.id}/objects/${p.id}/approval`;
    expect((await h.as('registrar').put(url, { decision: 'approved' })).status).toBe(403);
    const noReason = await h.as('conservator').put(url, { decision: 'refused', reason: '  ' });
    expect(noReason.status).toBe(400);
    expect(paths(noReason)).toEqual(['reason']);
    const ok = await h.as('conservator').put(url, { decision: 'approved' });
    expect(ok.status).toBe(200);
    expect(ok.body.data.objects[0]).toMatchObject({ approval: 'approved', approvedBy: { name: expect.any(String) } });
    const audit = await AuditEventModel.findOne({ where: { entityId: e.id, action: 'exhibition.object_approved' } });
    expect(audit?.after).toMatchObject({ printId: p.id, approval: 'approved' });

    const d = await h.display(e.id, { printId: p.id, startsOn: '2025-03-01', endsOn: '2025-03-10', lux: 50, hoursPerDay: 8 });
    const after = (await h.as('registrar').get(`/api/exhibitions/${e.id}`)).body.data.objects[0];
    expect(after.approval).toBe('pending');
    expect(await AuditEventModel.findOne({ where: { entityId: e.id, action: 'exhibition.approval_reopened' } })).not.toBeNull();

    await h.as('conservator').put(url, { decision: 'approved' });
    // Notes do not change the light: approval stays.
    const notes = await h.as('registrar').patch(`/api/displays/${d.id}`, { mountNotes: 'Sink mat', version: d.version });
    expect(notes.status).toBe(200);
    expect((await h.as('registrar').get(`/api/exhibitions/${e.id}`)).body.data.objects[0].approval).toBe('approved');
    // A refusal of a print with display periods is a 409 until they are deleted.
    expect((await h.as('conservator').put(url, { decision: 'refused', reason: 'Too faded' })).status).toBe(409);
  });

  it('taking a print off the list takes its display periods with it', async () => {
    const e = await h.newExhibition(TOUR);
    const p = await h.newPrint();
    await h.addObjects(e, [p.id]);
    await h.display(e.id, { printId: p.id, startsOn: '2025-03-01', endsOn: '2025-03-10', lux: 50, hoursPerDay: 8 });
    const version = (await h.as('registrar').get(`/api/exhibitions/${e.id}`)).body.data.version;
    const res = await h.as('registrar').delete(`/api/exhibitions/${e.id}/objects/${p.id}?version=${version}`);
    expect(res.status).toBe(200);
    expect(res.body.data.objects).toEqual([]);
    const [{ n }] = (await db().query(`SELECT count(*)::int AS n FROM display_periods WHERE print_id = $1`, { bind: [p.id] }))[0] as { n: number }[];
    expect(n).toBe(0);
  });
});
