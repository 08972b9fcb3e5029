import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pino } from 'pino';
import { QueryTypes } from 'sequelize';
import { testAppWithQueue, type TestApp } from '../../../test/app';
import { daysFromToday, exhibitionClient } from '../../../test/exhibition-helpers';
import { db } from '../../db';
import { startWorkers } from '../../jobs/workers';
import { QUEUES } from '../../jobs/queue';

let t: TestApp;
let h: Awaited<ReturnType<typeof exhibitionClient>>;
beforeAll(async () => {
  t = await testAppWithQueue();
  h = await exhibitionClient(t);
});
afterAll(async () => {
  await t?.close();
});

const row = async (printId: string) =>
  (await db().query<{ due_on: string; last_checked_on: string | null }>(
    'SELECT due_on::text AS due_on, last_checked_on::text AS last_checked_on FROM print_schedules WHERE print_id = $1', { bind: [printId], type: QueryTypes.SELECT },
  ))[0] ?? null;

const count = async (sql: string) => (await db().query<{ n: number }>(sql, { type: QueryTypes.SELECT }))[0]!.n;

/** Polls until the check holds (the job runs on a busy two-core machine). */
async function eventually<T>(read: () => Promise<T>, ok: (v: T) => boolean, seconds = 45): Promise<T> {
  const deadline = Date.now() + seconds * 1000;
  for (;;) {
    const v = await read();
    if (ok(v) || Date.now() > deadline) return v;
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe('the schedule on the job queue', () => {
  it('prints without a date are marked when the workers start and dated by the schedule-update job; a signed report is taken up by the job', { timeout: 120_000 }, async () => {
    const p = await h.newPrint();
    // The create marked it; the wake sent a job but no worker runs yet: no row, the mark waits.
    expect(await row(p.id)).toBeNull();
    const [{ n: marks }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM schedule_stale WHERE print_id = $1', { bind: [p.id], type: QueryTypes.SELECT });
    expect(marks).toBe(1);
    const [{ n: jobs }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM pgboss.job WHERE name = $1', { bind: [QUEUES.scheduleUpdate], type: QueryTypes.SELECT });
    expect(jobs).toBeGreaterThan(0);

    await startWorkers(t.deps.queue!, t.deps.store, pino({ level: 'silent' }), { fixityCron: t.deps.env.TONELEDGER_FIXITY_CRON, retentionDays: t.deps.env.IMAGE_RETENTION_DAYS });
    const dated = await eventually(() => row(p.id), (r) => r !== null);
    expect(dated).not.toBeNull();
    expect(await eventually(() => count("SELECT count(*)::int AS n FROM prints p WHERE p.status <> 'deaccessioned' AND NOT EXISTS (SELECT 1 FROM print_schedules s WHERE s.print_id = p.id)"), (n) => n === 0)).toBe(0);

    const examinedOn = daysFromToday(-10);
    const draft = await h.as('conservator').post(`/api/prints/${p.id}/condition-reports`, { examinedOn, context: 'routine', grade: 'good' });
    expect(draft.status, JSON.stringify(draft.body)).toBe(201);
    const signed = await h.as('conservator').post(`/api/condition-reports/${draft.body.data.id}/sign`, { version: draft.body.data.version });
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);
    const after = await eventually(() => row(p.id), (r) => r?.last_checked_on === examinedOn);
    expect(after?.last_checked_on).toBe(examinedOn);
    expect(await eventually(() => count('SELECT count(*)::int AS n FROM schedule_stale'), (n) => n === 0)).toBe(0);
  });
});
