import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { Op } from 'sequelize';
import { testApp, sessionFor } from '../../../test/app';
import { createUser } from '../../../test/factories';
import { AuditEventModel, User } from '../../models';
import { changeRole } from '../../services/user.service';
import { ROLES, type Role } from '@toneledger/common/domain/roles';

const t = testApp();
const cookies = {} as Record<Role, string>;
beforeAll(async () => {
  for (const role of ROLES) cookies[role] = await sessionFor(t.app, role);
});
afterAll(() => t.close());

const patch = (id: string, body: unknown, cookie?: string) => {
  const r = supertest(t.app).patch(`/api/users/${id}/role`).set('Origin', t.origin).send(body as object);
  return cookie ? r.set('Cookie', cookie) : r;
};

describe('GET /api/users', () => {
  it('401 without a session', async () => {
    const res = await supertest(t.app).get('/api/users');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it.each(['registrar', 'conservator', 'researcher', 'viewer'] as const)('403 for a %s', async (role) => {
    const res = await supertest(t.app).get('/api/users').set('Cookie', cookies[role]);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
  });

  it('400 for a bad query, naming the field', async () => {
    const res = await supertest(t.app).get('/api/users?pageSize=5000&role=wizard').set('Cookie', cookies.admin);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['query.pageSize', 'query.role']));
  });

  it('lists, filters, searches and pages for an admin', async () => {
    const a = await createUser({ role: 'researcher', name: 'Zephyrine Qualtrough' });
    const all = await supertest(t.app).get('/api/users?pageSize=2&page=1&sort=name').set('Cookie', cookies.admin);
    expect(all.status).toBe(200);
    expect(all.body.data).toHaveLength(2);
    expect(all.body.pagination).toMatchObject({ page: 1, pageSize: 2 });
    expect(all.body.pagination.total).toBe(await User.count());
    const names = all.body.data.map((u: { name: string }) => u.name);
    expect([...names].sort((x, y) => (x < y ? -1 : 1))).toEqual(names);

    const found = await supertest(t.app).get('/api/users?q=qualtrough').set('Cookie', cookies.admin);
    expect(found.body.data.map((u: { id: string }) => u.id)).toEqual([a.id]);

    const researchers = await supertest(t.app).get('/api/users?role=researcher&pageSize=200').set('Cookie', cookies.admin);
    expect(researchers.body.data.every((u: { role: string }) => u.role === 'researcher')).toBe(true);
    expect(researchers.body.pagination.total).toBe(await User.count({ where: { role: 'researcher' } }));
  });

  it('does not treat % in a search as a wildcard', async () => {
    const res = await supertest(t.app).get('/api/users?q=%25').set('Cookie', cookies.admin);
    expect(res.status).toBe(200);
    expect(res.body.data).toHaveLength(0);
  });
});

describe('PATCH /api/users/:id/role', () => {
  it('401 without a session and 403 for a registrar', async () => {
    const u = await createUser();
    expect((await patch(u.id, { role: 'registrar' })).status).toBe(401);
    const res = await patch(u.id, { role: 'registrar' }, cookies.registrar);
    expect(res.status).toBe(403);
    expect((await User.findByPk(u.id))!.role).toBe('viewer');
  });

  it('403 for a cross-site request even from an admin session', async () => {
    const u = await createUser();
    const res = await supertest(t.app).patch(`/api/users/${u.id}/role`).set('Cookie', cookies.admin).set('Origin', 'https://evil.example').send({ role: 'admin' });
    expect(res.status).toBe(403);
    expect((await User.findByPk(u.id))!.role).toBe('viewer');
  });

  it('400 for an unknown role and for a malformed id', async () => {
    const u = await createUser();
    const bad = await patch(u.id, { role: 'curator' }, cookies.admin);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('role');
    const badId = await patch('not-a-uuid', { role: 'viewer' }, cookies.admin);
    expect(badId.status).toBe(400);
    expect(badId.body.error.details[0].path).toBe('params.id');
  });

  it('404 for a user that does not exist', async () => {
    const res = await patch('00000000-0000-4000-8000-000000000000', { role: 'viewer' }, cookies.admin);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('changes the role, audits before and after, and the change applies at once', async () => {
    const u = await createUser({ role: 'viewer' });
    const res = await patch(u.id, { role: 'conservator', reason: 'joined the conservation studio' }, cookies.admin);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id: u.id, role: 'conservator' });
    const audit = await AuditEventModel.findOne({ where: { action: 'user.role_changed', entityId: u.id } });
    expect(audit?.before).toEqual({ role: 'viewer' });
    expect(audit?.after).toEqual({ role: 'conservator', reason: 'joined the conservation studio' });
    expect(audit?.actorName).toBe((await User.findOne({ where: { role: 'admin', subject: 'demo-admin' } }))!.name);
  });

  it('a demoted user loses access on their very next request, and a promotion applies as soon (no role kept between requests)', async () => {
    const registrar = (await supertest(t.app).get('/api/me').set('Cookie', cookies.registrar)).body.data;
    expect(registrar.role).toBe('registrar');
    // An empty body: the access check passes (400, validation) for a registrar and refuses (403) otherwise; nothing is written.
    const createMaker = () => supertest(t.app).post('/api/makers').set('Origin', t.origin).set('Cookie', cookies.registrar).send({});
    expect((await createMaker()).status).toBe(400);
    try {
      expect((await patch(registrar.id, { role: 'viewer', reason: 'moved to the reading room' }, cookies.admin)).status).toBe(200);
      const refused = await createMaker();
      expect(refused.status).toBe(403);
      expect(refused.body.error.code).toBe('forbidden');
      const me = await supertest(t.app).get('/api/me').set('Cookie', cookies.registrar);
      expect(me.body.data.role).toBe('viewer');
      expect(me.body.data.permissions).not.toContain('catalogue.write');
    } finally {
      expect((await patch(registrar.id, { role: 'registrar', reason: 'back to the registry' }, cookies.admin)).status).toBe(200);
    }
    expect((await createMaker()).status).toBe(400);
    expect((await supertest(t.app).get('/api/me').set('Cookie', cookies.registrar)).body.data.role).toBe('registrar');
  });

  it('refuses to remove the last administrator (409) and changes nothing', async () => {
    const me = (await supertest(t.app).get('/api/me').set('Cookie', cookies.admin)).body.data;
    const others = await User.findAll({ where: { role: 'admin', id: { [Op.ne]: me.id } } });
    await User.update({ role: 'registrar' }, { where: { id: others.map((o) => o.id) } });
    try {
      const res = await patch(me.id, { role: 'viewer' }, cookies.admin);
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('conflict');
      expect(res.body.error.message).toMatch(/last administrator/);
      expect((await User.findByPk(me.id))!.role).toBe('admin');
    } finally {
      await User.update({ role: 'admin' }, { where: { id: others.map((o) => o.id) } });
    }
  });

  it('lets an admin step down when another admin remains', async () => {
    const other = await createUser({ role: 'admin' });
    const res = await patch(other.id, { role: 'researcher' }, cookies.admin);
    expect(res.status).toBe(200);
    expect(res.body.data.role).toBe('researcher');
  });

  it('of two concurrent demotions of the last two admins, exactly one passes (service level)', async () => {
    const [a, b] = [await createUser({ role: 'admin' }), await createUser({ role: 'admin' })];
    const others = await User.findAll({ where: { role: 'admin', id: { [Op.notIn]: [a.id, b.id] } } });
    await User.update({ role: 'registrar' }, { where: { id: others.map((o) => o.id) } });
    try {
      const actor = { id: null, name: 'concurrency test' };
      const results = await Promise.allSettled([changeRole(a.id, 'viewer', undefined, actor, null), changeRole(b.id, 'viewer', undefined, actor, null)]);
      expect(results.map((r) => r.status).sort()).toEqual(['fulfilled', 'rejected']);
      const refused = results.find((r) => r.status === 'rejected') as PromiseRejectedResult;
      expect(refused.reason).toMatchObject({ code: 'conflict', status: 409 });
      expect(await User.count({ where: { role: 'admin' } })).toBe(1);
    } finally {
      await User.update({ role: 'admin' }, { where: { id: others.map((o) => o.id) } });
    }
  });
});
