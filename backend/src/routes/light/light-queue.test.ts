import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pino } from 'pino';
import { QueryTypes } from 'sequelize';
import { testAppWithQueue, type TestApp } from '../../../test/app';
import { exhibitionClient } from '../../../test/exhibition-helpers';
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

const category = async (printId: string) =>
  (await db().query<{ light_responsivity: string }>('SELECT light_responsivity FROM prints WHERE id = $1', { bind: [printId], type: QueryTypes.SELECT }))[0]!.light_responsivity;

/** Polls the progress until it is no longer running (deadline: the job runs on a busy two-core machine). */
async function settled(seconds = 45) {
  const deadline = Date.now() + seconds * 1000;
  for (;;) {
    const res = await h.as('admin').get('/api/settings/light/recompute');
    if (res.body.data?.status !== 'running' || Date.now() > deadline) return res.body.data;
    await new Promise((r) => setTimeout(r, 200));
  }
}

const jobsOf = (generation: number) =>
  db().query<{ state: string }>(`SELECT state FROM pgboss.job WHERE name = $1 AND (data->>'generation')::int = $2`, {
    bind: [QUEUES.lightRecompute, generation], type: QueryTypes.SELECT,
  });

const generation = async () =>
  (await db().query<{ g: number }>("SELECT (value->>'generation')::int AS g FROM settings WHERE key = 'light-recompute'", { type: QueryTypes.SELECT }))[0]!.g;

describe('the light recompute on the job queue', () => {
  it('a settings change answers at once; the job, queued again when the workers start, recomputes the categories', { timeout: 90_000 }, async () => {
    const p = await h.newPrint('albumen', 'Albumen harbour, queued');
    const was = await category(p.id);
    expect(was).not.toBe('irresponsive');
    const before = (await h.as('admin').get('/api/settings/light')).body.data;
    const [{ n: prints }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM prints', { type: QueryTypes.SELECT });
    try {
      const res = await h.as('admin').put('/api/settings/light', { ...before, rules: [{ process: 'albumen', category: 'irresponsive' }, ...before.rules] });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      // No worker yet (as a server stopped after the change): the job waits, the print is as it was.
      const g = await generation();
      expect(await jobsOf(g)).toEqual([{ state: 'created' }]);
      expect((await h.as('admin').get('/api/settings/light/recompute')).body.data).toMatchObject({ status: 'running', done: 0, finishedAt: null });
      expect(await category(p.id)).toBe(was);

      // The workers start and queue the running recompute again: two jobs of one generation, the work done once.
      await startWorkers(t.deps.queue!, t.deps.store, pino({ level: 'silent' }), { fixityCron: t.deps.env.TONELEDGER_FIXITY_CRON, retentionDays: t.deps.env.IMAGE_RETENTION_DAYS });
      expect(await settled()).toMatchObject({ status: 'done', done: prints, total: prints });
      expect(await category(p.id)).toBe('irresponsive');
      const deadline = Date.now() + 20_000;
      while ((await jobsOf(g)).some((j) => j.state !== 'completed') && Date.now() < deadline) await new Promise((r) => setTimeout(r, 200));
      expect(await jobsOf(g)).toEqual([{ state: 'completed' }, { state: 'completed' }]);
    } finally {
      expect((await h.as('admin').put('/api/settings/light', before)).status).toBe(200);
      expect(await settled()).toMatchObject({ status: 'done' });
    }
    expect(await category(p.id)).toBe(was);
  });
});
