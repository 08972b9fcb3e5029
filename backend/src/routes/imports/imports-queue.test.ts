import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { pino } from 'pino';
import { QueryTypes } from 'sequelize';
import { testAppWithQueue, sessionFor, type TestApp } from '../../../test/app';
import { db } from '../../db';
import { ImportJobModel, Print, User } from '../../models';
import { startWorkers } from '../../jobs/workers';
import { QUEUES } from '../../jobs/queue';
import { DEMO_ACCOUNTS } from '../../seed/demo-accounts';

let t: TestApp;
let registrar: string;
beforeAll(async () => {
  t = await testAppWithQueue();
  registrar = await sessionFor(t.app, 'registrar');
});
afterAll(async () => {
  await t?.close();
});

const base = () => `2094.${Date.now() % 100000}`;

/** Polls the import until it leaves `from` (deadline: the job runs on a busy two-core machine). */
async function settled(id: string, from: string, seconds = 45) {
  const deadline = Date.now() + seconds * 1000;
  for (;;) {
    const res = await supertest(t.app).get(`/api/imports/${id}`).set('Cookie', registrar);
    if (res.body.data.status !== from || Date.now() > deadline) return res.body.data;
    await new Promise((r) => setTimeout(r, 200));
  }
}

async function jobsOf(queue: string, importId: string) {
  return db().query<{ state: string }>(`SELECT state FROM pgboss.job WHERE name = $1 AND data->>'importId' = $2`, {
    bind: [queue, importId], type: QueryTypes.SELECT,
  });
}

describe('imports on the job queue', () => {
  it('checks and commits a file as pg-boss jobs that find the import by its id', { timeout: 60_000 }, async () => {
    const b = base();
    const csv = ['accession_number,title', `${b}.1,Queued one`, `${b}.2,Queued two`].join('\r\n');
    const up = await supertest(t.app).post('/api/imports').set('Cookie', registrar).set('Origin', t.origin).attach('file', Buffer.from(csv), 'prints.csv');
    expect(up.status).toBe(202);
    const checked = await settled(up.body.data.id, 'validating');
    expect(checked).toMatchObject({ status: 'ready', toCreate: 2 });
    expect(await jobsOf(QUEUES.importCheck, checked.id)).toEqual([{ state: 'completed' }]);

    const commit = await supertest(t.app).post(`/api/imports/${checked.id}/commit`).set('Cookie', registrar).set('Origin', t.origin).send({ mode: 'create_only' });
    expect(commit.status).toBe(202);
    const committed = await settled(checked.id, 'committing');
    expect(committed).toMatchObject({ status: 'committed', createdPrints: 2 });
    expect(await jobsOf(QUEUES.importCommit, checked.id)).toEqual([{ state: 'completed' }]);
    expect(await Print.count({ where: { accessionNumber: [`${b}.1`, `${b}.2`] } })).toBe(2);
  });

  it('runs again, once the workers start, a check and a commit that a stopped server left without a job', { timeout: 60_000 }, async () => {
    const b = base();
    const registrarUser = await User.findOne({ where: { email: DEMO_ACCOUNTS.find((a) => a.role === 'registrar')!.email } });
    // A check the stopped server had begun: the row alone, no job anywhere.
    const checking = await ImportJobModel.create({
      fileName: 'prints.csv', source: ['accession_number,title', `${b}.1,Left checking`].join('\r\n'), status: 'validating',
      createdBy: registrarUser!.id, message: null, finishedAt: null,
    });
    // A commit the stopped server had begun (its transaction never finished): checked through the queue, then left committing.
    const csv = ['accession_number,title', `${b}.2,Left committing`, `${b}.3,Left committing too`].join('\r\n');
    const up = await supertest(t.app).post('/api/imports').set('Cookie', registrar).set('Origin', t.origin).attach('file', Buffer.from(csv), 'prints.csv');
    expect(await settled(up.body.data.id, 'validating')).toMatchObject({ status: 'ready' });
    await ImportJobModel.update(
      { status: 'committing', mode: 'create_only', committedBy: registrarUser!.id, commitRequestId: 'req-before-restart' },
      { where: { id: up.body.data.id } },
    );

    await startWorkers(t.deps.queue!, t.deps.store, pino({ level: 'silent' }), { fixityCron: t.deps.env.TONELEDGER_FIXITY_CRON, retentionDays: t.deps.env.IMAGE_RETENTION_DAYS });

    expect(await settled(checking.id, 'validating')).toMatchObject({ status: 'ready', toCreate: 1 });
    expect(await settled(up.body.data.id, 'committing')).toMatchObject({ status: 'committed', createdPrints: 2 });
    const made = await Print.findAll({ where: { accessionNumber: [`${b}.2`, `${b}.3`] } });
    expect(made).toHaveLength(2);
    const audits = await db().query<{ actor_id: string; request_id: string }>(
      `SELECT actor_id, request_id FROM audit_events WHERE action = 'print.imported' AND entity_id = ANY($1::text[])`,
      { bind: [made.map((p) => p.id)], type: QueryTypes.SELECT },
    );
    expect(audits).toEqual([
      { actor_id: registrarUser!.id, request_id: 'req-before-restart' },
      { actor_id: registrarUser!.id, request_id: 'req-before-restart' },
    ]);
  });
});
