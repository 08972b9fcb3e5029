import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import ICAL from 'ical.js';
import { QueryTypes } from 'sequelize';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { testApp, sessionFor } from '../../../test/app';
import { accession, createUser } from '../../../test/factories';
import { db } from '../../db';

const t = testApp();
const c = {} as Record<Role, string>;
let conservatorId: string;

beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
  conservatorId = (await supertest(t.app).get('/api/me').set('Cookie', c.conservator)).body.data.id;
});
afterAll(() => t.close());

const as = (who: Role | null) => {
  const withCookie = <R extends supertest.Test>(r: R) => (who ? r.set('Cookie', c[who]) : r);
  return {
    get: (url: string) => withCookie(supertest(t.app).get(url)),
    post: (url: string, body: object = {}) => withCookie(supertest(t.app).post(url).set('Origin', t.origin)).send(body),
    put: (url: string, body: object) => withCookie(supertest(t.app).put(url).set('Origin', t.origin)).send(body),
    del: (url: string) => withCookie(supertest(t.app).delete(url).set('Origin', t.origin)),
  };
};

async function newPrint(title: string) {
  const res = await as('registrar').post('/api/prints', { accessionNumber: accession(), title, process: 'gelatin_silver_developing_out' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; accessionNumber: string };
}

/** A planned round straight in SQL (the rounds screens are built elsewhere). */
async function insertRound(assigneeId: string, plannedOn: string, title: string, printIds: string[], status = 'planned') {
  const [row] = await db().query<{ id: string }>(
    `INSERT INTO inspection_rounds (title, planned_on, assignee_id, created_by, status, updated_at) VALUES ($1, $2, $3, $3, $4, now() - interval '1 hour') RETURNING id`,
    { bind: [title, plannedOn, assigneeId, status], type: QueryTypes.SELECT },
  );
  for (const [i, printId] of printIds.entries()) {
    await db().query('INSERT INTO inspection_round_items (round_id, print_id, position) VALUES ($1, $2, $3)', { bind: [row!.id, printId, i] });
  }
  return row!.id;
}

const feedPath = (url: string) => new URL(url).pathname;

/** Parsed with ical.js, a general-purpose iCalendar parser. */
function parse(text: string) {
  return new ICAL.Component(ICAL.parse(text));
}

describe('calendar feed (RFC 5545)', () => {
  it('makes an address once, serves the planned rounds of its owner, and is valid iCalendar', async () => {
    const a = await newPrint('Harbour wall under fog, with a long title that runs well past seventy-five octets — “selenium” ΔE');
    const b = await newPrint('Kelp drying on stones');
    const roundId = await insertRound(conservatorId, '2031-05-12', 'North store, shelf run C — quarterly look at the iron-blue prints', [a.id, b.id]);
    const cancelledId = await insertRound(conservatorId, '2031-05-13', 'Cancelled round', [a.id], 'cancelled');
    const other = await createUser({ role: 'conservator' });
    const othersId = await insertRound(other.id, '2031-05-14', "Someone else's round", [b.id]);

    const made = await as('conservator').post('/api/me/calendar-feed');
    expect(made.status).toBe(201);
    const url: string = made.body.data.url;
    // 32 random bytes in base64url are 43 characters (RFC 4648 §5).
    expect(url).toMatch(/^http:\/\/[^/]+\/api\/calendar\/[A-Za-z0-9_-]{43}\.ics$/);
    const token = url.match(/calendar\/([^.]+)\.ics$/)![1]!;
    // Only the SHA-256 is kept.
    const [stored] = await db().query<{ calendar_token_sha256: string }>('SELECT calendar_token_sha256 FROM reminder_preferences WHERE user_id = $1', { bind: [conservatorId], type: QueryTypes.SELECT });
    expect(stored!.calendar_token_sha256).not.toContain(token);
    const { createHash } = await import('node:crypto');
    expect(stored!.calendar_token_sha256).toBe(createHash('sha256').update(token).digest('hex'));
    // The address is not shown again.
    const mine = await as('conservator').get('/api/me/reminders');
    expect(JSON.stringify(mine.body)).not.toContain(token);
    expect(mine.body.data.calendarFeed.createdAt).toBe(made.body.data.createdAt);

    const res = await supertest(t.app).get(feedPath(url)).buffer(true).parse((r, cb) => { let s = ''; r.setEncoding('utf8'); r.on('data', (d: string) => (s += d)); r.on('end', () => cb(null, s)); });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/calendar; charset=utf-8');
    const text = res.body as string;

    // RFC 5545 §3.1: lines end with CRLF and are at most 75 octets long, excluding the line break.
    expect(text.endsWith('\r\n')).toBe(true);
    const lines = text.split('\r\n').slice(0, -1);
    expect(text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
    for (const line of lines) expect(Buffer.byteLength(line, 'utf8'), line).toBeLessThanOrEqual(75);
    expect(lines.some((l) => l.startsWith(' '))).toBe(true); // the long title was folded

    const cal = parse(text);
    expect(cal.name).toBe('vcalendar');
    expect(cal.getFirstPropertyValue('version')).toBe('2.0');
    expect(String(cal.getFirstPropertyValue('prodid'))).toContain('Toneledger');
    const events = cal.getAllSubcomponents('vevent');
    const uids = events.map((e) => String(e.getFirstPropertyValue('uid')));
    expect(uids.some((u) => u.includes(roundId))).toBe(true);
    expect(uids.some((u) => u.includes(cancelledId))).toBe(false);
    expect(uids.some((u) => u.includes(othersId))).toBe(false);
    for (const e of events) {
      expect(e.getFirstPropertyValue('uid')).toBeTruthy();
      expect(e.getFirstPropertyValue('dtstamp')).toBeTruthy();
    }
    const ev = new ICAL.Event(events.find((e) => String(e.getFirstPropertyValue('uid')).includes(roundId))!);
    expect(ev.summary).toContain('North store, shelf run C — quarterly look at the iron-blue prints');
    // All day: a DATE value (no time, no zone) on the planned day.
    expect(ev.startDate.isDate).toBe(true);
    expect(ev.startDate.toString()).toBe('2031-05-12');
    expect(ev.description).toContain(a.accessionNumber);
    expect(ev.description).toContain(b.accessionNumber);
    expect(ev.description).toContain(`/catalogue/prints/${a.id}`);
    expect(ev.description).toContain(`/inspections/rounds/${roundId}`);
    expect(ev.sequence).toBe(0);
  });

  it('raises SEQUENCE and DTSTAMP when the round changes, keeping the UID', async () => {
    const p = await newPrint('Gull on a post');
    const roundId = await insertRound(conservatorId, '2031-06-02', 'Sequence check', [p.id]);
    const url = (await as('conservator').post('/api/me/calendar-feed')).body.data.url as string;
    const read = async () => {
      const text = (await supertest(t.app).get(feedPath(url))).text;
      const e = parse(text).getAllSubcomponents('vevent').find((x) => String(x.getFirstPropertyValue('uid')).includes(roundId))!;
      return { uid: String(e.getFirstPropertyValue('uid')), seq: Number(e.getFirstPropertyValue('sequence')), stamp: e.getFirstPropertyValue('dtstamp')!.toString(), start: e.getFirstPropertyValue('dtstart')!.toString() };
    };
    const before = await read();
    await db().query(`UPDATE inspection_rounds SET planned_on = '2031-06-09', version = version + 1, updated_at = now() WHERE id = $1`, { bind: [roundId] });
    const after = await read();
    expect(after.uid).toBe(before.uid);
    expect(after.seq).toBe(before.seq + 1);
    expect(after.stamp > before.stamp).toBe(true);
    expect(after.start).toBe('2031-06-09');
  });

  it('keeps all-day dates on their day whatever the server time zone', async () => {
    const p = await newPrint('Late ferry');
    const roundId = await insertRound(conservatorId, '2031-12-31', 'Year end', [p.id]);
    const url = (await as('conservator').post('/api/me/calendar-feed')).body.data.url as string;
    const saved = process.env.TZ;
    try {
      // UTC+14 and UTC−11: the day must not move either way.
      for (const tz of ['Pacific/Kiritimati', 'Pacific/Pago_Pago', 'UTC']) {
        process.env.TZ = tz;
        const text = (await supertest(t.app).get(feedPath(url))).text;
        const block = text.split('BEGIN:VEVENT').find((b) => b.replace(/\r\n /g, '').includes(roundId))!;
        expect(block, tz).toMatch(/\r\nDTSTART;VALUE=DATE:20311231\r\n/);
      }
    } finally {
      process.env.TZ = saved;
    }
    // The parser reads the same day.
    const text = (await supertest(t.app).get(feedPath(url))).text;
    const e = parse(text).getAllSubcomponents('vevent').find((x) => String(x.getFirstPropertyValue('uid')).includes(roundId))!;
    expect(e.getFirstPropertyValue('dtstart')!.toString()).toBe('2031-12-31');
  });

  it('a rotated address stops working, a revoked one too; unknown addresses are 404 with the envelope', async () => {
    const first = (await as('conservator').post('/api/me/calendar-feed')).body.data.url as string;
    expect((await supertest(t.app).get(feedPath(first))).status).toBe(200);
    const second = (await as('conservator').post('/api/me/calendar-feed')).body.data.url as string;
    expect(second).not.toBe(first);
    const old = await supertest(t.app).get(feedPath(first));
    expect(old.status).toBe(404);
    expect(old.body.error).toMatchObject({ code: 'not_found', status: 404 });
    expect((await supertest(t.app).get(feedPath(second))).status).toBe(200);
    // Without the .ics ending it is the same address.
    expect((await supertest(t.app).get(feedPath(second).replace(/\.ics$/, ''))).status).toBe(200);

    const ended = await as('conservator').del('/api/me/calendar-feed');
    expect(ended.status).toBe(204);
    expect((await supertest(t.app).get(feedPath(second))).status).toBe(404);
    expect((await as('conservator').get('/api/me/reminders')).body.data.calendarFeed).toBeNull();

    const bad = await supertest(t.app).get('/api/calendar/short');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
    const unknown = await supertest(t.app).get(`/api/calendar/${'A'.repeat(43)}.ics`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('not_found');
  });
});

describe('my reminders', () => {
  it('defaults to a Monday digest, saves on/off and the day, and refuses a bad day with the field path', async () => {
    const u = await as('researcher').get('/api/me/reminders');
    expect(u.status).toBe(200);
    expect(u.body.data).toMatchObject({ digestEnabled: true, digestWeekday: 1, calendarFeed: null });
    const saved = await as('researcher').put('/api/me/reminders', { digestEnabled: false, digestWeekday: 4 });
    expect(saved.status).toBe(200);
    expect(saved.body.data).toMatchObject({ digestEnabled: false, digestWeekday: 4 });
    expect((await as('researcher').get('/api/me/reminders')).body.data).toMatchObject({ digestEnabled: false, digestWeekday: 4 });
    const bad = await as('researcher').put('/api/me/reminders', { digestEnabled: true, digestWeekday: 8 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toContain('digestWeekday');
  });

  it('role rules: a viewer cannot use reminders or a feed; only an administrator reads the digests', async () => {
    expect((await as(null).get('/api/me/reminders')).status).toBe(401);
    expect((await as('viewer').get('/api/me/reminders')).status).toBe(403);
    expect((await as('viewer').put('/api/me/reminders', { digestEnabled: true, digestWeekday: 1 })).status).toBe(403);
    expect((await as('viewer').post('/api/me/calendar-feed')).status).toBe(403);
    for (const r of ['registrar', 'conservator', 'researcher', 'viewer'] as const) {
      const res = await as(r).get('/api/digests');
      expect(res.status, r).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    const admin = await as('admin').get('/api/digests?status=failed');
    expect(admin.status).toBe(200);
    expect(admin.body.data.every((d: { status: string }) => d.status === 'failed')).toBe(true);
    expect((await as('admin').get('/api/digests?status=lost')).status).toBe(400);
  });
});
