import { describe, expect, it, vi } from 'vitest';
import type pg from 'pg';
import type { ObjectStore } from '@toneledger/storage/object-store';
import { checkHealth } from './health.service';

describe('checkHealth', () => {
  it('reports a connection slower than 2 s as down and gives it back to the pool when it arrives', async () => {
    const release = vi.fn();
    const late = { query: vi.fn(async () => ({ rows: [] })), release };
    const pool = { connect: () => new Promise((resolve) => setTimeout(() => resolve(late), 2_200)) } as unknown as pg.Pool;
    const store = { ping: async () => {} } as unknown as ObjectStore;

    const health = await checkHealth(pool, store, 'test');
    expect(health.status).toBe('degraded');
    expect(health.checks.database.ok).toBe(false);
    expect(health.checks.database.error).toMatch(/PostgreSQL/);

    // Held for ever otherwise: a few slow answers during an outage would use up the pool for good.
    await vi.waitFor(() => expect(release).toHaveBeenCalledTimes(1), { timeout: 1_000 });
    expect(late.query).not.toHaveBeenCalled();
  });
});
