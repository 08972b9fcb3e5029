// A restart of PostgreSQL under light traffic: the process stays up, health says the database is
// down while it is, and within 5 s of its return health, a signed-in list and a pg-boss job work
// again without restarting the app. The cluster is one of this file's own (the shared test
// database is never stopped), built by the same helper as every other local cluster.
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { pino } from 'pino';
import type { LocalPostgres } from '../../scripts/postgres';
import { freePort } from '../../scripts/services';
import type { JobQueue } from '../src/jobs/queue';
import type { TestApp } from './app';

const RECOVERY_MS = 5_000;
const PROBE_QUEUE = 'restart-probe';

let tmp: string | undefined;
let cluster: LocalPostgres | undefined;
let queue: JobQueue | undefined;
let t: TestApp | undefined;
let server: Server | undefined;
let base = '';
let cookie = '';
let registrarCookie = '';
const jobsDone = new Set<number>();
let jobNo = 0;
const uncaught: unknown[] = [];
const recordUncaught = (err: unknown) => uncaught.push(err);

interface Answer {
  status: number;
  body: { error?: { code?: string; message?: string; status?: number } } | null;
  retryAfter: string | null;
}

async function get(url: string, withSession: boolean): Promise<Answer> {
  return send('GET', url, withSession ? cookie : null);
}

async function send(method: string, url: string, session: string | null, body?: unknown): Promise<Answer> {
  try {
    const headers: Record<string, string> = session ? { cookie: session } : {};
    if (body !== undefined) Object.assign(headers, { 'content-type': 'application/json', origin: t!.origin });
    const res = await fetch(base + url, { method, headers, body: body === undefined ? undefined : JSON.stringify(body), signal: AbortSignal.timeout(3_000) });
    const json = (await res.json().catch(() => null)) as Answer['body'];
    return { status: res.status, body: json, retryAfter: res.headers.get('retry-after') };
  } catch {
    return { status: 0, body: null, retryAfter: null }; // no answer at all
  }
}

/** A signed-in write: the registrar records a maker. */
let makerNo = 0;
const createMaker = () => send('POST', '/api/makers', registrarCookie, { name: `Restart probe maker ${process.pid}-${++makerNo}` });

/** Sends a probe job and waits (at most `ms`) for the app's worker to run it. */
async function jobRuns(ms: number): Promise<boolean> {
  const n = ++jobNo;
  try {
    await queue!.boss.send(PROBE_QUEUE, { n });
  } catch {
    return false;
  }
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (jobsDone.has(n)) return true;
    await new Promise((r) => setTimeout(r, 100));
  }
  return false;
}

/** Polls until health, the signed-in list and a job all work; returns the milliseconds it took. */
async function recovered(deadlineMs: number): Promise<number> {
  const start = Date.now();
  const state = { health: false, list: false, job: false };
  while (Date.now() - start < deadlineMs) {
    if (!state.health) state.health = (await get('/api/health', false)).status === 200;
    if (!state.list) state.list = (await get('/api/prints?pageSize=5', true)).status === 200;
    if (!state.job) state.job = await jobRuns(Math.min(1_500, Math.max(100, deadlineMs - (Date.now() - start))));
    if (state.health && state.list && state.job) return Date.now() - start;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`not recovered within ${deadlineMs} ms: ${JSON.stringify(state)}`);
}

/** Light traffic until stopped: a health check and a signed-in list every 50 ms. */
function traffic() {
  let running = true;
  let requests = 0;
  const loop = (async () => {
    while (running) {
      await Promise.all([get('/api/health', false), get('/api/prints?pageSize=5', true)]);
      requests += 2;
      await new Promise((r) => setTimeout(r, 50));
    }
  })();
  return async () => {
    running = false;
    await loop;
    return requests;
  };
}

beforeAll(async () => {
  process.on('uncaughtException', recordUncaught);
  process.on('unhandledRejection', recordUncaught);
  tmp = mkdtempSync(path.join(os.tmpdir(), 'toneledger-restart-'));
  chmodSync(tmp, 0o755); // the postgres user must be able to enter it when running as root
  const { startPostgres } = await import('../../scripts/postgres');
  cluster = await startPostgres({ baseDir: path.join(tmp, 'pg'), port: await freePort(), database: 'toneledger_restart', log: () => {}, fallbackKey: 'restart' });
  // Nothing in this file has read the environment yet: the app, Sequelize and pg-boss all use this cluster.
  vi.stubEnv('DATABASE_URL', cluster.url);
  const { env } = await import('../src/config/env');
  expect(env().DATABASE_URL).toBe(cluster.url);
  const { migrateUp } = await import('../src/migrate');
  const { db } = await import('../src/db');
  await migrateUp(db());
  // The demo accounts, as on the shared test database: each signs in with its own role.
  const { seedDemoIfEmpty } = await import('../src/seed/demo');
  await seedDemoIfEmpty(db(), { catalogue: false });
  const { startQueue } = await import('../src/jobs/queue');
  queue = await startQueue(cluster.url, pino({ level: 'silent' }));
  await queue.boss.createQueue(PROBE_QUEUE);
  await queue.boss.work<{ n: number }>(PROBE_QUEUE, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
    jobsDone.add(job.data.n);
  });
  const { testApp, signIn } = await import('./app');
  t = testApp({ queue });
  const { DEMO_ACCOUNTS } = await import('../src/seed/demo-accounts');
  const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!;
  cookie = await signIn(t.app, viewer.email, viewer.password);
  const registrar = DEMO_ACCOUNTS.find((a) => a.role === 'registrar')!;
  registrarCookie = await signIn(t.app, registrar.email, registrar.password);
  server = await new Promise<Server>((resolve) => {
    const s = t!.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  base = `http://127.0.0.1:${(server.address() as net.AddressInfo).port}`;
}, 90_000);

afterAll(async () => {
  if (server) await new Promise<void>((resolve) => { server!.close(() => resolve()); server!.closeAllConnections(); });
  await cluster?.resume().catch(() => {}); // started again if a failed test left it halted
  await queue?.stop().catch(() => {});
  await t?.close().catch(() => {});
  await cluster?.stop();
  if (tmp) rmSync(tmp, { recursive: true, force: true });
  vi.unstubAllEnvs();
  process.off('uncaughtException', recordUncaught);
  process.off('unhandledRejection', recordUncaught);
}, 60_000);

describe('a PostgreSQL restart', () => {
  it('pg_ctl -m fast restart under light traffic: the app stays up and works again within 5 s', async () => {
    // Every pool holds idle connections when the server goes: a signed-in request just before.
    expect((await get('/api/prints?pageSize=5', true)).status).toBe(200);
    expect((await get('/api/health', false)).status).toBe(200);
    expect(await jobRuns(5_000)).toBe(true);

    const stopTraffic = traffic();
    const restartStarted = Date.now();
    await cluster!.restart();
    const restartMs = Date.now() - restartStarted;
    const recoveryMs = await recovered(RECOVERY_MS);
    const requests = await stopTraffic();
    console.info(`[restart] pg_ctl restart ${restartMs} ms; health, list and job working again after ${recoveryMs} ms; ${requests} requests meanwhile`);

    expect(uncaught).toEqual([]);
    expect(server!.listening).toBe(true);
  }, 60_000);

  it('while PostgreSQL is down health, a signed-in list and a signed-in write answer 503 naming it; after it starts again everything works within 5 s', async () => {
    expect((await get('/api/prints?pageSize=5', true)).status).toBe(200);
    const stopTraffic = traffic();
    await cluster!.halt();

    const health = await get('/api/health', false);
    expect(health.status).toBe(503);
    expect(health.body?.error?.message).toMatch(/PostgreSQL/);
    // A signed-in list and a signed-in write cannot be done: both are answered 503 in the error
    // envelope, naming the database, with a Retry-After (not 500, not dropped).
    for (const answer of [await get('/api/prints?pageSize=5', true), await createMaker()]) {
      expect(answer.status).toBe(503);
      expect(answer.body?.error).toMatchObject({ code: 'service_unavailable', status: 503 });
      expect(answer.body?.error?.message).toMatch(/PostgreSQL/);
      expect(Number(answer.retryAfter)).toBeGreaterThan(0);
    }

    await cluster!.resume();
    const recoveryMs = await recovered(RECOVERY_MS);
    const written = await createMaker();
    expect(written.status, JSON.stringify(written.body)).toBe(201);
    const requests = await stopTraffic();
    console.info(`[restart] after a stop and start: working again after ${recoveryMs} ms; ${requests} requests meanwhile`);

    expect(uncaught).toEqual([]);
    expect(server!.listening).toBe(true);
  }, 60_000);
});
