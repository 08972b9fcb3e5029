import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES } from '@toneledger/common/domain/roles';
import { testApp } from '../../../test/app';
import { exhibitionClient, paths } from '../../../test/exhibition-helpers';
import { db } from '../../db';

/** Editing an object entry and an acquisition: registrars and administrators only, one version at a time, audited. */
const t = testApp();
let h: Awaited<ReturnType<typeof exhibitionClient>>;
beforeAll(async () => {
  h = await exhibitionClient(t);
});
afterAll(() => t.close());

const ok = (res: { status: number; body: unknown }, status = 200) => expect(res.status, JSON.stringify(res.body)).toBe(status);
const entryBody = { enteredOn: '2025-05-06', depositor: 'Orla Fenwick', reason: 'possible_acquisition', objectCount: 2, objectsDescription: 'Two toned gelatin silver prints' };
const auditOf = async (entityId: string, action: string) =>
  db().query<{ before: Record<string, unknown>; after: Record<string, unknown>; actor_name: string }>(
    'SELECT before, after, actor_name FROM audit_events WHERE entity_id = $1 AND action = $2 ORDER BY at', { bind: [entityId, action], type: 'SELECT' as never },
  ) as unknown as Promise<{ before: Record<string, unknown>; after: Record<string, unknown>; actor_name: string }[]>;

describe('editing an object entry', () => {
  it('is refused to roles without acquisitions.write, by the server', async () => {
    const e = (await h.as('registrar').post('/api/object-entries', entryBody)).body.data;
    for (const who of ROLES) {
      if (who === 'admin' || who === 'registrar') continue;
      const res = await h.as(who).patch(`/api/object-entries/${e.id}`, { depositor: 'Someone else', version: e.version });
      expect(res.status, who).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    expect((await h.as(null).patch(`/api/object-entries/${e.id}`, { depositor: 'x', version: e.version })).status).toBe(401);
    expect((await h.as('registrar').get(`/api/object-entries/${e.id}`)).body.data.depositor).toBe('Orla Fenwick');
  });

  it('saves the changes, keeps the number, audits before and after, and refuses a stale version with the current record', async () => {
    const e = (await h.as('registrar').post('/api/object-entries', entryBody)).body.data;
    const saved = await h.as('registrar').patch(`/api/object-entries/${e.id}`, { depositor: 'Orla Fenwick-Day', objectCount: 3, version: e.version });
    ok(saved);
    expect(saved.body.data).toMatchObject({ entryNumber: e.entryNumber, depositor: 'Orla Fenwick-Day', objectCount: 3, version: e.version + 1 });
    const [audit] = await auditOf(e.id, 'object_entry.updated');
    expect(audit.before).toMatchObject({ depositor: 'Orla Fenwick', objectCount: 2 });
    expect(audit.after).toMatchObject({ depositor: 'Orla Fenwick-Day', objectCount: 3 });
    const admin = await h.as('admin').patch(`/api/object-entries/${e.id}`, { notes: 'Checked against the depositor’s list', version: e.version + 1 });
    ok(admin);
    const stale = await h.as('registrar').patch(`/api/object-entries/${e.id}`, { depositor: 'Lost edit', version: e.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('conflict');
    expect((await h.as('registrar').get(`/api/object-entries/${e.id}`)).body.data.depositor).toBe('Orla Fenwick-Day');
  });

  it('answers bad input with a 400 envelope naming each field, and writes nothing', async () => {
    const e = (await h.as('registrar').post('/api/object-entries', entryBody)).body.data;
    const bad = await h.as('registrar').patch(`/api/object-entries/${e.id}`, { objectCount: 0, returnBy: '2025-02-30', reason: 'borrowed', version: e.version });
    expect(bad.status).toBe(400);
    expect(bad.body.error).toMatchObject({ code: 'validation_failed', status: 400 });
    expect(typeof bad.body.error.message).toBe('string');
    expect(paths(bad).sort()).toEqual(['objectCount', 'reason', 'returnBy']);
    // The number is of 2025: the date of entry stays in that year.
    const year = await h.as('registrar').patch(`/api/object-entries/${e.id}`, { enteredOn: '2026-01-02', version: e.version });
    expect(year.status).toBe(400);
    expect(paths(year)).toEqual(['enteredOn']);
    const noVersion = await h.as('registrar').patch(`/api/object-entries/${e.id}`, { depositor: 'x' });
    expect(noVersion.status).toBe(400);
    expect(paths(noVersion)).toEqual(['version']);
    expect((await h.as('registrar').patch('/api/object-entries/00000000-0000-4000-8000-000000000000', { depositor: 'x', version: 1 })).status).toBe(404);
    const now = (await h.as('registrar').get(`/api/object-entries/${e.id}`)).body.data;
    expect(now).toMatchObject({ objectCount: 2, returnBy: null, enteredOn: '2025-05-06', version: e.version });
    expect(await auditOf(e.id, 'object_entry.updated')).toEqual([]);
  });
});

describe('editing an acquisition', () => {
  it('registrars and administrators only; saves, audits, refuses stale versions and dates before the entry', async () => {
    const e = (await h.as('registrar').post('/api/object-entries', entryBody)).body.data;
    const a = (await h.as('registrar').post('/api/acquisitions', { entryId: e.id, source: 'Orla Fenwick', method: 'gift', acquiredOn: '2025-06-20' })).body.data;
    for (const who of ['conservator', 'researcher', 'viewer'] as const) {
      expect((await h.as(who).patch(`/api/acquisitions/${a.id}`, { funds: 'x', version: a.version })).status, who).toBe(403);
    }
    const saved = await h.as('registrar').patch(`/api/acquisitions/${a.id}`, { method: 'purchase', funds: 'Quayside Acquisitions Fund', approvedOn: '2025-06-02', version: a.version });
    ok(saved);
    expect(saved.body.data).toMatchObject({ method: 'purchase', funds: 'Quayside Acquisitions Fund', approvedOn: '2025-06-02', entryNumber: e.entryNumber, version: a.version + 1 });
    const [audit] = await auditOf(a.id, 'acquisition.updated');
    expect(audit.before).toMatchObject({ method: 'gift', funds: null });
    expect(audit.after).toMatchObject({ method: 'purchase', funds: 'Quayside Acquisitions Fund' });
    expect((await h.as('registrar').patch(`/api/acquisitions/${a.id}`, { funds: 'Lost edit', version: a.version })).status).toBe(409);
    // Not before the entry it follows (2025-05-06), not acquired before it was approved, a listed method only.
    const early = await h.as('registrar').patch(`/api/acquisitions/${a.id}`, { acquiredOn: '2025-05-01', version: a.version + 1 });
    expect(early.status).toBe(400);
    expect(paths(early)).toContain('acquiredOn');
    const method = await h.as('admin').patch(`/api/acquisitions/${a.id}`, { method: 'swap', version: a.version + 1 });
    expect(method.status).toBe(400);
    expect(paths(method)).toEqual(['method']);
    expect((await h.as('registrar').get(`/api/acquisitions/${a.id}`)).body.data).toMatchObject({ acquiredOn: '2025-06-20', method: 'purchase', version: a.version + 1 });
  });
});
