import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { Op } from 'sequelize';
import { signIn, testApp, sessionFor } from '../../../test/app';
import { TEST_ONLY_ACCOUNTS } from '../../../test/accounts';
import { createUser } from '../../../test/factories';
import { db } from '../../db';
import { AuditEventModel, User } from '../../models';
import { deactivateUser } from '../../services/user.service';

/**
 * Deactivating a person keeps them in the record (their name stays on what they did), ends every
 * session of theirs at once and refuses their next sign-in; reactivating lets them in again.
 */
const t = testApp();
const leaver = TEST_ONLY_ACCOUNTS.find((a) => a.id === 'test-leaver')!;
let admin: string;
let registrar: string;
beforeAll(async () => {
  admin = await sessionFor(t.app, 'admin');
  registrar = await sessionFor(t.app, 'registrar');
});
afterAll(() => t.close());

const post = (path: string, body: object | undefined, cookie: string) =>
  supertest(t.app).post(path).set('Origin', t.origin).set('Cookie', cookie).send(body ?? {});

async function sessionsOf(id: string): Promise<number> {
  const [rows] = (await db().query(`SELECT count(*)::int AS n FROM http_sessions WHERE sess->>'userId' = :id`, { replacements: { id } })) as [Array<{ n: number }>, unknown];
  return rows[0].n;
}

describe('POST /api/users/:id/deactivate and /reactivate', () => {
  it('ends the person’s sessions, refuses their sign-in, keeps them listed; reactivation lets them in again', async () => {
    const cookie = await signIn(t.app, leaver.email, leaver.password);
    const me = await supertest(t.app).get('/api/me').set('Cookie', cookie);
    expect(me.status).toBe(200);
    const id = me.body.data.id as string;
    // A second session of theirs, as from another computer.
    await signIn(t.app, leaver.email, leaver.password);
    expect(await sessionsOf(id)).toBeGreaterThanOrEqual(2);

    const res = await post(`/api/users/${id}/deactivate`, { reason: 'Left the institution' }, admin);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id, name: leaver.name, lastAdmin: false });
    expect(Date.parse(res.body.data.deactivatedAt)).toBeGreaterThan(Date.now() - 60_000);
    expect(await sessionsOf(id)).toBe(0);
    const audit = await AuditEventModel.findOne({ where: { action: 'user.deactivated', entityId: id }, order: [['id', 'DESC']] });
    expect(audit?.after).toMatchObject({ active: false, reason: 'Left the institution' });

    // The old cookie signs no one in, and a new sign-in is refused with the reason in the address.
    expect((await supertest(t.app).get('/api/me').set('Cookie', cookie)).status).toBe(401);
    await expect(signIn(t.app, leaver.email, leaver.password)).rejects.toThrow(/signed-out\?error=deactivated/);
    // Kept in the record, shown as deactivated.
    const listed = await supertest(t.app).get(`/api/users?q=${encodeURIComponent(leaver.email)}`).set('Cookie', admin);
    expect(listed.body.data).toEqual([expect.objectContaining({ id, deactivatedAt: res.body.data.deactivatedAt })]);
    // Deactivating again changes nothing.
    expect((await post(`/api/users/${id}/deactivate`, {}, admin)).body.data.deactivatedAt).toBe(res.body.data.deactivatedAt);

    const back = await post(`/api/users/${id}/reactivate`, undefined, admin);
    expect(back.status).toBe(200);
    expect(back.body.data.deactivatedAt).toBeNull();
    const again = await signIn(t.app, leaver.email, leaver.password);
    expect((await supertest(t.app).get('/api/me').set('Cookie', again)).status).toBe(200);
    expect(await AuditEventModel.count({ where: { action: 'user.reactivated', entityId: id } })).toBeGreaterThanOrEqual(1);
  });

  it('401 without a session, 403 for a registrar, 400 for a long reason or bad id, 404 for no such person', async () => {
    const someone = await createUser();
    expect((await supertest(t.app).post(`/api/users/${someone.id}/deactivate`).set('Origin', t.origin).send({})).status).toBe(401);
    const refused = await post(`/api/users/${someone.id}/deactivate`, {}, registrar);
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('forbidden');
    const long = await post(`/api/users/${someone.id}/deactivate`, { reason: 'x'.repeat(501) }, admin);
    expect(long.status).toBe(400);
    expect(long.body.error.details.map((d: { path: string }) => d.path)).toContain('reason');
    expect((await post('/api/users/not-a-uuid/deactivate', {}, admin)).status).toBe(400);
    expect((await post('/api/users/00000000-0000-4000-8000-000000000000/reactivate', undefined, admin)).status).toBe(404);
    expect((await User.findByPk(someone.id))!.deactivatedAt).toBeNull();
  });

  it('refuses to deactivate oneself (409)', async () => {
    const me = (await supertest(t.app).get('/api/me').set('Cookie', admin)).body.data;
    const res = await post(`/api/users/${me.id}/deactivate`, {}, admin);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/yourself/);
    expect((await User.findByPk(me.id))!.deactivatedAt).toBeNull();
  });

  it('marks the one active administrator as lastAdmin in the list, and will not deactivate them (service level)', async () => {
    const sole = await createUser({ role: 'admin' });
    const others = await User.findAll({ where: { role: 'admin', id: { [Op.ne]: sole.id } } });
    // Another administrator who is deactivated does not count.
    const gone = await createUser({ role: 'admin' });
    await gone.update({ deactivatedAt: new Date() });
    await User.update({ role: 'registrar' }, { where: { id: others.map((o) => o.id) } });
    try {
      const { listUsers } = await import('../../services/user.service');
      const { rows } = await listUsers({ page: 1, pageSize: 200, sort: 'name', role: 'admin' });
      expect(rows.filter((u) => u.lastAdmin).map((u) => u.id)).toEqual([sole.id]);
      await expect(deactivateUser(sole.id, undefined, { id: null, name: 'test' } as never, null)).rejects.toMatchObject({ status: 409 });
      expect((await User.findByPk(sole.id))!.deactivatedAt).toBeNull();
    } finally {
      await User.update({ role: 'admin' }, { where: { id: others.map((o) => o.id) } });
      await gone.update({ role: 'viewer' });
    }
  });
});
