import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { testApp, sessionFor } from '../../../test/app';
import { accession } from '../../../test/factories';
import { db } from '../../db';
import { settleBagJobs } from '../../services/preservation.service';
import { checkBag } from '../../services/bag/bag-check';
import { readSchema, withConnection } from '../../services/bag/connection';
import { PRINT_SECTIONS } from '../../services/bag/sections';
import { tablesOf } from '../../services/bag/section';
import { AUDIT_TABLE, COLLECTION_TABLES, LEFT_OUT_TABLES } from '../../services/bag/tables';

/**
 * The preservation package's endpoints on the shared test database (which holds prints of other
 * tests, so an import here is refused with 409; the whole round trip into an empty installation is
 * services/bag/bag-round-trip.test.ts).
 */
const t = testApp();
const cookie: Record<string, string> = {};
beforeAll(async () => {
  for (const r of ['admin', 'registrar', 'conservator', 'viewer'] as const) cookie[r] = await sessionFor(t.app, r);
});
afterAll(async () => {
  await settleBagJobs();
  await t.close();
});

const post = (role: string, body: unknown) => supertest(t.app).post('/api/preservation/exports').set('Cookie', cookie[role]).set('Origin', t.origin).send(body as object);
const getJob = (role: string, id: string) => supertest(t.app).get(`/api/preservation/jobs/${id}`).set('Cookie', cookie[role]);

async function makePrint(title: string) {
  const res = await supertest(t.app).post('/api/prints').set('Cookie', cookie.registrar).set('Origin', t.origin)
    .send({ accessionNumber: accession(), title, process: 'gelatin_silver_developing_out' });
  expect(res.status).toBe(201);
  return res.body.data as { id: string; accessionNumber: string };
}

/** The bag's tar as bytes, downloaded through the API. */
async function download(role: string, id: string) {
  return supertest(t.app).get(`/api/preservation/jobs/${id}/bag.tar`).set('Cookie', cookie[role])
    .buffer(true).parse((res, done) => { const parts: Buffer[] = []; res.on('data', (c: Buffer) => parts.push(c)); res.on('end', () => done(null, Buffer.concat(parts))); });
}

describe('what the bag holds', () => {
  it('accounts for every table of the database: a collection record, a print or a section of one, the audit trail, or left out with a reason', async () => {
    const tables = await withConnection(async (c) => (await readSchema(c)).tables());
    const placed = new Set([
      'prints', AUDIT_TABLE, ...COLLECTION_TABLES.map((t) => t.table), ...PRINT_SECTIONS.flatMap(tablesOf).map((t) => t.table), ...Object.keys(LEFT_OUT_TABLES),
    ]);
    // A new table fails here until it has a section (services/bag/sections/) or a line in tables.ts.
    expect(tables.filter((t) => !placed.has(t))).toEqual([]);
  });
});

describe('preservation package endpoints', () => {
  it('401 without a session; 403 for roles without the permission; the whole collection is the administrator\'s', async () => {
    expect((await supertest(t.app).post('/api/preservation/exports').set('Origin', t.origin).send({ scope: 'collection' })).status).toBe(401);
    expect((await post('conservator', { scope: 'selection', selection: { kind: 'query', query: {} } })).status).toBe(403);
    expect((await post('viewer', { scope: 'collection' })).status).toBe(403);
    const registrarAll = await post('registrar', { scope: 'collection' });
    expect(registrarAll.status).toBe(403);
    expect(registrarAll.body.error.code).toBe('forbidden');
    const imp = await supertest(t.app).post('/api/preservation/imports').set('Cookie', cookie.registrar).set('Origin', t.origin).attach('bag', Buffer.from('x'), 'b.tar');
    expect(imp.status).toBe(403);
  });

  it('400 names the bad field: an id that is no UUID, an empty list, an unknown scope', async () => {
    const bad = await post('registrar', { scope: 'selection', selection: { kind: 'ids', ids: ['not-an-id'] } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toEqual(['selection.ids.0']);
    expect((await post('registrar', { scope: 'selection', selection: { kind: 'ids', ids: [] } })).status).toBe(400);
    expect((await post('admin', { scope: 'everything' })).status).toBe(400);
  });

  it('a registrar bags a selection: the job runs, the bag checks clean, holds those prints only, and the export and download are audited', async () => {
    const a = await makePrint('Quay at dusk');
    const b = await makePrint('Net lofts, =SUM(A1)');
    const res = await post('registrar', { scope: 'selection', selection: { kind: 'ids', ids: [a.id, b.id] }, withImages: false });
    expect(res.status).toBe(202);
    expect(res.body.data).toMatchObject({ kind: 'export', scope: 'selection', status: 'queued' });
    await settleBagJobs();
    const job = (await getJob('registrar', res.body.data.id)).body.data;
    expect(job).toMatchObject({ status: 'done', done: 2, total: 2, downloadable: true, problems: [] });
    const bag = await download('registrar', job.id);
    expect(bag.status).toBe(200);
    expect(bag.headers['content-type']).toBe('application/x-tar');
    const check = await checkBag(Readable.from([bag.body as Buffer]));
    expect(check.problems).toEqual([]);
    expect(check.info.get('Payload-Oxum')).toEqual([job.payloadOxum]);
    expect(check.info.get('Toneledger-Prints')).toEqual(['2']);
    const names: string[] = [];
    const { readTar } = await import('../../services/bag/bag-check');
    await readTar(Readable.from([bag.body as Buffer]), async (name, _size, body) => { names.push(name); body.resume(); });
    expect(names.filter((n) => n.includes('/data/prints/')).sort()).toEqual([a, b].map((p) => `${check.root}/data/prints/${p.accessionNumber.replace(/[^A-Za-z0-9._-]/g, '_')}${/^[A-Za-z0-9._-]+$/.test(p.accessionNumber) ? '' : `--${p.id}`}.json`).sort());
    const audit = await db().query<{ action: string }>('SELECT action FROM audit_events WHERE entity_id = $1 ORDER BY id', { bind: [job.id], type: 'SELECT' as never });
    expect((audit as unknown as { action: string }[]).map((e) => e.action)).toEqual(['selection.exported', 'bag.downloaded']);
  });

  it('404 for a job that does not exist or is not the registrar\'s own; the administrator sees every job', async () => {
    expect((await getJob('admin', '00000000-0000-4000-8000-000000000000')).status).toBe(404);
    const mine = await post('admin', { scope: 'selection', selection: { kind: 'query', query: { q: 'no print has this title zzq' } }, withImages: false });
    expect(mine.status).toBe(202);
    await settleBagJobs();
    expect((await getJob('registrar', mine.body.data.id)).status).toBe(404);
    expect((await getJob('admin', mine.body.data.id)).body.data).toMatchObject({ status: 'done', total: 0 });
    const listed = (await supertest(t.app).get('/api/preservation/jobs').set('Cookie', cookie.registrar)).body.data as { id: string }[];
    expect(listed.some((j) => j.id === mine.body.data.id)).toBe(false);
  });

  it('409 for an import into an installation that holds prints, before the file is received', async () => {
    await makePrint('Slipway');
    const res = await supertest(t.app).post('/api/preservation/imports').set('Cookie', cookie.admin).set('Origin', t.origin).attach('bag', Buffer.from('x'), 'b.tar');
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/empty installation/);
  });
});
