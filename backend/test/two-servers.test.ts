import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import sharp from 'sharp';
import { QueryTypes, Sequelize } from 'sequelize';
import { pino } from 'pino';
import { readdirSync } from 'node:fs';
import { testApp, signIn } from './app';
import { startChildServer, stopChildServers, type ChildServer } from './child-server';
import { accession, createMaker } from './factories';
import { db } from '../src/db';
import { QUEUES, startQueue, type JobQueue } from '../src/jobs/queue';
import { DERIVATIVES } from '../src/services/image.service';
import { DEMO_ACCOUNTS } from '../src/seed/demo-accounts';
import { MIGRATIONS_DIR, migrateUp } from '../src/migrate';

/**
 * Two app servers as in production (`backend/src/server.ts`, each with its pg-boss workers) on
 * different ports over one PostgreSQL, one object store and one identity provider, with one
 * session secret: what a load balancer would put in front. A session opened on one is good on the
 * other and ends on both; a queued job is done once whichever server's workers take it (the test
 * runner's own server has workers on the same queue too, so three compete); an edit saved on one
 * makes an old form on the other get 409; a list is the same answer from either.
 */
const t = testApp();
const children = new Set<ChildProcess>();
let a: ChildServer;
let b: ChildServer;
const account = (role: string) => DEMO_ACCOUNTS.find((x) => x.role === role)!;
const on = (s: ChildServer) => supertest(s.url);
/** The migration files, by the name the migrator records (the file name without `.ts`). */
const migrationNames = () => readdirSync(MIGRATIONS_DIR).filter((f) => /^\d{14}-[a-z0-9-]+\.ts$/.test(f)).map((f) => f.replace(/\.ts$/, '')).sort();

beforeAll(async () => {
  [a, b] = await Promise.all([startChildServer(children), startChildServer(children)]);
}, 90_000);
afterAll(async () => {
  await stopChildServers(children);
  await t.close();
}, 30_000);

/** Polls `read` until `done` holds (deadline: jobs on a busy two-core machine). */
async function until<T>(read: () => Promise<T>, done: (v: T) => boolean, seconds = 40): Promise<T> {
  const deadline = Date.now() + seconds * 1000;
  for (;;) {
    const v = await read();
    if (done(v) || Date.now() > deadline) return v;
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** Every pg-boss job of a queue for one record, in the live table and the archive. */
async function jobsFor(queue: string, key: 'imageId' | 'importId', id: string) {
  return db().query<{ state: string; retry_count: number }>(
    `SELECT state, retry_count FROM pgboss.job WHERE name = $1 AND data->>'${key}' = $2
     UNION ALL SELECT state, retry_count FROM pgboss.archive WHERE name = $1 AND data->>'${key}' = $2`,
    { bind: [queue, id], type: QueryTypes.SELECT },
  );
}

describe('two servers on one database', () => {
  it('the servers are two processes on two ports', () => {
    expect(a.url).not.toBe(b.url);
    expect(a.child.pid).not.toBe(b.child.pid);
  });

  it('a session opened on one server is good on the other, and signing out on one ends it on both', { timeout: 60_000 }, async () => {
    const registrar = account('registrar');
    const cookie = await signIn(a.url, registrar.email, registrar.password);
    const meA = await on(a).get('/api/me').set('Cookie', cookie);
    const meB = await on(b).get('/api/me').set('Cookie', cookie);
    expect(meA.status).toBe(200);
    expect(meB.status).toBe(200);
    expect(meA.body.data).toMatchObject({ email: registrar.email, name: registrar.name, role: 'registrar' });
    expect(meB.body.data.id).toBe(meA.body.data.id);
    expect(meB.body.data).toMatchObject({ email: registrar.email, role: 'registrar' });

    // A second session, opened on B, ended on A: B refuses it as well as A.
    const other = await signIn(b.url, registrar.email, registrar.password);
    expect((await on(a).get('/api/me').set('Cookie', other)).status).toBe(200);
    const out = await on(a).post('/auth/logout').set('Cookie', other).set('Origin', t.origin);
    expect(out.status).toBe(200);
    for (const s of [b, a]) {
      const res = await on(s).get('/api/me').set('Cookie', other);
      expect(res.status).toBe(401);
      expect(res.body.error.code).toBe('unauthenticated');
    }
    // The first session is untouched by the other's sign-out.
    expect((await on(b).get('/api/me').set('Cookie', cookie)).status).toBe(200);
  });

  it('images uploaded to both servers get their thumbnail from one job each, done once', { timeout: 60_000 }, async () => {
    const conservator = account('conservator');
    const registrar = account('registrar');
    const [cons, reg] = await Promise.all([signIn(a.url, conservator.email, conservator.password), signIn(b.url, registrar.email, registrar.password)]);
    const maker = await createMaker();
    const made = await on(a).post('/api/prints').set('Cookie', reg).set('Origin', t.origin)
      .send({ accessionNumber: accession(), title: 'Two servers, six plates', process: 'gelatin_silver_developing_out', makerId: maker.id, dateMade: '1934' });
    expect(made.status).toBe(201);
    const printId = made.body.data.id as string;

    // Six uploads at once, three to each server: six derivative jobs on the one queue.
    const jpeg = (shade: number) => sharp({ create: { width: 900, height: 600, channels: 3, background: { r: shade, g: shade, b: shade } } }).jpeg().toBuffer();
    const uploads = await Promise.all(Array.from({ length: 6 }, async (_, i) => {
      const server = i % 2 ? b : a;
      return on(server).post(`/api/prints/${printId}/images`).set('Cookie', cons).set('Origin', t.origin)
        .field('viewType', 'recto').attach('file', await jpeg(40 + i * 30), `plate-${i}.jpg`);
    }));
    expect(uploads.map((u) => u.status)).toEqual([201, 201, 201, 201, 201, 201]);
    const ids = uploads.map((u) => u.body.data.id as string);

    for (const [i, id] of ids.entries()) {
      // Read from the server that did not take the upload.
      const other = i % 2 ? a : b;
      const image = await until(() => on(other).get(`/api/images/${id}`).set('Cookie', cons).then((r) => r.body.data), (d) => d?.derivatives !== 'pending');
      expect(image.derivatives).toBe('ready');
      // One job, taken once (a second take would have needed a failure or an expiry: retry_count > 0).
      expect(await jobsFor(QUEUES.derivatives, 'imageId', id)).toEqual([{ state: 'completed', retry_count: 0 }]);
      // The same thumbnail from both servers, within the thumbnail size, 3:2 like the upload.
      const [ta, tb] = await Promise.all([a, b].map((s) => on(s).get(`/api/images/${id}/file/thumb`).set('Cookie', cons).buffer(true)));
      expect(ta.status).toBe(200);
      expect(Buffer.compare(ta.body as Buffer, tb.body as Buffer)).toBe(0);
      const meta = await sharp(ta.body as Buffer).metadata();
      expect(meta.format).toBe('webp');
      expect(Math.max(meta.width!, meta.height!)).toBe(DERIVATIVES.thumb);
      expect(meta.width! / meta.height!).toBeCloseTo(1.5, 1);
    }
    // Each upload is in the audit trail once.
    const audits = await db().query<{ entity_id: string; n: number }>(
      `SELECT entity_id, count(*)::int AS n FROM audit_events WHERE action = 'image.uploaded' AND entity_id = ANY($1::text[]) GROUP BY entity_id`,
      { bind: [ids], type: QueryTypes.SELECT },
    );
    expect(audits.map((x) => x.n)).toEqual([1, 1, 1, 1, 1, 1]);
  });

  it('a CSV import uploaded on one server and committed on the other is checked once and written once', { timeout: 60_000 }, async () => {
    const registrar = account('registrar');
    const reg = await signIn(a.url, registrar.email, registrar.password);
    const base = `2095.${Date.now() % 100000}`;
    const csv = ['accession_number,title', `${base}.1,Two servers one`, `${base}.2,Two servers two`, `${base}.3,Two servers three`].join('\r\n');
    const up = await on(a).post('/api/imports').set('Cookie', reg).set('Origin', t.origin).attach('file', Buffer.from(csv), 'prints.csv');
    expect(up.status).toBe(202);
    const id = up.body.data.id as string;
    const read = (s: ChildServer) => () => on(s).get(`/api/imports/${id}`).set('Cookie', reg).then((r) => r.body.data);
    expect(await until(read(b), (d) => d.status !== 'validating')).toMatchObject({ status: 'ready', toCreate: 3 });

    const commit = await on(b).post(`/api/imports/${id}/commit`).set('Cookie', reg).set('Origin', t.origin).send({ mode: 'create_only' });
    expect(commit.status).toBe(202);
    expect(await until(read(a), (d) => d.status !== 'committing')).toMatchObject({ status: 'committed', createdPrints: 3 });

    expect(await jobsFor(QUEUES.importCheck, 'importId', id)).toEqual([{ state: 'completed', retry_count: 0 }]);
    expect(await jobsFor(QUEUES.importCommit, 'importId', id)).toEqual([{ state: 'completed', retry_count: 0 }]);
    const prints = await db().query<{ id: string; audits: number }>(
      `SELECT p.id, (SELECT count(*)::int FROM audit_events e WHERE e.action = 'print.imported' AND e.entity_id = p.id::text) AS audits
         FROM prints p WHERE p.accession_number LIKE $1`,
      { bind: [`${base}.%`], type: QueryTypes.SELECT },
    );
    expect(prints).toHaveLength(3);
    expect(prints.map((p) => p.audits)).toEqual([1, 1, 1]);
  });

  it('an edit saved on one server makes an old form on the other get 409 with the current record', { timeout: 30_000 }, async () => {
    const registrar = account('registrar');
    const admin = account('admin');
    const [reg, adm] = await Promise.all([signIn(a.url, registrar.email, registrar.password), signIn(b.url, admin.email, admin.password)]);
    const maker = await createMaker();
    const made = await on(b).post('/api/prints').set('Cookie', reg).set('Origin', t.origin)
      .send({ accessionNumber: accession(), title: 'Quay at low water', process: 'gelatin_silver_developing_out', makerId: maker.id, dateMade: '1936' });
    expect(made.status).toBe(201);
    const id = made.body.data.id as string;

    // The form is opened on A…
    const opened = await on(a).get(`/api/prints/${id}`).set('Cookie', adm);
    expect(opened.status).toBe(200);
    const v = opened.body.data.version as number;
    // …someone saves on B…
    const saved = await on(b).patch(`/api/prints/${id}`).set('Cookie', reg).set('Origin', t.origin).send({ version: v, title: 'Quay at low water, saved on B' });
    expect(saved.status).toBe(200);
    expect(saved.body.data).toMatchObject({ title: 'Quay at low water, saved on B', version: v + 1 });
    // …and the old form is saved on A.
    const stale = await on(a).patch(`/api/prints/${id}`).set('Cookie', adm).set('Origin', t.origin).send({ version: v, title: 'Quay at low water, from the old form' });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatchObject({ code: 'conflict', details: { current: { id, title: 'Quay at low water, saved on B', version: v + 1 }, lastChangedBy: registrar.name } });
    // Nothing was overwritten, as either server sees it.
    for (const s of [a, b]) {
      expect((await on(s).get(`/api/prints/${id}`).set('Cookie', adm)).body.data).toMatchObject({ title: 'Quay at low water, saved on B', version: v + 1 });
    }
  });

  it('two servers started at once on an empty database both migrate it and make its queues, each migration once', { timeout: 60_000 }, async () => {
    // What `startServer` does before it listens (migrations, then the job queue), twice at once, on a
    // database of its own in the same PostgreSQL, removed afterwards.
    const name = `toneledger_two_${process.pid}_${Date.now() % 100000}`;
    const url = new URL(process.env.DATABASE_URL!);
    url.pathname = `/${name}`;
    await db().query(`CREATE DATABASE ${name}`);
    const pools = [0, 1].map(() => new Sequelize(url.toString(), { dialect: 'postgres', logging: false, define: { underscored: true } }));
    const queues: JobQueue[] = [];
    try {
      const start = async (s: Sequelize) => {
        await migrateUp(s);
        queues.push(await startQueue(url.toString(), pino({ level: 'silent' })));
      };
      const started = await Promise.allSettled(pools.map(start));
      expect(started.map((r) => (r.status === 'rejected' ? String(r.reason) : 'started'))).toEqual(['started', 'started']);
      const applied = await pools[0].query<{ name: string }>('SELECT name FROM schema_migrations ORDER BY name', { type: QueryTypes.SELECT });
      expect(applied.map((r) => r.name)).toEqual(migrationNames());
      const made = await pools[0].query<{ name: string }>('SELECT name FROM pgboss.queue ORDER BY name', { type: QueryTypes.SELECT });
      expect(made.map((r) => r.name)).toEqual(expect.arrayContaining(Object.values(QUEUES)));
    } finally {
      await Promise.all(queues.map((q) => q.stop()));
      await Promise.all(pools.map((s) => s.close()));
      await db().query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    }
  });

  it('a list asked of the two servers in turn gives the same answer each time', { timeout: 30_000 }, async () => {
    const researcher = account('researcher');
    const cookie = await signIn(a.url, researcher.email, researcher.password);
    const query = '/api/prints?sort=maker&pageSize=50&page=1';
    const bodies = [];
    for (let i = 0; i < 8; i++) {
      const res = await on(i % 2 ? b : a).get(query).set('Cookie', cookie);
      expect(res.status).toBe(200);
      bodies.push(res.body);
    }
    expect(bodies[0].data.length).toBeGreaterThan(0);
    for (const body of bodies.slice(1)) expect(body).toEqual(bodies[0]);
  });
});
