import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { testApp, sessionFor } from './app';
import { exited, startChildServer } from './child-server';
import { createMaker } from './factories';
import { db } from '../src/db';

/**
 * The API as its own process (`backend/src/server.ts`, the production entry, on the test database),
 * killed with SIGKILL while about a hundred print creations are in flight, then started again.
 * Every creation that was answered 201 must be there, and no print may be half-written.
 */
const t = testApp();
let registrar: string;
const children = new Set<ChildProcess>();

beforeAll(async () => {
  registrar = await sessionFor(t.app, 'registrar');
});
afterAll(async () => {
  for (const c of children) c.kill('SIGKILL');
  await t.close();
});

describe('a server killed while prints are being created', () => {
  it('keeps every print it answered 201 for, each whole, and serves again after a restart', { timeout: 180_000 }, async () => {
    const maker = await createMaker();
    const run = `2093.${Date.now() % 100000}`;
    const first = await startChildServer(children);
    const create = (i: number, url: string) =>
      fetch(`${url}/api/prints`, {
        method: 'POST',
        headers: { cookie: registrar, origin: t.origin, 'content-type': 'application/json' },
        body: JSON.stringify({ accessionNumber: `${run}.${i}`, title: `Crash ${i}`, process: 'gelatin_silver_developing_out', makerId: maker.id, dateMade: '1931' }),
        signal: AbortSignal.timeout(60_000),
      }).then(async (res) => ({ i, status: res.status, id: res.status === 201 ? ((await res.json()) as { data: { id: string } }).data.id : null }))
        .catch(() => ({ i, status: 0, id: null }));

    // About a hundred at once; the process is killed as soon as the first ones have been answered.
    let answered = 0;
    let killed = false;
    const all = Array.from({ length: 100 }, (_, k) =>
      create(k + 1, first.url).then((r) => {
        answered += r.status === 201 ? 1 : 0;
        if (answered >= 5 && !killed) { killed = true; first.child.kill('SIGKILL'); }
        return r;
      }));
    const results = await Promise.all(all);
    if (!killed) first.child.kill('SIGKILL');
    await exited(first.child);

    const created = results.filter((r) => r.status === 201);
    expect(created.length).toBeGreaterThanOrEqual(5);
    // Anything else was cut off by the kill (no answer), never refused.
    expect(results.filter((r) => r.status !== 201 && r.status !== 0)).toEqual([]);

    const second = await startChildServer(children);
    try {
      // Each print answered 201 is served after the restart.
      for (const r of created) {
        const res = await fetch(`${second.url}/api/prints/${r.id}`, { headers: { cookie: registrar } });
        expect(res.status).toBe(200);
        expect(((await res.json()) as { data: { accessionNumber: string } }).data.accessionNumber).toBe(`${run}.${r.i}`);
      }
      // Every print of this run that exists (answered or not) is whole: its audit row and its derived columns.
      const rows = await db().query<{ id: string; accession_number: string; accession_sort: string; maker_name: string | null; date_earliest: string | null; audits: number }>(
        `SELECT p.id, p.accession_number, p.accession_sort, p.maker_name, p.date_earliest::text,
                (SELECT count(*)::int FROM audit_events a WHERE a.action = 'print.created' AND a.entity_type = 'print' AND a.entity_id = p.id::text) AS audits
           FROM prints p WHERE p.accession_number LIKE $1`,
        { bind: [`${run}.%`], type: QueryTypes.SELECT },
      );
      expect(rows.length).toBeGreaterThanOrEqual(created.length);
      expect(rows.map((p) => p.id)).toEqual(expect.arrayContaining(created.map((r) => r.id)));
      for (const p of rows) {
        expect(p).toMatchObject({ audits: 1, maker_name: maker.name });
        expect(p.accession_sort).toBeTruthy();
        expect(p.date_earliest).toMatch(/^1931-01-01/);
      }
      // And it takes new work.
      const again = await create(1000, second.url);
      expect(again.status).toBe(201);
    } finally {
      second.child.kill('SIGTERM');
      const deadline = setTimeout(() => second.child.kill('SIGKILL'), 15_000);
      await exited(second.child);
      clearTimeout(deadline);
    }
  });
});
