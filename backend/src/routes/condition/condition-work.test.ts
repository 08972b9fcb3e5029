import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { sessionFor, testApp } from '../../../test/app';
import { accession } from '../../../test/factories';

/** The condition area's opening page: the conservator's own drafts and reports, the latest by anyone, fixity alerts. */
const t = testApp();
const c = {} as Record<Role, string>;
beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
});
afterAll(() => t.close());

const get = (url: string, who: Role | null) => (who ? supertest(t.app).get(url).set('Cookie', c[who]) : supertest(t.app).get(url));
const post = (url: string, body: object, who: Role) => supertest(t.app).post(url).set('Origin', t.origin).set('Cookie', c[who]).send(body);

async function newPrint() {
  const res = await post('/api/prints', { accessionNumber: accession(), title: 'Slipway at dusk', process: 'gelatin_silver_developing_out' }, 'registrar');
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; accessionNumber: string };
}

describe('GET /api/condition/work', () => {
  it('401 without a session, 403 for a viewer', async () => {
    expect((await get('/api/condition/work', null)).status).toBe(401);
    const res = await get('/api/condition/work', 'viewer');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
  });

  it('lists the conservator’s drafts and signed reports, and the latest signed by anyone', async () => {
    const print = await newPrint();
    const draft = (await post(`/api/prints/${print.id}/condition-reports`, { examinedOn: '2025-03-14', context: 'routine' }, 'conservator')).body.data;
    const toSign = (await post(`/api/prints/${print.id}/condition-reports`, { examinedOn: '2025-03-15', context: 'routine', grade: 'good' }, 'conservator')).body.data;
    const signed = await post(`/api/condition-reports/${toSign.id}/sign`, { version: toSign.version }, 'conservator');
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);

    const mine = await get('/api/condition/work', 'conservator');
    expect(mine.status).toBe(200);
    expect(mine.body.data.myDrafts.map((r: { id: string }) => r.id)).toContain(draft.id);
    expect(mine.body.data.myDrafts.every((r: { status: string }) => r.status === 'draft')).toBe(true);
    expect(mine.body.data.mySigned[0]).toMatchObject({ id: toSign.id, accessionNumber: print.accessionNumber, status: 'signed', grade: 'good', examinedOn: '2025-03-15' });
    expect(mine.body.data.recent[0].id).toBe(toSign.id);
    expect(mine.body.data.recent.length).toBeLessThanOrEqual(10);

    // A registrar has no drafts of their own, and never sees the conservator's.
    const theirs = await get('/api/condition/work', 'registrar');
    expect(theirs.status).toBe(200);
    expect(theirs.body.data.myDrafts).toEqual([]);
    expect(theirs.body.data.recent.map((r: { id: string }) => r.id)).toContain(toSign.id);
  });
});

describe('GET /api/admin/fixity/alerts', () => {
  it('conservators and administrators read the alerts; registrars and researchers do not', async () => {
    expect((await get('/api/admin/fixity/alerts', 'conservator')).status).toBe(200);
    expect((await get('/api/admin/fixity/alerts', 'admin')).status).toBe(200);
    expect((await get('/api/admin/fixity/alerts', 'registrar')).status).toBe(403);
    expect((await get('/api/admin/fixity/alerts', 'researcher')).status).toBe(403);
    // Running the check stays with administrators.
    expect((await post('/api/admin/fixity/run', {}, 'conservator')).status).toBe(403);
  });
});
