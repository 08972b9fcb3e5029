import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { Readable } from 'node:stream';
import type { ObjectStore } from '@toneledger/storage/object-store';
import { onServer } from '../../test/scratch-database';

/**
 * What the demo gives a longevity study: the catalogue and its measurement histories, seeded into a
 * database of this test's own (created and dropped here), read back through the measurement service
 * and the analysis the app uses (`printSpotChanges` → `analyseSpotHistory`, ordinary least squares
 * with a 95 % interval from Student's t). The rates themselves are invented (DEVELOPERS.md, "Demo
 * data for research"); what is checked is that they are shaped like measured data: enough prints per
 * group, intervals wider than a ruled line gives, an order between the groups, prints that have not
 * yet faded (censored), iron blue slowing as it fades, and a display's loss partly recovered in the dark.
 */

const shared = process.env.DATABASE_URL!;
const name = `toneledger_seed_research_${process.pid}`;


type Modules = {
  db: typeof import('../db');
  measurements: typeof import('../services/measurement.service');
  fading: typeof import('@toneledger/common/domain/fading');
};
let m: Modules;
const rows = <T extends object>(sql: string, bind: unknown[] = []) => m.db.db().query<T>(sql, { bind, type: 'SELECT' as never }) as unknown as Promise<T[]>;

type Group = 'iron blue, borax' | 'iron blue, no borax' | 'selenium' | 'sulfide' | 'untoned' | 'resin-coated' | 'other';
interface Measured {
  id: string;
  accessionNumber: string;
  group: Group;
  /** The maximum-density spot's ΔE00 per year and its 95 % interval (null when the fit refuses). */
  rate: { value: number; ci95: [number, number] } | null;
  /** ΔE00 against the baseline at each comparable session, oldest first, with the session's day. */
  points: { measuredOn: string; dE00: number }[];
  firstSession: string;
}

const measured: Measured[] = [];
let threshold = 0;
let seedSeconds = 0;

function groupOf(p: { tonerClasses: string[]; support: string | null; borax: boolean }): Group {
  const t = p.tonerClasses;
  if (t.includes('iron_blue')) return p.borax ? 'iron blue, borax' : 'iron blue, no borax';
  if (t.length === 1 && t[0] === 'selenium' && p.support === 'fibre_baryta') return 'selenium';
  if (t.length > 0 && t.every((c) => c === 'sulfide' || c === 'polysulfide') && p.support === 'fibre_baryta') return 'sulfide';
  if (t.length === 0 && p.support === 'fibre_baryta') return 'untoned';
  if (p.support === 'resin_coated') return 'resin-coated';
  return 'other';
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const of = (g: Group) => measured.filter((x) => x.group === g);
const rates = (g: Group) => of(g).flatMap((x) => (x.rate ? [x.rate.value] : []));

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
  const started = performance.now();
  // The users and catalogue, then the condition histories (photographs kept in memory) and the
  // measurement histories, in the order the first start seeds them.
  const lines: string[] = [];
  await seedDemoIfEmpty(db.db(), { catalogue: true, histories: false, log: (l) => lines.push(l) });
  const { seedDemoMeasurements } = await import('./demo-measurements');
  const { seedDemoCondition } = await import('./demo-condition');
  const [conservator] = await db.db().query<{ id: string; name: string }>("SELECT id, name FROM users WHERE role = 'conservator' LIMIT 1", { type: 'SELECT' as never });
  const actor = { id: conservator.id, name: conservator.name };
  await seedDemoCondition(memoryStore(), actor, (l) => lines.push(l));
  await seedDemoMeasurements(actor, (l) => lines.push(l));
  seedSeconds = (performance.now() - started) / 1000;
  console.info(`${lines.filter((l) => l.startsWith('Demo')).join('\n')}\n[demo research] catalogue and measurements seeded in ${seedSeconds.toFixed(1)} s`);
  m = { db, measurements: await import('../services/measurement.service'), fading: await import('@toneledger/common/domain/fading') };

  const prints = await rows<{ id: string; accessionNumber: string; tonerClasses: string[]; support: string | null; borax: boolean; first: string }>(
    `SELECT p.id, p.accession_number AS "accessionNumber", p.toner_classes AS "tonerClasses", p.support,
            EXISTS (SELECT 1 FROM process_steps s WHERE s.print_id = p.id AND s.type = 'after_bath' AND s.alkaline) AS borax,
            (SELECT min(measured_on)::text FROM measurement_sessions s WHERE s.print_id = p.id) AS first
       FROM prints p WHERE EXISTS (SELECT 1 FROM measurement_sessions s WHERE s.print_id = p.id) ORDER BY p.accession_sort`,
  );
  for (const p of prints) {
    const { threshold: th, spots } = await m.measurements.printSpotChanges(p.id);
    threshold = th;
    const dmax = spots.find((s) => s.spot.purpose === 'dmax');
    if (!dmax) continue;
    measured.push({
      id: p.id, accessionNumber: p.accessionNumber, group: groupOf(p), firstSession: p.first,
      rate: dmax.rate?.ok ? { value: dmax.rate.slopePerYear, ci95: dmax.rate.ci95 } : null,
      points: dmax.points.flatMap((x) => (x.comparable ? [{ measuredOn: x.measuredOn, dE00: x.dE00 }] : [])),
    });
  }
  const summary = (['iron blue, borax', 'iron blue, no borax', 'selenium', 'sulfide', 'untoned', 'resin-coated', 'other'] as Group[])
    .map((g) => `${g}: ${of(g).length} measured, median ${median(rates(g)).toFixed(3)} ΔE00/yr`);
  console.info(`[demo research] ${measured.length} measured prints\n${summary.join('\n')}`);
}, 300_000);

/** An object store in memory: the demo photographs are written and read back, never kept. */
function memoryStore(): ObjectStore {
  const objects = new Map<string, { body: Buffer; contentType?: string }>();
  const read = async (body: Buffer | Readable) => {
    if (Buffer.isBuffer(body)) return body;
    const parts: Buffer[] = [];
    for await (const part of body) parts.push(Buffer.from(part));
    return Buffer.concat(parts);
  };
  return {
    bucket: 'memory',
    put: async (key, body, options) => { objects.set(key, { body: await read(body), contentType: options?.contentType }); },
    get: async (key) => {
      const o = objects.get(key);
      if (!o) throw Object.assign(new Error(`NoSuchKey: ${key}`), { name: 'NoSuchKey' });
      return Readable.from([o.body]);
    },
    head: async (key) => { const o = objects.get(key); return o ? { size: o.body.length, contentType: o.contentType } : null; },
    delete: async (key) => { objects.delete(key); },
    ping: async () => {},
  };
}

afterAll(async () => {
  await m?.db.closeDb();
  vi.unstubAllEnvs();
  await onServer(`DROP DATABASE IF EXISTS ${name}`);
}, 60_000);

describe('the demo as data for longevity research', () => {
  it('measures enough prints in each group a study compares, most of the gelatin silver prints', async () => {
    for (const g of ['iron blue, borax', 'iron blue, no borax', 'selenium', 'sulfide', 'untoned'] as Group[]) {
      expect(rates(g).length, g).toBeGreaterThanOrEqual(20);
    }
    const [{ n: rc }] = await rows<{ n: number }>(
      "SELECT count(DISTINCT p.id)::int AS n FROM prints p JOIN measurement_sessions s ON s.print_id = p.id WHERE p.support = 'resin_coated'",
    );
    expect(rc).toBeGreaterThanOrEqual(20);
    const [{ n: silver }] = await rows<{ n: number }>(
      "SELECT count(*)::int AS n FROM prints WHERE status <> 'deaccessioned' AND process IN ('gelatin_silver_developing_out', 'gelatin_silver_printing_out')",
    );
    expect(measured.length).toBeGreaterThan(silver / 2);
  });

  it('gives rates with intervals as wide as noisy readings give, not the ±0.01 of points on a line', () => {
    const halfWidths = measured.flatMap((x) => (x.rate ? [(x.rate.ci95[1] - x.rate.ci95[0]) / 2] : []));
    expect(halfWidths.length).toBeGreaterThan(100);
    expect(median(halfWidths)).toBeGreaterThan(0.02);
    expect(halfWidths.filter((w) => w < 0.01).length / halfWidths.length).toBeLessThan(0.25);
    // The intervals differ from print to print (different histories): the widest is many times the narrowest.
    expect(Math.max(...halfWidths) / Math.min(...halfWidths)).toBeGreaterThan(5);
    // The rates differ within a group too (each print its own rate): iron blue without borax spans a factor of three or more.
    const blue = rates('iron blue, no borax').filter((r) => r > 0);
    expect(Math.max(...blue) / Math.min(...blue)).toBeGreaterThan(3);
  });

  it('fades iron blue faster after a borax after-bath, and selenium slowest of all', () => {
    const borax = median(rates('iron blue, borax'));
    const plain = median(rates('iron blue, no borax'));
    expect(borax).toBeGreaterThan(1.5 * plain);
    const selenium = median(rates('selenium'));
    for (const g of ['iron blue, borax', 'iron blue, no borax', 'sulfide', 'untoned'] as Group[]) expect(median(rates(g)), g).toBeGreaterThan(selenium);
    expect(selenium).toBeGreaterThan(0);
    expect(selenium).toBeLessThan(0.05);
  });

  it('has prints that reached the noticeable change and prints that have not yet (censored), including some measured only recently', () => {
    const reached = (x: Measured) => x.points.some((p) => p.dE00 >= threshold);
    expect(threshold).toBe(2); // the measurement settings' default noticeable change (fading.ts)
    expect(of('iron blue, borax').filter(reached).length).toBeGreaterThanOrEqual(10);
    for (const g of ['iron blue, no borax', 'selenium', 'sulfide', 'untoned'] as Group[]) {
      expect(of(g).filter((x) => !reached(x)).length, g).toBeGreaterThanOrEqual(5);
    }
    const recent = measured.filter((x) => x.firstSession >= '2014-01-01');
    expect(recent.length).toBeGreaterThanOrEqual(15);
    expect(recent.filter((x) => !reached(x)).length).toBeGreaterThanOrEqual(10);
  });

  it('shows iron blue fading fastest at first and slowing later in long histories', () => {
    const long = of('iron blue, borax').concat(of('iron blue, no borax')).filter((x) => x.points.length >= 6 && x.rate && x.rate.value > 0.05);
    expect(long.length).toBeGreaterThanOrEqual(10);
    let slower = 0;
    for (const x of long) {
      const half = Math.floor(x.points.length / 2);
      const fit = (ps: Measured['points']) => m.fading.fadingRate(ps.map((p) => ({ t: p.measuredOn, value: p.dE00 })));
      const early = fit(x.points.slice(0, half + 1));
      const late = fit(x.points.slice(half));
      if (early.ok && late.ok && late.slopePerYear < early.slopePerYear) slower += 1;
    }
    expect(slower / long.length).toBeGreaterThan(0.6);
  });

  it('has signed condition reports recording fading and silver mirroring in some of the examined prints', async () => {
    const terms = await rows<{ term: string; prints: number }>(
      `SELECT o.term_code AS term, count(DISTINCT r.print_id)::int AS prints FROM observations o JOIN condition_reports r ON r.id = o.report_id
        WHERE r.status = 'signed' GROUP BY o.term_code`,
    );
    const printsWith = (term: string) => terms.find((t) => t.term === term)?.prints ?? 0;
    expect(printsWith('fading')).toBeGreaterThanOrEqual(5);
    expect(printsWith('silver_mirroring')).toBeGreaterThanOrEqual(3);
    const [{ reported }] = await rows<{ reported: number }>("SELECT count(DISTINCT print_id)::int AS reported FROM condition_reports WHERE status = 'signed'");
    // Not every examined print shows something: incidence is a share, not all or nothing.
    expect(printsWith('fading')).toBeLessThan(reported);
  });

  it('records a display\'s loss on return and most of it back after a year in the dark', async () => {
    const back = await rows<{ printId: string; measuredOn: string }>(
      "SELECT print_id AS \"printId\", measured_on::text AS \"measuredOn\" FROM measurement_sessions WHERE notes LIKE 'Measured on return from display%'",
    );
    expect(back.length).toBeGreaterThanOrEqual(5);
    let recovered = 0;
    for (const b of back) {
      const x = measured.find((p) => p.id === b.printId)!;
      const i = x.points.findIndex((p) => p.measuredOn === b.measuredOn);
      if (i > 0 && i + 1 < x.points.length && x.points[i + 1].dE00 < x.points[i].dE00) recovered += 1;
    }
    expect(recovered / back.length).toBeGreaterThan(0.5);
  });
});
