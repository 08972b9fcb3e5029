import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { pino } from 'pino';
import { QueryTypes } from 'sequelize';
import { isoWeek } from '@toneledger/common/domain/iso-week';
import { env } from '../../config/env';
import { testApp, sessionFor, type TestApp } from '../../../test/app';
import { accession, createLocation, createUser } from '../../../test/factories';
import { db } from '../../db';
import { startQueue, QUEUES, type JobQueue } from '../../jobs/queue';
import { runDigestTick, startDigestWorkers } from '../../jobs/digest-workers';
import { digestTick, sendDigest, type DigestContext } from '../../services/digest.service';

const silent = pino({ level: 'silent' });
const t = testApp();
let registrar: string;
let registrarId: string;
let admin: string;
beforeAll(async () => {
  registrar = await sessionFor(t.app, 'registrar');
  registrarId = (await supertest(t.app).get('/api/me').set('Cookie', registrar)).body.data.id;
  admin = await sessionFor(t.app, 'admin');
});
afterAll(() => t.close());

const DAY = 86_400_000;
/** Monday 30 November 2026 (ISO weekday 1, checked in iso-week.test.ts via 2026-12-02 = Wednesday), plus whole weeks. */
const monday = (weeksAhead: number) => new Date(Date.UTC(2026, 10, 30, 9, 0) + weeksAhead * 7 * DAY);
const day = (at: Date, plus: number) => new Date(at.getTime() + plus * DAY).toISOString().slice(0, 10);

async function newPrint(title: string, locationId: string | null, dueOn: string) {
  const res = await supertest(t.app).post('/api/prints').set('Cookie', registrar).set('Origin', t.origin)
    .send({ accessionNumber: accession(), title, process: 'gelatin_silver_developing_out', ...(locationId ? { locationId } : {}) });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  // The schedule row straight in SQL, as a conservator's own date: the schedule job (which the test
  // server runs for every new print) keeps an override as the date in force.
  await db().query(
    `INSERT INTO print_schedules (print_id, computed_due_on, due_on, interval_months, risk, risk_rank, override_due_on, override_reason, overridden_by, overridden_at)
     VALUES ($1, $2, $2, 24, 'moderate', 2, $2, 'Digest test date', $3, now())
     ON CONFLICT (print_id) DO UPDATE SET due_on = EXCLUDED.due_on, override_due_on = EXCLUDED.override_due_on,
       override_reason = EXCLUDED.override_reason, overridden_by = EXCLUDED.overridden_by, overridden_at = EXCLUDED.overridden_at`,
    { bind: [res.body.data.id, dueOn, registrarId] },
  );
  return res.body.data as { id: string; accessionNumber: string };
}

const rowsOf = (userId: string) =>
  db().query<{ id: string; week: string; status: string; attempts: number; last_error: string | null; sent_at: Date | null; overdue: number; due: number }>(
    'SELECT id, week, status, attempts, last_error, sent_at, overdue, due FROM digest_sends WHERE user_id = $1 ORDER BY week',
    { bind: [userId], type: QueryTypes.SELECT },
  );

async function until<T>(what: () => Promise<T>, ok: (v: T) => boolean, seconds = 40): Promise<T> {
  const deadline = Date.now() + seconds * 1000;
  for (;;) {
    const v = await what();
    if (ok(v) || Date.now() > deadline) return v;
    await new Promise((r) => setTimeout(r, 100));
  }
}

const mailTo = async (email: string) => (await t.deps.mailer.captured()).filter((m) => m.to.some((to) => to.includes(email)));

/** A second app instance: its own mailer and its own pg-boss with the digest workers, on the one test database. */
async function instance(retryDelaySeconds = 30): Promise<{ app: TestApp; queue: JobQueue; ctx: DigestContext; stop(): Promise<void> }> {
  const queue = await startQueue(env().DATABASE_URL, silent);
  const app = testApp({ queue });
  const ctx: DigestContext = { mailer: app.deps.mailer, publicUrl: env().PUBLIC_URL, now: () => clock };
  await startDigestWorkers(queue, ctx, silent, { schedule: false, retryDelaySeconds });
  return { app, queue, ctx, stop: async () => { await queue.stop(); await app.close(); } };
}
let clock = monday(0);

describe('weekly digest', () => {
  it('two instances ticking at once send one message, with the prints due grouped by place and links', async () => {
    clock = monday(700);
    const today = day(clock, 0);
    const person = await createUser({ role: 'conservator', name: 'Wenna Trevaskis' });
    const north = await createLocation(`North store ${accession()}`);
    const south = await createLocation(`South store ${accession()}`);
    const p1 = await newPrint('Breakwater at low tide', north.id, day(clock, -10));
    const p2 = await newPrint('Two boats, one sail', north.id, day(clock, 5));
    const p3 = await newPrint('Salt marsh study', south.id, day(clock, 20));
    const later = await newPrint('Lighthouse in snow', south.id, day(clock, 60));

    const a = await instance();
    const b = await instance();
    try {
      const [ra, rb] = await Promise.all([runDigestTick(a.queue, a.ctx), runDigestTick(b.queue, b.ctx)]);
      const [row] = await rowsOf(person.id);
      expect(row).toBeDefined();
      // Exactly one of the two claimed this person's week.
      expect([...ra.toSend, ...rb.toSend].filter((id) => id === row!.id)).toHaveLength(1);
      const sent = await until(() => rowsOf(person.id), (r) => r[0]?.status === 'sent', 15);
      const jobs = await db().query(`SELECT state, output, retry_count FROM pgboss.job WHERE name = $1 AND data->>'sendId' = $2`, { bind: [QUEUES.digestSend, row!.id], type: QueryTypes.SELECT });
      expect(sent, JSON.stringify(jobs)).toHaveLength(1);
      expect(sent[0], JSON.stringify(jobs)).toMatchObject({ status: 'sent', attempts: 1, week: isoWeek(clock) }); // isoWeek is checked against luxon in iso-week.test.ts
      expect(sent[0]!.overdue).toBeGreaterThanOrEqual(1);
      expect(sent[0]!.due).toBeGreaterThanOrEqual(2);
      // One job for the row, completed once.
      const [{ n }] = await db().query<{ n: number }>(
        `SELECT count(*)::int AS n FROM (SELECT id FROM pgboss.job WHERE name = $1 AND data->>'sendId' = $2 UNION ALL SELECT id FROM pgboss.archive WHERE name = $1 AND data->>'sendId' = $2) j`,
        { bind: [QUEUES.digestSend, row!.id], type: QueryTypes.SELECT },
      );
      expect(n).toBe(1);
      // Ticking again in the same week claims nothing more for this person.
      const again = await digestTick({ now: () => clock });
      expect(again.toSend).not.toContain(row!.id);
      expect(await rowsOf(person.id)).toHaveLength(1);

      await new Promise((r) => setTimeout(r, 1500));
      const mails = await mailTo(person.email!);
      expect(mails).toHaveLength(1);
      const mail = mails[0]!;
      expect(mail.subject).toContain(isoWeek(clock));
      // Text part: each place once, its prints under it, the later print absent.
      const text = mail.text;
      const northAt = text.indexOf(north.pathLabel);
      const southAt = text.indexOf(south.pathLabel);
      expect(northAt).toBeGreaterThanOrEqual(0);
      expect(southAt).toBeGreaterThanOrEqual(0);
      const section = (from: number) => text.slice(from, text.indexOf('\n\n', from));
      expect(section(northAt)).toContain(`${p1.accessionNumber} Breakwater at low tide: overdue since ${day(clock, -10)}`);
      expect(section(northAt)).toContain(`${p2.accessionNumber} Two boats, one sail: due ${day(clock, 5)}`);
      expect(section(northAt)).not.toContain(p3.accessionNumber);
      expect(section(southAt)).toContain(p3.accessionNumber);
      expect(text).not.toContain(later.accessionNumber);
      expect(text).toContain(`${env().PUBLIC_URL}/catalogue/prints/${p1.id}`);
      expect(text).toContain(`${env().PUBLIC_URL}/inspections`);
      // HTML part: the same groups, with links.
      const html = mail.html!;
      const northHtml = html.slice(html.indexOf(`<h3>${north.pathLabel}</h3>`), html.indexOf('</ul>', html.indexOf(`<h3>${north.pathLabel}</h3>`)));
      expect(northHtml).toContain(`<a href="${env().PUBLIC_URL}/catalogue/prints/${p1.id}">${p1.accessionNumber}</a>`);
      expect(northHtml).toContain(p2.accessionNumber);
      expect(northHtml).not.toContain(p3.accessionNumber);
      expect(html).toContain(`href="${env().PUBLIC_URL}/inspections"`);
    } finally {
      await a.stop();
      await b.stop();
    }
  }, 90_000);

  it('a refused send is marked failed, shown to administrators, retried by pg-boss and then sent once', async () => {
    clock = monday(701);
    // An address the mailer cannot send to: every server's worker fails it alike, until it is corrected.
    const person = await createUser({ role: 'conservator', email: `no-at-sign-${accession()}` });
    const place = await createLocation(`East store ${accession()}`);
    await newPrint('Net lofts', place.id, day(clock, 3));
    const a = await instance();
    try {
      await runDigestTick(a.queue, a.ctx, { retryDelaySeconds: 2 });
      const failed = await until(() => rowsOf(person.id), (r) => r[0]?.status === 'failed');
      expect(failed[0]).toMatchObject({ status: 'failed', attempts: 1, last_error: 'The mail server did not accept the message.' });
      const listed = await supertest(t.app).get('/api/digests?status=failed&pageSize=200').set('Cookie', admin);
      expect(listed.status).toBe(200);
      expect(listed.body.data.find((d: { id: string }) => d.id === failed[0]!.id)).toMatchObject({
        status: 'failed', attempts: 1, lastError: 'The mail server did not accept the message.', user: { id: person.id }, sentAt: null,
      });

      const fixed = `fixed-${accession()}@test.example`;
      await db().query('UPDATE users SET email = $2 WHERE id = $1', { bind: [person.id, fixed] });
      const sent = await until(() => rowsOf(person.id), (r) => r[0]?.status === 'sent', 60);
      expect(sent[0]!.status).toBe('sent');
      expect(sent[0]!.attempts).toBeGreaterThanOrEqual(2);
      const after = await supertest(t.app).get('/api/digests?pageSize=200').set('Cookie', admin);
      // The earlier failure stays readable beside the sent status.
      expect(after.body.data.find((d: { id: string }) => d.id === failed[0]!.id)).toMatchObject({
        status: 'sent', attempts: sent[0]!.attempts, lastError: 'The mail server did not accept the message.',
      });
      // pg-boss retried the one job (no second job was made for the row).
      const jobs = await db().query<{ retry_count: number; state: string }>(
        `SELECT retry_count, state FROM pgboss.job WHERE name = $1 AND data->>'sendId' = $2 UNION ALL SELECT retry_count, state FROM pgboss.archive WHERE name = $1 AND data->>'sendId' = $2`,
        { bind: [QUEUES.digestSend, failed[0]!.id], type: QueryTypes.SELECT },
      );
      expect(jobs).toHaveLength(1);
      expect(jobs[0]!.retry_count).toBeGreaterThanOrEqual(1);
      await new Promise((r) => setTimeout(r, 500));
      expect(await mailTo(fixed)).toHaveLength(1);
    } finally {
      await a.stop();
    }
  }, 90_000);

  it('goes on the chosen weekday only, and never to a person who switched it off', async () => {
    clock = monday(702);
    const off = await createUser({ role: 'conservator' });
    const thursday = await createUser({ role: 'conservator' });
    const viewer = await createUser({ role: 'viewer' });
    await db().query(`INSERT INTO reminder_preferences (user_id, digest_enabled, digest_weekday) VALUES ($1, false, 1), ($2, true, 4)`, { bind: [off.id, thursday.id] });
    const place = await createLocation(`West store ${accession()}`);
    await newPrint('Pier lamps', place.id, day(clock, 2));
    const ctx: DigestContext = { mailer: t.deps.mailer, publicUrl: env().PUBLIC_URL, now: () => clock };

    await digestTick(ctx);
    expect(await rowsOf(off.id)).toHaveLength(0);
    expect(await rowsOf(thursday.id)).toHaveLength(0);
    expect(await rowsOf(viewer.id)).toHaveLength(0); // no schedule.write

    clock = new Date(monday(702).getTime() + 3 * DAY); // Thursday of the same week
    const tick = await digestTick(ctx);
    const [row] = await rowsOf(thursday.id);
    expect(tick.toSend).toContain(row!.id);
    expect(await sendDigest(row!.id, ctx)).toBe('sent');
    expect(await sendDigest(row!.id, ctx)).toBe('skipped'); // a second job for the row sends nothing
    expect(await rowsOf(off.id)).toHaveLength(0);

    await new Promise((r) => setTimeout(r, 500));
    expect(await mailTo(thursday.email!)).toHaveLength(1);
    expect(await mailTo(off.email!)).toHaveLength(0);
  });

  it('a week with nothing due is recorded as empty and sends nothing', async () => {
    // A Monday long before any print's date in the test database: nothing is overdue or due.
    clock = new Date(Date.UTC(1990, 0, 1, 9)); // 1990-01-01 was a Monday [memory]; checked below
    expect(clock.getUTCDay()).toBe(1);
    const person = await createUser({ role: 'conservator' });
    const tick = await digestTick({ now: () => clock });
    const [row] = await rowsOf(person.id);
    expect(row).toMatchObject({ week: '1990-W01', status: 'empty', attempts: 0 });
    expect(tick.empty).toContain(row!.id);
    expect(tick.toSend).not.toContain(row!.id);
    await new Promise((r) => setTimeout(r, 300));
    expect(await mailTo(person.email!)).toHaveLength(0);
  });
});
