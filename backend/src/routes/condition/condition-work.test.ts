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

describe("the print's timeline", () => {
  it('shows a long addendum cut at a word, with an ellipsis, never mid-word', async () => {
    const print = await newPrint();
    const draft = (await post(`/api/prints/${print.id}/condition-reports`, { examinedOn: '2025-05-02', context: 'routine', grade: 'fair' }, 'conservator')).body.data;
    const signed = await post(`/api/condition-reports/${draft.id}/sign`, { version: draft.version }, 'conservator');
    expect(signed.status).toBe(200);
    // 197 characters of words, then a long word across the 200th character.
    const text = `${'Cockling along the lower edge is more pronounced than recorded. '.repeat(3).slice(0, 197)} emulsionfracturing continues inward along the mount.`;
    expect((await post(`/api/condition-reports/${draft.id}/addenda`, { text }, 'conservator')).status).toBe(201);
    const timeline = await get(`/api/prints/${print.id}/timeline`, 'conservator');
    const entry = timeline.body.data.find((e: { kind: string }) => e.kind === 'addendum');
    expect(entry.detail.endsWith('…')).toBe(true);
    const shown = entry.detail.slice(0, -1) as string;
    expect(text.startsWith(shown)).toBe(true);
    // What follows the shown text in the addendum is a space or punctuation: no word was cut.
    expect(text.charAt(shown.length)).toMatch(/[\s.,;]/);
    expect(shown).not.toContain('emulsionfr');
  });
});

describe('GET /api/prints/:id/deletion', () => {
  it('says a print with a condition report cannot be deleted, before anyone tries; a fresh print can', async () => {
    const fresh = await newPrint();
    expect((await get(`/api/prints/${fresh.id}/deletion`, 'registrar')).body.data).toEqual({ ok: true, reason: null });
    const reported = await newPrint();
    expect((await post(`/api/prints/${reported.id}/condition-reports`, { examinedOn: '2025-05-02', context: 'routine' }, 'conservator')).status).toBe(201);
    const asked = await get(`/api/prints/${reported.id}/deletion`, 'registrar');
    expect(asked.body.data.ok).toBe(false);
    // The delete itself gives the same reason.
    const version = (await get(`/api/prints/${reported.id}`, 'registrar')).body.data.version;
    const refused = await supertest(t.app).delete(`/api/prints/${reported.id}?version=${version}`).set('Origin', t.origin).set('Cookie', c.registrar);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toBe(asked.body.data.reason);
    expect((await get(`/api/prints/${reported.id}/deletion`, 'viewer')).status).toBe(403);
    expect((await get('/api/prints/00000000-0000-4000-8000-000000000000/deletion', 'registrar')).status).toBe(404);
  });
});
