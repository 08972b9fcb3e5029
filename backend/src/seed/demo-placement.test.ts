import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { onServer } from '../../test/scratch-database';

/**
 * The demo's first placements are dated with the prints' accessioning, not with the day the seed
 * runs: the demo catalogue and its procedure records are seeded into a database of this test's own
 * (created and dropped here) and every print's history is read back.
 */

const shared = process.env.DATABASE_URL!;
const name = `toneledger_seed_placement_${process.pid}`;

type Modules = { db: typeof import('../db'); prints: typeof import('../services/print.service') };
let m: Modules;
const rows = <T extends object>(sql: string, bind: unknown[] = []) => m.db.db().query<T>(sql, { bind, type: 'SELECT' as never }) as unknown as Promise<T[]>;
const seedDay = new Date().toISOString().slice(0, 10);

beforeAll(async () => {
  await onServer(`DROP DATABASE IF EXISTS ${name}`);
  await onServer(`CREATE DATABASE ${name}`);
  vi.resetModules();
  const url = new URL(shared);
  url.pathname = `/${name}`;
  vi.stubEnv('DATABASE_URL', url.toString());
  const { migrateUp } = await import('../migrate');
  const db = await import('../db');
  await migrateUp(db.db());
  const { seedDemoIfEmpty } = await import('./demo');
  const { seedDemoProceduresIfEmpty } = await import('./demo-procedures');
  await seedDemoIfEmpty(db.db(), { catalogue: true, histories: false, log: () => {} });
  await seedDemoProceduresIfEmpty(db.db(), () => {});
  m = { db, prints: await import('../services/print.service') };
}, 300_000);

afterAll(async () => {
  await m?.db.closeDb();
  vi.unstubAllEnvs();
  await onServer(`DROP DATABASE IF EXISTS ${name}`);
}, 60_000);

interface Placement { id: string; accessionNumber: string; placedOn: string; placedAt: string; nextAt: string | null; acquiredOn: string | null }

describe('the demo first placements', () => {
  it('are dated in the accession year, before the next movement and on or after the acquisition, never on the seed day', async () => {
    const placed = await rows<Placement>(
      `SELECT p.id, p.accession_number AS "accessionNumber", to_char(f.moved_at AT TIME ZONE 'UTC', 'YYYY-MM-DD') AS "placedOn",
              f.moved_at AS "placedAt",
              (SELECT min(n.moved_at) FROM movements n WHERE n.print_id = p.id AND n.id <> f.id) AS "nextAt",
              (SELECT to_char(a.acquired_on, 'YYYY-MM-DD') FROM acquisition_prints ap JOIN acquisitions a ON a.id = ap.acquisition_id WHERE ap.print_id = p.id) AS "acquiredOn"
         FROM prints p JOIN movements f ON f.print_id = p.id AND f.from_location_id IS NULL`,
    );
    // The demo catalogue is about 300 prints, all but the deaccessioned ones placed.
    expect(placed.length).toBeGreaterThan(250);
    const wrong = placed.filter((p) => {
      const year = p.accessionNumber.slice(0, 4);
      return p.placedOn.slice(0, 4) !== year
        || (p.placedOn === seedDay && year !== seedDay.slice(0, 4))
        || (p.nextAt !== null && new Date(p.placedAt) > new Date(p.nextAt))
        || (p.acquiredOn !== null && p.placedOn < p.acquiredOn);
    });
    expect(wrong.map((p) => `${p.accessionNumber} placed ${p.placedOn} (next ${p.nextAt ? new Date(p.nextAt).toISOString() : '–'}, acquired ${p.acquiredOn ?? '–'})`)).toEqual([]);
    // The prints the demo gift accessioned (up to four numbered 2019.*, acquired 2019-06-03) were checked among them.
    const [{ n }] = await rows<{ n: number }>(`SELECT count(*)::int AS n FROM prints WHERE accession_number LIKE '2019.%' AND status <> 'deaccessioned'`);
    expect(placed.filter((p) => p.acquiredOn).length).toBe(Math.min(4, n));
  });

  it('gives every deaccessioned print a completed deaccession record, dated after its accession year and before today, in order', async () => {
    const gone = await rows<{ accessionNumber: string; on: string | null; proposed: string | null; approved: string | null; completed: string | null; method: string | null; records: number }>(
      `SELECT p.accession_number AS "accessionNumber", to_char(p.deaccessioned_on, 'YYYY-MM-DD') AS "on",
              to_char(d.proposed_on, 'YYYY-MM-DD') AS proposed, to_char(d.approved_on, 'YYYY-MM-DD') AS approved, to_char(d.completed_on, 'YYYY-MM-DD') AS completed, d.method,
              (SELECT count(*)::int FROM deaccessions x WHERE x.print_id = p.id) AS records
         FROM prints p LEFT JOIN deaccessions d ON d.print_id = p.id AND d.status = 'completed'
        WHERE p.status = 'deaccessioned' ORDER BY p.accession_sort`,
    );
    // The demo catalogue draws about 2 % of its prints as deaccessioned.
    expect(gone.length).toBeGreaterThan(0);
    const wrong = gone.filter((g) => g.records !== 1 || !g.completed || g.on !== g.completed
      || Number(g.completed.slice(0, 4)) <= Number(g.accessionNumber.slice(0, 4)) || g.completed >= seedDay
      || !(g.proposed! < g.approved! && g.approved! < g.completed));
    expect(wrong).toEqual([]);
    // More than one way out is shown when there are several.
    if (gone.length > 1) expect(new Set(gone.map((g) => g.method)).size).toBeGreaterThan(1);
  });

  it('leaves a print a person creates placed now', async () => {
    const [location] = await rows<{ id: string }>('SELECT id FROM locations ORDER BY name LIMIT 1');
    const before = Date.now();
    const created = await m.prints.createPrint(
      { ...(await import('@toneledger/common/schemas/catalogue')).printInputSchema.parse({ accessionNumber: '1978.99.1', title: 'Placed today', process: 'cyanotype', locationId: location.id }) },
      { id: null, name: 'Test registrar', role: 'registrar' }, null,
    );
    const [first] = await rows<{ movedAt: string }>('SELECT moved_at AS "movedAt" FROM movements WHERE print_id = $1', [created.id]);
    expect(new Date(first.movedAt).getTime()).toBeGreaterThanOrEqual(before - 1000);
  });
});
