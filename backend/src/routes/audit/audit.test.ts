import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { testApp, sessionFor } from '../../../test/app';
import { createUser } from '../../../test/factories';
import { AuditEventModel } from '../../models';
import { db } from '../../db';

const t = testApp();
let admin: string;
let researcher: string;
beforeAll(async () => {
  admin = await sessionFor(t.app, 'admin');
  researcher = await sessionFor(t.app, 'researcher');
});
afterAll(() => t.close());

describe('GET /api/audit', () => {
  it('401 without a session, 403 for a researcher', async () => {
    expect((await supertest(t.app).get('/api/audit')).status).toBe(401);
    const res = await supertest(t.app).get('/api/audit').set('Cookie', researcher);
    expect(res.status).toBe(403);
  });

  it('400 for a bad filter', async () => {
    const res = await supertest(t.app).get('/api/audit?actorId=nobody').set('Cookie', admin);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('query.actorId');
  });

  it('shows a role change with who, when, before and after, newest first', async () => {
    const u = await createUser();
    await supertest(t.app).patch(`/api/users/${u.id}/role`).set('Cookie', admin).set('Origin', t.origin).send({ role: 'registrar' });
    const res = await supertest(t.app).get(`/api/audit?entityType=user&entityId=${u.id}`).set('Cookie', admin);
    expect(res.status).toBe(200);
    expect(res.body.data).toHaveLength(1);
    expect(res.body.data[0]).toMatchObject({ action: 'user.role_changed', before: { role: 'viewer' }, after: { role: 'registrar' }, actorName: expect.any(String) });
    const all = await supertest(t.app).get('/api/audit?pageSize=20').set('Cookie', admin);
    const times = all.body.data.map((e: { at: string }) => e.at);
    expect([...times].sort().reverse()).toEqual(times);
  });
});

describe('audit table', () => {
  it('refuses updates and deletes at the database', async () => {
    const row = await AuditEventModel.findOne();
    await expect(db().query('UPDATE audit_events SET action = $1 WHERE id = $2', { bind: ['tampered', row!.id] })).rejects.toThrow(/append-only/);
    await expect(db().query('DELETE FROM audit_events WHERE id = $1', { bind: [row!.id] })).rejects.toThrow(/append-only/);
  });
});
