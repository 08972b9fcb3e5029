import { afterAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { testApp } from '../../../test/app';
import type { ObjectStore } from '@toneledger/storage/object-store';

const t = testApp();
afterAll(() => t.close());

describe('GET /api/health', () => {
  it('answers ok when PostgreSQL and S3 answer', async () => {
    const res = await supertest(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.data.status).toBe('ok');
    expect(res.body.data.checks.database.ok).toBe(true);
    expect(res.body.data.checks.storage.ok).toBe(true);
    expect(res.headers['x-request-id']).toMatch(/.{8,}/);
  });

  it('answers 503 naming object storage when S3 is down', async () => {
    const down: ObjectStore = { ...t.deps.store, bucket: 'x', ping: async () => { throw new Error('ECONNREFUSED'); } } as ObjectStore;
    const broken = testApp({ store: down });
    try {
      const res = await supertest(broken.app).get('/api/health');
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('service_unavailable');
      expect(res.body.error.message).toMatch(/Object storage/);
      expect(res.body.error.message).not.toMatch(/PostgreSQL/);
      expect(res.body.error.details.checks.database.ok).toBe(true);
    } finally {
      await broken.close();
    }
  });

  it('answers 503 naming PostgreSQL when the database is down', async () => {
    const pg = await import('pg');
    const deadPool = new pg.default.Pool({ host: '127.0.0.1', port: 1, user: 'x', database: 'x', connectionTimeoutMillis: 500 });
    const broken = testApp({ pool: deadPool });
    try {
      const res = await supertest(broken.app).get('/api/health');
      expect(res.status).toBe(503);
      expect(res.body.error.message).toMatch(/PostgreSQL/);
      expect(res.body.error.details.checks.storage.ok).toBe(true);
    } finally {
      await broken.close();
    }
  });
});

describe('GET /api/openapi.json', () => {
  it('lists every mounted route with its access rule', async () => {
    const res = await supertest(t.app).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    const { allRoutes } = await import('../../app');
    for (const { endpoint: r } of allRoutes(t.deps)) {
      const p = r.path.replace(/:([A-Za-z0-9_]+)/g, '{$1}');
      expect(res.body.paths[p]?.[r.method], `${r.method} ${p}`).toBeDefined();
      expect(res.body.paths[p][r.method]['x-access']).toBe(r.access);
    }
    expect(res.body.paths['/api/users/{id}/role'].patch.responses['403']).toBeDefined();
    // Path parameters carry their real types from the contract's params schema.
    const idParam = res.body.paths['/api/prints/{id}'].get.parameters.find((x: { name: string }) => x.name === 'id');
    expect(idParam).toMatchObject({ in: 'path', required: true, schema: { type: 'string', format: 'uuid' } });
    const variant = res.body.paths['/api/images/{id}/file/{variant}'].get.parameters.find((x: { name: string }) => x.name === 'variant');
    expect(variant.schema.enum).toEqual(['thumb', 'screen', 'original']);
    expect(res.body.paths['/api/users'].get.parameters.map((x: { name: string }) => x.name)).toContain('sort');
  });
});

describe('errors and headers', () => {
  it('answers an unknown API path with the not_found envelope', async () => {
    const res = await supertest(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: { code: 'not_found', message: expect.any(String), status: 404, requestId: res.headers['x-request-id'] } });
  });

  it('sends a Content-Security-Policy without inline scripts', async () => {
    const res = await supertest(t.app).get('/api/health');
    const csp = res.headers['content-security-policy'];
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toContain('unsafe-inline');
    expect(csp).toContain("frame-ancestors 'none'");
  });

  it('refuses malformed JSON with validation_failed, not a stack trace', async () => {
    const res = await supertest(t.app)
      .post('/auth/logout')
      .set('Origin', t.origin)
      .set('Content-Type', 'application/json')
      .send('{"oops":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts:\d+/);
  });

  it('refuses a body over the limit with payload_too_large', async () => {
    const res = await supertest(t.app)
      .post('/auth/logout')
      .set('Origin', t.origin)
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ pad: 'x'.repeat(1_100_000) }));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });
});

describe('the contract', () => {
  it('every endpoint described in common/src/api is served exactly once, and nothing else is', async () => {
    const { allRoutes } = await import('../../app');
    const { allContracts } = await import('@toneledger/common/api/all');
    const served = allRoutes(t.deps).map((r) => r.endpoint);
    const described = Object.values(allContracts).flatMap((c) => Object.values(c));
    expect(served.length).toBe(described.length);
    for (const e of described) expect(served.filter((s) => s === e), `${e.method} ${e.path}`).toHaveLength(1);
    const keys = served.map((e) => `${e.method} ${e.path}`);
    expect(new Set(keys).size).toBe(keys.length);
  });
});
