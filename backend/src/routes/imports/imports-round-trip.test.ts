import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { parse } from 'csv-parse/sync';
import type { Print } from '@toneledger/common/schemas/catalogue';
import { testApp, sessionFor, type TestApp } from '../../../test/app';
import { onServer } from '../../../test/scratch-database';

/**
 * The acceptance test of the CSV design: the export of the demo catalogue (300 prints with their
 * process histories) imports into an empty catalogue and gives the same records, field by field.
 * It runs on a database of its own (created, migrated and seeded here, dropped at the end), so the
 * shared test database never holds the demo catalogue.
 */

const shared = process.env.DATABASE_URL!;
const name = `toneledger_roundtrip_${process.pid}`;
let t: TestApp;
let admin: string;
let wipe: () => Promise<void>;


beforeAll(async () => {
  await onServer(`DROP DATABASE IF EXISTS ${name}`);
  await onServer(`CREATE DATABASE ${name}`);
  const url = new URL(shared);
  url.pathname = `/${name}`;
  process.env.DATABASE_URL = url.toString();
  const { migrateUp } = await import('../../migrate');
  const { db } = await import('../../db');
  const { seedDemoIfEmpty } = await import('../../seed/demo');
  await migrateUp(db());
  await seedDemoIfEmpty(db(), { catalogue: true, histories: false, log: () => {} });
  // An empty catalogue: every print goes, with its steps and movements; makers, papers, recipes, places and enclosure types stay.
  wipe = async () => {
    await db().query('DELETE FROM prints');
  };
  t = testApp();
  admin = await sessionFor(t.app, 'admin');
}, 600_000);

afterAll(async () => {
  const { settleImports } = await import('../../services/import.service');
  await settleImports();
  await t?.close();
  process.env.DATABASE_URL = shared;
  await onServer(`DROP DATABASE IF EXISTS ${name}`);
});

const api = () => ({
  get: (path: string) => supertest(t.app).get(path).set('Cookie', admin),
  post: (path: string) => supertest(t.app).post(path).set('Cookie', admin).set('Origin', t.origin),
});

/** Every print by accession number, as the API shows it to an administrator. */
async function catalogue(): Promise<Map<string, Print>> {
  const ids: string[] = [];
  for (let page = 1; ; page++) {
    const res = await api().get(`/api/prints?pageSize=200&page=${page}`);
    ids.push(...res.body.data.map((p: { id: string }) => p.id));
    if (res.body.data.length < 200) break;
  }
  const out = new Map<string, Print>();
  for (const id of ids) {
    const res = await api().get(`/api/prints/${id}`);
    out.set(res.body.data.accessionNumber, res.body.data);
  }
  return out;
}

/** A print without what a new record necessarily gets anew: its id, version, times, and its steps' ids. */
function comparable(p: Print) {
  const { id: _i, version: _v, createdAt: _c, updatedAt: _u, steps, ...fields } = p;
  return { ...fields, steps: steps.map(({ id: _s, ...step }) => step) };
}

async function importFiles(prints: string, steps: string, mode: 'create_only' | 'create_or_update') {
  const { settleImports } = await import('../../services/import.service');
  const started = await api().post('/api/imports').attach('file', Buffer.from(prints), 'prints.csv').attach('steps', Buffer.from(steps), 'steps.csv');
  expect(started.status).toBe(202);
  await settleImports();
  const checked = (await api().get(`/api/imports/${started.body.data.id}`)).body.data;
  expect(checked.errors).toEqual([]);
  expect(checked.status).toBe('ready');
  const checkedAt = Date.now();
  if (checked.toUpdate === 0 && checked.toCreate === 0) return { checked, done: checked, commitMs: 0 };
  const commit = await api().post(`/api/imports/${checked.id}/commit`).send({ mode });
  expect(commit.status).toBe(202);
  await settleImports();
  const done = (await api().get(`/api/imports/${checked.id}`)).body.data;
  return { checked, done, commitMs: Date.now() - checkedAt };
}

describe('CSV round trip of the demo catalogue', () => {
  it('the export imports into an empty catalogue and gives the same records; imported again, it changes nothing', async () => {
    const before = await catalogue();
    expect(before.size).toBe(300);
    expect([...before.values()].some((p) => p.steps.length > 3)).toBe(true);

    let started = Date.now();
    const prints = await api().get('/api/prints/export.csv');
    const steps = await api().get('/api/prints/export-steps.csv');
    const exportMs = Date.now() - started;
    expect(prints.status).toBe(200);
    expect(steps.status).toBe(200);
    const printRows = parse(prints.text, { columns: true }) as Record<string, string>[];
    const stepRows = parse(steps.text, { columns: true }) as Record<string, string>[];
    expect(printRows).toHaveLength(300);
    expect(stepRows).toHaveLength([...before.values()].reduce((n, p) => n + p.steps.length, 0));
    expect(Object.keys(printRows[0])).toEqual(expect.arrayContaining(['location', 'staff_notes', 'valuation_amount', 'warnings', 'id', 'updated_at']));

    await wipe();
    expect((await api().get('/api/prints')).body.pagination.total).toBe(0);

    started = Date.now();
    const first = await importFiles(prints.text, steps.text, 'create_only');
    const importMs = Date.now() - started;
    expect(first.checked).toMatchObject({ toCreate: 300, toUpdate: 0, unchanged: 0, stepRows: stepRows.length, newMakers: [] });
    expect(first.checked.ignoredColumns).toEqual(['light_responsivity', 'toner_classes', 'warnings', 'borrowed', 'id', 'updated_at']);
    expect(first.done).toMatchObject({ status: 'committed', createdPrints: 300, updatedPrints: 0, mode: 'create_only' });

    const after = await catalogue();
    expect([...after.keys()].sort()).toEqual([...before.keys()].sort());
    let fields = 0;
    for (const [accession, was] of before) {
      const now = after.get(accession)!;
      expect(comparable(now), accession).toEqual(comparable(was));
      fields += Object.keys(comparable(was)).length - 1 + was.steps.reduce((n, s) => n + Object.keys(s).length - 1, 0);
    }

    // The same two files again, over the catalogue they made: every row matches its print, nothing is written.
    const second = await importFiles(prints.text, steps.text, 'create_or_update');
    expect(second.checked).toMatchObject({ toCreate: 0, toUpdate: 0, unchanged: 300 });
    const rows = await api().get(`/api/imports/${second.checked.id}/rows?pageSize=200&action=update`);
    expect(rows.body.pagination.total).toBe(0);

    console.log(
      `[round trip] ${before.size} prints, ${stepRows.length} steps, ${fields} fields compared; ` +
        `export ${exportMs} ms, import ${importMs} ms (check + commit; commit ${first.commitMs} ms)`,
    );
  }, 600_000);
});
