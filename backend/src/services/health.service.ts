import type pg from 'pg';
import type { ObjectStore } from '@toneledger/storage/object-store';
import type { Health } from '@toneledger/common/schemas/system';

async function timed(check: () => Promise<unknown>) {
  const start = performance.now();
  try {
    await check();
    return { ok: true, latencyMs: Math.round((performance.now() - start) * 10) / 10 };
  } catch (err) {
    return { ok: false, latencyMs: null, error: err instanceof Error ? err.name : 'Error' };
  }
}

export async function checkHealth(pool: pg.Pool, store: ObjectStore, version: string): Promise<Health> {
  const [database, storage] = await Promise.all([
    timed(async () => {
      // A connection that arrives after the deadline goes back to the pool (it would otherwise be held for ever).
      const connecting = pool.connect();
      let timer: NodeJS.Timeout | undefined;
      const client = await Promise.race([
        connecting,
        new Promise<never>((_, reject) => {
          timer = setTimeout(() => {
            connecting.then((late) => late.release(), () => {});
            reject(new Error('timeout'));
          }, 2000);
        }),
      ]).finally(() => clearTimeout(timer));
      try {
        await client.query('SELECT 1');
      } finally {
        client.release();
      }
    }),
    timed(() => store.ping(2000)),
  ]);
  const describe = (name: string, r: { ok: boolean; latencyMs: number | null; error?: string }) =>
    r.ok ? r : { ...r, error: `${name} is not reachable (${r.error})` };
  return {
    status: database.ok && storage.ok ? 'ok' : 'degraded',
    version,
    checks: { database: describe('PostgreSQL', database), storage: describe('Object storage', storage) },
  };
}
