import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import type { Role } from '@toneledger/common/domain/roles';
import { testApp, sessionFor } from '../../test/app';
import { accession } from '../../test/factories';
import { Maker, Print } from '../models';
import { bodyHash, canonicalJson } from './idempotency';

const t = testApp();
const c = {} as Record<Role, string>;
beforeAll(async () => {
  for (const r of ['admin', 'registrar'] as const) c[r] = await sessionFor(t.app, r);
});
afterAll(() => t.close());

const post = (url: string, role: Role, body: object, key?: string) => {
  const r = supertest(t.app).post(url).set('Origin', t.origin).set('Cookie', c[role]);
  return (key ? r.set('Idempotency-Key', key) : r).send(body);
};
const uniq = () => `${Date.now()}-${Math.floor(Math.random() * 1e6)}`;
const rowsOf = async (key: string) =>
  (await t.deps.pool.query('SELECT request, status, created_at FROM idempotency_keys WHERE key = $1', [key])).rows;

describe('Idempotency-Key on creates', () => {
  it('a retry with the same key and body gets the first answer and creates one print (no 409 for its own accession number)', async () => {
    const key = randomUUID();
    const body = { accessionNumber: accession(), title: 'Harbour wall at low tide', process: 'gelatin_silver_developing_out' };
    const first = await post('/api/prints', 'registrar', body, key);
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    // The same body with its keys in another order is the same request.
    const reordered = Object.fromEntries(Object.entries(body).reverse());
    const again = await post('/api/prints', 'registrar', reordered, key);
    expect(again.status, JSON.stringify(again.body)).toBe(201);
    expect(again.body).toEqual(first.body);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(await Print.count({ where: { accessionNumber: body.accessionNumber } })).toBe(1);
    expect(await rowsOf(key)).toEqual([expect.objectContaining({ request: 'POST /api/prints', status: 201 })]);
  });

  it('without the header a create is not remembered: a second send is the usual 409', async () => {
    const body = { accessionNumber: accession(), title: 'x', process: 'cyanotype' };
    expect((await post('/api/prints', 'registrar', body)).status).toBe(201);
    const again = await post('/api/prints', 'registrar', body);
    expect(again.status).toBe(409);
  });

  it('the same key with a different body is 422 in the error envelope, and nothing is created', async () => {
    const key = randomUUID();
    const name = `Maker ${uniq()}`;
    expect((await post('/api/makers', 'registrar', { name }, key)).status).toBe(201);
    const other = `Maker ${uniq()}`;
    const res = await post('/api/makers', 'registrar', { name: other }, key);
    expect(res.status).toBe(422);
    expect(res.body.error).toMatchObject({ code: 'unprocessable', status: 422, requestId: expect.any(String) });
    expect(await Maker.count({ where: { name: other } })).toBe(0);
  });

  it('the same key on another endpoint is 422', async () => {
    const key = randomUUID();
    const name = `Shared ${uniq()}`;
    expect((await post('/api/makers', 'registrar', { name }, key)).status).toBe(201);
    const res = await post('/api/enclosures', 'registrar', { name, alkalineBuffered: null, patResult: 'not_tested' }, key);
    expect(res.status).toBe(422);
  });

  it('keys belong to one user: another user with the same key does their own create', async () => {
    const key = randomUUID();
    const a = await post('/api/makers', 'registrar', { name: `Maker ${uniq()}` }, key);
    expect(a.status).toBe(201);
    const bName = `Maker ${uniq()}`;
    const b = await post('/api/makers', 'admin', { name: bName }, key);
    expect(b.status, JSON.stringify(b.body)).toBe(201);
    expect(b.body.data.id).not.toBe(a.body.data.id);
    expect(await Maker.count({ where: { name: bName } })).toBe(1);
    expect(await rowsOf(key)).toHaveLength(2);
  });

  it('a key older than 24 hours is not replayed: the request runs again', async () => {
    const key = randomUUID();
    const name = `Maker ${uniq()}`;
    expect((await post('/api/makers', 'registrar', { name }, key)).status).toBe(201);
    await t.deps.pool.query(`UPDATE idempotency_keys SET created_at = now() - interval '25 hours' WHERE key = $1`, [key]);
    // Run again, the create meets the maker it made a day ago: the usual refusal, not the old 201.
    const again = await post('/api/makers', 'registrar', { name }, key);
    expect(again.status).toBe(409);
    expect(again.headers['idempotent-replayed']).toBeUndefined();
    expect(await Maker.count({ where: { name } })).toBe(1);
  });

  it('a request whose key is still being handled gets 409; a refused request keeps no key', async () => {
    const key = randomUUID();
    const name = `Maker ${uniq()}`;
    const userId: string = (await supertest(t.app).get('/api/me').set('Cookie', c.registrar)).body.data.id;
    await t.deps.pool.query('INSERT INTO idempotency_keys (user_id, key, request, body_hash) VALUES ($1, $2, $3, $4)', [
      userId, key, 'POST /api/makers', bodyHash({ name }),
    ]);
    const busy = await post('/api/makers', 'registrar', { name }, key);
    expect(busy.status).toBe(409);
    expect(busy.body.error.code).toBe('conflict');
    expect(await Maker.count({ where: { name } })).toBe(0);

    const refusedKey = randomUUID();
    const refused = await post('/api/makers', 'registrar', { name: '' }, refusedKey);
    expect(refused.status).toBe(400);
    expect(await rowsOf(refusedKey)).toEqual([]);
  });

  it('a malformed key is a 400 naming the header', async () => {
    const res = await post('/api/makers', 'registrar', { name: `Maker ${uniq()}` }, 'has space');
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('headers.idempotency-key');
  });

  it('the OpenAPI document lists the header on idempotent endpoints only', async () => {
    const res = await supertest(t.app).get('/api/openapi.json');
    const names = (op: { parameters: { name: string }[] }) => op.parameters.map((p) => p.name);
    expect(names(res.body.paths['/api/prints'].post)).toContain('Idempotency-Key');
    expect(res.body.paths['/api/prints'].post.responses['422']).toBeDefined();
    expect(names(res.body.paths['/api/prints/{id}'].patch)).not.toContain('Idempotency-Key');
  });
});

describe('canonicalJson', () => {
  it('sorts object keys at every level and keeps array order', () => {
    expect(canonicalJson({ b: 1, a: { d: [2, 1], c: null } })).toBe('{"a":{"c":null,"d":[2,1]},"b":1}');
    expect(bodyHash({ a: 1, b: 2 })).toBe(bodyHash({ b: 2, a: 1 }));
  });
});
