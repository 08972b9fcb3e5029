import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { onServer } from '../../test/scratch-database';

/**
 * Ctrl-C during the first start's demo seed: the seed stops at its next record, nothing of it
 * touches the database after it has stopped, and the next seed carries on to the same demo an
 * uninterrupted seed makes (same rows, same audit events, nothing written twice). Each run has a
 * database of its own (created and dropped here), so the shared test database never holds the demo.
 * The demo photographs need an object store and take a minute to render: the catalogue, the
 * measurement histories and the exhibitions and loans are the parts seeded here.
 */

const shared = process.env.DATABASE_URL!;
const names = { reference: `toneledger_seed_ref_${process.pid}`, stopped: `toneledger_seed_stop_${process.pid}` };


function urlOf(name: string) {
  const url = new URL(shared);
  url.pathname = `/${name}`;
  return url.toString();
}

/** Fresh modules on the named database: env, Sequelize and the models read it anew. */
async function on(name: string) {
  vi.resetModules();
  vi.stubEnv('DATABASE_URL', urlOf(name));
  const { migrateUp } = await import('../migrate');
  const { db, closeDb } = await import('../db');
  const { seedDemoIfEmpty } = await import('./demo');
  await migrateUp(db());
  return { db, closeDb, seedDemoIfEmpty };
}

const TABLES = [
  'users', 'settings', 'makers', 'papers', 'bath_recipes', 'locations', 'enclosure_types', 'prints', 'process_steps', 'movements',
  'measurement_spots', 'measurement_sessions', 'spot_readings',
  'exhibitions', 'exhibition_venues', 'exhibition_objects', 'display_periods', 'loans', 'loan_objects', 'loan_status_changes', 'condition_reports',
];

async function countsOf(db: () => import('sequelize').Sequelize): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of TABLES) {
    const [row] = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM ${t}`, { type: 'SELECT' as never });
    out[t] = row.n;
  }
  const [borrowed] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM prints WHERE borrowed', { type: 'SELECT' as never });
  out.borrowed = borrowed.n;
  // Every record written once: the audit trail has as many events of each kind.
  const audit = await db().query<{ action: string; n: number }>('SELECT action, count(*)::int AS n FROM audit_events GROUP BY action ORDER BY action', { type: 'SELECT' as never });
  for (const a of audit) out[`audit:${a.action}`] = a.n;
  return out;
}

let reference: Record<string, number> = {};

beforeAll(async () => {
  for (const name of Object.values(names)) {
    await onServer(`DROP DATABASE IF EXISTS ${name}`);
    await onServer(`CREATE DATABASE ${name}`);
  }
  const ref = await on(names.reference);
  await ref.seedDemoIfEmpty(ref.db(), { catalogue: true, histories: true, log: () => {} });
  reference = await countsOf(ref.db);
  await ref.closeDb();
}, 300_000);

afterAll(async () => {
  const { closeDb } = await import('../db');
  await closeDb();
  vi.unstubAllEnvs();
  for (const name of Object.values(names)) await onServer(`DROP DATABASE IF EXISTS ${name}`);
}, 60_000);

/**
 * Runs a seed that is aborted when `when` says so (it sees every log line and every query),
 * and returns how long it took to stop and whether any query started after it had.
 */
async function stoppedSeed(s: Awaited<ReturnType<typeof on>>, when: (event: { log?: string; query?: boolean }) => boolean) {
  const stop = new AbortController();
  let abortedAt = 0;
  let queriesAfterStop = 0;
  let stoppedAt = 0;
  const abort = () => {
    if (abortedAt) return;
    abortedAt = performance.now();
    stop.abort();
  };
  s.db().addHook('beforeQuery', 'stop-probe', () => {
    if (stoppedAt) queriesAfterStop += 1;
    else if (when({ query: true })) abort();
  });
  const outcome = await s
    .seedDemoIfEmpty(s.db(), { catalogue: true, histories: true, signal: stop.signal, log: (m) => { if (when({ log: m })) abort(); } })
    .then(() => 'finished', (err: Error) => err.name);
  stoppedAt = performance.now();
  await new Promise((r) => setTimeout(r, 500)); // anything still running would query now
  s.db().removeHook('beforeQuery', 'stop-probe');
  return { outcome, stopMs: stoppedAt - abortedAt, queriesAfterStop };
}

describe('stopping the demo seed', () => {
  it('stops within a second or two mid-catalogue, mid-measurements and mid-loans, and the next seed completes the same demo', async () => {
    expect(reference.prints).toBeGreaterThan(250);
    expect(reference.measurement_sessions).toBeGreaterThan(100);
    expect(reference.display_periods).toBeGreaterThan(100);
    expect(reference.loans).toBeGreaterThan(3);
    const s = await on(names.stopped);

    // 1. Stopped in the middle of the prints (when the seed reports its first hundred).
    const first = await stoppedSeed(s, (e) => e.log?.startsWith('Demo catalogue: 100 of') ?? false);
    const afterFirst = await countsOf(s.db);
    console.info(`[seed stop] mid-catalogue: stopped ${first.stopMs.toFixed(0)} ms after the abort; ${afterFirst.prints} of ${reference.prints} prints`);
    expect(first.outcome).toBe('AbortError');
    expect(first.queriesAfterStop).toBe(0);
    expect(first.stopMs).toBeLessThan(3_000);
    expect(afterFirst.prints).toBeGreaterThanOrEqual(100);
    expect(afterFirst.prints).toBeLessThan(reference.prints);

    // 2. The next seed carries the catalogue on and is stopped in the middle of the measurements.
    let measuring = false;
    let queries = 0;
    const second = await stoppedSeed(s, (e) => {
      if (e.log?.includes('measurement histories')) measuring = true;
      if (measuring && e.query) queries += 1;
      return queries >= 150;
    });
    const afterSecond = await countsOf(s.db);
    console.info(`[seed stop] mid-measurements: stopped ${second.stopMs.toFixed(0)} ms after the abort; ${afterSecond.measurement_sessions} of ${reference.measurement_sessions} sessions`);
    expect(second.outcome).toBe('AbortError');
    expect(second.queriesAfterStop).toBe(0);
    expect(second.stopMs).toBeLessThan(3_000);
    expect(afterSecond.prints).toBe(reference.prints - reference.borrowed);
    expect(afterSecond.measurement_sessions).toBeGreaterThan(0);
    expect(afterSecond.measurement_sessions).toBeLessThan(reference.measurement_sessions);

    // 3. The next seed finishes the measurements and is stopped in the middle of the exhibitions and loans.
    let lending = false;
    let loanQueries = 0;
    const third = await stoppedSeed(s, (e) => {
      if (e.log?.includes('exhibitions, display periods and loans')) lending = true;
      if (lending && e.query) loanQueries += 1;
      return loanQueries >= 400;
    });
    const afterThird = await countsOf(s.db);
    console.info(`[seed stop] mid-loans: stopped ${third.stopMs.toFixed(0)} ms after the abort; ${afterThird.display_periods} of ${reference.display_periods} display periods`);
    expect(third.outcome).toBe('AbortError');
    expect(third.queriesAfterStop).toBe(0);
    expect(third.stopMs).toBeLessThan(3_000);
    expect(afterThird.measurement_sessions).toBe(reference.measurement_sessions);
    expect(afterThird.display_periods).toBeGreaterThan(0);
    expect(afterThird.display_periods).toBeLessThan(reference.display_periods);

    // 4. A seed left alone finishes: the demo equals the uninterrupted one, row for row and event for event.
    expect(await s.seedDemoIfEmpty(s.db(), { catalogue: true, histories: true, log: () => {} })).toBe(true);
    expect(await countsOf(s.db)).toEqual(reference);
    // Once finished, the demo is not seeded again.
    expect(await s.seedDemoIfEmpty(s.db(), { catalogue: true, histories: true, log: () => {} })).toBe(false);
  }, 300_000);
});
