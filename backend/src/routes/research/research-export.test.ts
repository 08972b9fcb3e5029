import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import yauzl from 'yauzl';
import type supertest from 'supertest';
import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { parse } from 'csv-parse/sync';
import { Package } from 'datapackage';
import { COHORT_FACTOR_CODES } from '@toneledger/common/fields/cohort';
import { testApp } from '../../../test/app';
import { createLocation } from '../../../test/factories';
import { db } from '../../db';
import { researchClient, settleOutcomes } from './research-helpers';

const t = testApp();
const { api, signInAll, newPrint, addStep, signedReport, newSpot, session } = researchClient(t);
const base = `2096.${Date.now() % 100000}`;
let place: string;

beforeAll(async () => {
  await signInAll();
  const wing = await createLocation(`Export wing ${base}`);
  place = wing.id;
  const made: string[] = [];
  for (let i = 1; i <= 4; i += 1) {
    // A title a spreadsheet would run as a formula: the CSV cell rule must neutralise it.
    const p = await newPrint(`${base}.${i}`, wing.id, i === 1 ? { title: '=HYPERLINK("x")' } : {});
    made.push(p.id);
    await addStep(p.id, 1, 'toning', { tonerClass: i % 2 ? 'selenium' : 'gold', timeSeconds: 60 * i });
    await signedReport(p.id, '2015-03-01', 'good');
    await signedReport(p.id, '2019-03-01', i % 2 ? 'poor' : 'good', i % 2 ? ['silver_mirroring'] : []);
    if (i <= 2) {
      const spot = await newSpot(p.id, 'Shadow', 'dmax');
      await session(p.id, '2015-03-01', [{ spotId: spot.id, lab: { L: 20, a: 0, b: 0 }, density: 1.9 }]);
      await session(p.id, '2017-03-01', [{ spotId: spot.id, lab: { L: 20.5, a: 0.2, b: 0.5 }, density: 1.85 }]);
      await session(p.id, '2019-03-01', [{ spotId: spot.id, lab: { L: 21, a: 0.5, b: 1 }, density: 1.8 }]);
    }
  }
  await settleOutcomes(made);
}, 120_000);
afterAll(() => t.close());

const query = () => ({ filters: [{ factor: 'location', locationId: place }], groupBy: ['tonerClass'], event: { kind: 'grade', grade: 'poor' } });

/** Every file of a zip, as text. */
function unzip(buf: Buffer): Promise<Map<string, string>> {
  return new Promise((resolve, reject) => {
    const out = new Map<string, string>();
    yauzl.fromBuffer(buf, { lazyEntries: true }, (err, zip) => {
      if (err || !zip) return reject(err);
      zip.on('entry', (entry: yauzl.Entry) => {
        zip.openReadStream(entry, (e, stream) => {
          if (e || !stream) return reject(e);
          const chunks: Buffer[] = [];
          stream.on('data', (c: Buffer) => chunks.push(c));
          stream.on('end', () => { out.set(entry.fileName, Buffer.concat(chunks).toString('utf8')); zip.readEntry(); });
        });
      });
      zip.on('end', () => resolve(out));
      zip.readEntry();
    });
  });
}

const binary = (res: supertest.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

interface Field { name: string; type: string; title: string; description: string; format?: string; constraints?: { enum?: string[]; required?: boolean } }

/** A cell fits its declared Table Schema type (Frictionless Table Schema: string, number, integer, boolean; uuid format; enum). */
function fits(cell: string, f: Field): boolean {
  if (cell === '') return !f.constraints?.required;
  if (f.constraints?.enum && !f.constraints.enum.includes(cell)) return false;
  switch (f.type) {
    case 'number': return /^-?\d+(\.\d+)?([eE][-+]?\d+)?$/.test(cell);
    case 'integer': return /^-?\d+$/.test(cell);
    case 'boolean': return cell === 'true' || cell === 'false';
    default: return f.format !== 'uuid' || /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/.test(cell);
  }
}

describe('export', () => {
  it('a Frictionless Data Package: every resource\'s fields match its CSV header, every value fits its type; audited', async () => {
    const res = await api('researcher').post('/api/research/cohort/export', query()).buffer(true).parse(binary);
    expect(res.status, String(res.body)).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    const files = await unzip(res.body as Buffer);
    expect([...files.keys()].sort()).toEqual(['README.md', 'cohort.csv', 'cohort.json', 'datapackage.json', 'fading.csv', 'query.json', 'survival.csv']);
    const pkg = JSON.parse(files.get('datapackage.json')!);
    expect(pkg.profile).toBe('tabular-data-package');
    expect(pkg.name).toMatch(/^[a-z0-9._-]+$/);
    expect(Number.isNaN(Date.parse(pkg.created))).toBe(false);
    expect(pkg.query.groupBy).toEqual(['tonerClass']);
    expect(JSON.parse(files.get('query.json')!)).toEqual(pkg.query);
    for (const r of pkg.resources as { name: string; path: string; format: string; schema: { fields: Field[] } }[]) {
      expect(files.has(r.path), r.path).toBe(true);
      for (const f of r.schema.fields) expect(f.title && f.description, `${r.name}.${f.name}`).toBeTruthy();
      const names = r.schema.fields.map((f) => f.name);
      if (r.format === 'json') {
        const rows = JSON.parse(files.get(r.path)!) as Record<string, unknown>[];
        for (const row of rows) expect(Object.keys(row)).toEqual(names);
        continue;
      }
      const [header, ...rows] = parse(files.get(r.path)!, { bom: false }) as string[][];
      expect(header, r.name).toEqual(names);
      expect(rows.length, r.name).toBeGreaterThan(0);
      for (const row of rows) row.forEach((cell, i) => expect(fits(cell, r.schema.fields[i]!), `${r.name} row ${row.join(',')} column ${names[i]} = "${cell}"`).toBe(true));
    }
    // Every factor is a column of the cohort, with its unit where it has one.
    const cohort = pkg.resources.find((r: { name: string }) => r.name === 'cohort');
    for (const code of COHORT_FACTOR_CODES) expect(cohort.schema.fields.map((f: Field) => f.name)).toContain(code);
    expect(cohort.schema.fields.find((f: Field & { unit?: string }) => f.name === 'toningMinutes').unit).toBe('min');
    const [header, ...rows] = parse(files.get('cohort.csv')!) as string[][];
    expect(rows).toHaveLength(4);
    // The formula-like title starts with an apostrophe (csv-cells.ts).
    expect(rows.map((r) => r[header.indexOf('title')])).toContain('\'=HYPERLINK("x")');
    expect(rows.map((r) => r[header.indexOf('toningMinutes')]).sort()).toEqual(['1', '2', '3', '4']);
    // Two prints reached "poor" four years after the first report: their events are true.
    expect(rows.filter((r) => r[header.indexOf('event')] === 'true')).toHaveLength(2);

    const audit = await db().query<{ after: { rows: number; query: { groupBy: string[] } } }>(
      `SELECT after FROM audit_events WHERE action = 'research.exported' ORDER BY id DESC LIMIT 1`, { type: QueryTypes.SELECT });
    expect(audit[0]!.after.rows).toBe(4);
    expect(audit[0]!.after.query.groupBy).toEqual(['tonerClass']);
  });

  it('the Frictionless reference library (datapackage, offline) finds the descriptor valid and casts every CSV row by its Table Schema', async () => {
    const res = await api('conservator').post('/api/research/cohort/export', query()).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    const files = await unzip(res.body as Buffer);
    const dir = await fs.mkdtemp(path.join(os.tmpdir(), 'toneledger-datapackage-'));
    try {
      for (const [name, text] of files) await fs.writeFile(path.join(dir, name), text);
      const pkg = await Package.load(path.join(dir, 'datapackage.json'));
      expect(pkg.errors.map((e) => e.message)).toEqual([]);
      expect(pkg.valid).toBe(true);
      for (const name of ['cohort', 'survival', 'fading']) {
        const rows = await pkg.getResource(name)!.read({ keyed: true });
        expect(rows.length, name).toBe(parse(files.get(`${name}.csv`)!).length - 1);
      }
    } finally {
      await fs.rm(dir, { recursive: true, force: true });
    }
  });

  it('admins export too; viewers and registrars get 403', async () => {
    expect((await api('admin').post('/api/research/cohort/export', query()).buffer(true).parse(binary)).status).toBe(200);
    for (const who of ['viewer', 'registrar'] as const) expect((await api(who).post('/api/research/cohort/export', query())).status).toBe(403);
  });
});

describe('saved queries', () => {
  it('the owner edits and deletes with the version; shared ones are seen by others, private ones not; a stale version is 409', async () => {
    const made = await api('researcher').post('/api/research/queries', { name: 'Toner classes, grade poor', query: query() });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const id = made.body.data.id as string;
    expect(made.body.data).toMatchObject({ shared: false, version: 1, description: null });
    expect((await api('conservator').get(`/api/research/queries/${id}`)).status).toBe(404);
    const listed = await api('conservator').get('/api/research/queries');
    expect(listed.body.data.map((q: { id: string }) => q.id)).not.toContain(id);

    const shared = await api('researcher').patch(`/api/research/queries/${id}`, { version: 1, shared: true, description: 'For the survey' });
    expect(shared.status, JSON.stringify(shared.body)).toBe(200);
    expect(shared.body.data).toMatchObject({ shared: true, version: 2, description: 'For the survey', name: 'Toner classes, grade poor' });
    expect((await api('conservator').get(`/api/research/queries/${id}`)).body.data.query.groupBy).toEqual(['tonerClass']);
    // A rename alone leaves the sharing as it was.
    const renamed = await api('researcher').patch(`/api/research/queries/${id}`, { version: 2, name: 'Toner classes, graded poor' });
    expect(renamed.body.data).toMatchObject({ shared: true, version: 3, name: 'Toner classes, graded poor' });
    expect((await api('conservator').get('/api/research/queries')).body.data.map((q: { id: string }) => q.id)).toContain(id);
    expect((await api('conservator').get('/api/research/queries?mine=true')).body.data.map((q: { id: string }) => q.id)).not.toContain(id);

    const notOwner = await api('conservator').patch(`/api/research/queries/${id}`, { version: 3, name: 'Mine now' });
    expect(notOwner.status).toBe(403);
    expect((await api('conservator').delete(`/api/research/queries/${id}?version=3`)).status).toBe(403);
    const stale = await api('researcher').patch(`/api/research/queries/${id}`, { version: 1, name: 'Old form' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current.version).toBe(3);
    expect((await api('researcher').delete(`/api/research/queries/${id}?version=1`)).status).toBe(409);

    const bad = await api('researcher').post('/api/research/queries', { name: '', query: { groupBy: ['location'] } });
    expect(bad.status).toBe(400);

    expect((await api('researcher').delete(`/api/research/queries/${id}?version=3`)).status).toBe(204);
    expect((await api('researcher').get(`/api/research/queries/${id}`)).status).toBe(404);
    const trail = await db().query<{ action: string }>(`SELECT action FROM audit_events WHERE entity_id = $1 ORDER BY id`, { bind: [id], type: QueryTypes.SELECT });
    expect(trail.map((a) => a.action)).toEqual(['research_query.created', 'research_query.updated', 'research_query.updated', 'research_query.deleted']);
  });
});
