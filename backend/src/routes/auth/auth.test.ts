import { afterAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { testApp, signIn } from '../../../test/app';
import { AuditEventModel, User } from '../../models';
import { DEMO_ACCOUNTS } from '../../seed/demo-accounts';
import { returnToSchema } from './auth.routes';
import { TEST_ONLY_ACCOUNTS } from '../../../test/accounts';

const t = testApp();
afterAll(() => t.close());

const registrar = DEMO_ACCOUNTS.find((a) => a.role === 'registrar')!;

describe('sign-in through the identity provider', () => {
  it('redirects to the provider with PKCE (S256) and state', async () => {
    const res = await supertest(t.app).get('/auth/login?returnTo=/catalogue');
    expect(res.status).toBe(302);
    const url = new URL(res.headers.location);
    expect(url.origin).toBe(new URL(process.env.OIDC_ISSUER!).origin);
    expect(url.searchParams.get('code_challenge_method')).toBe('S256');
    expect(url.searchParams.get('code_challenge')).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(url.searchParams.get('state')).toBeTruthy();
    expect(url.searchParams.get('redirect_uri')).toBe(new URL('/auth/callback', t.origin).href);
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('toneledger.sid='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('refuses a returnTo that leaves the application', async () => {
    for (const bad of ['//evil.example/x', 'https://evil.example', '/\\evil.example']) {
      const res = await supertest(t.app).get(`/auth/login?returnTo=${encodeURIComponent(bad)}`);
      expect(res.status, bad).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details[0].path).toBe('query.returnTo');
    }
    expect(returnToSchema.parse('/catalogue?q=blue')).toBe('/catalogue?q=blue');
  });

  it('signs in with the demo registrar, claims the provisioned row, and audits it', async () => {
    const cookie = await signIn(t.app, registrar.email, registrar.password);
    const me = await supertest(t.app).get('/api/me').set('Cookie', cookie);
    expect(me.status).toBe(200);
    expect(me.body.data).toMatchObject({ email: registrar.email, name: registrar.name, role: 'registrar', environment: 'test' });
    expect(me.body.data.permissions).toContain('catalogue.write');
    expect(me.body.data.permissions).not.toContain('users.manage');
    const rows = await User.findAll({ where: { email: registrar.email } });
    expect(rows).toHaveLength(1);
    expect(rows[0].subject).toBe(registrar.id);
    const audit = await AuditEventModel.findOne({ where: { action: 'session.signed_in', entityId: rows[0].id }, order: [['id', 'DESC']] });
    expect(audit?.actorId).toBe(rows[0].id);
  });

  it('sends a callback with a forged state back to the signed-out page, with no session', async () => {
    const start = await supertest(t.app).get('/auth/login');
    const cookie = (start.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
    const cb = await supertest(t.app).get('/auth/callback?code=forged&state=forged').set('Cookie', cookie);
    expect(cb.status).toBe(302);
    expect(cb.headers.location).toBe('/signed-out?error=sign_in_failed');
    const me = await supertest(t.app).get('/api/me').set('Cookie', cookie);
    expect(me.status).toBe(401);
  });

  it('a callback with no sign-in under way is refused', async () => {
    const cb = await supertest(t.app).get('/auth/callback?code=x&state=y');
    expect(cb.status).toBe(302);
    expect(cb.headers.location).toBe('/signed-out?error=expired');
  });

  it('creates an unknown person on first sign-in with the default role', async () => {
    const newcomer = TEST_ONLY_ACCOUNTS[0];
    expect(await User.count({ where: { email: newcomer.email } })).toBe(0);
    const cookie = await signIn(t.app, newcomer.email, newcomer.password);
    const me = await supertest(t.app).get('/api/me').set('Cookie', cookie);
    expect(me.body.data).toMatchObject({ role: 'viewer', name: newcomer.name, email: newcomer.email });
    const created = await AuditEventModel.findOne({ where: { action: 'user.created', entityId: me.body.data.id } });
    expect(created).not.toBeNull();
  });
});

describe('GET /api/me', () => {
  it('401 in the envelope without a session', async () => {
    const res = await supertest(t.app).get('/api/me');
    expect(res.status).toBe(401);
    expect(res.body.error).toMatchObject({ code: 'unauthenticated', status: 401 });
  });
});

describe('POST /auth/logout', () => {
  it('ends the session, audits it, and returns the provider end-session URL', async () => {
    const cookie = await signIn(t.app, registrar.email, registrar.password);
    const res = await supertest(t.app).post('/auth/logout').set('Cookie', cookie).set('Origin', t.origin).send({});
    expect(res.status).toBe(200);
    const url = new URL(res.body.data.redirectTo);
    expect(url.origin).toBe(new URL(process.env.OIDC_ISSUER!).origin);
    expect(url.searchParams.get('id_token_hint')).toBeTruthy();
    expect(url.searchParams.get('post_logout_redirect_uri')).toBe(new URL('/signed-out', t.origin).href);
    const after = await supertest(t.app).get('/api/me').set('Cookie', cookie);
    expect(after.status).toBe(401);
    const audit = await AuditEventModel.findOne({ where: { action: 'session.signed_out' }, order: [['id', 'DESC']] });
    expect(audit?.actorName).toBe(registrar.name);
  });

  it('refuses a cross-site sign-out', async () => {
    const res = await supertest(t.app).post('/auth/logout').set('Origin', 'https://evil.example').send({});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
  });
});

describe('session lifetime', () => {
  it('ends a session past its absolute lifetime even while it is in use', async () => {
    const cookie = await signIn(t.app, registrar.email, registrar.password);
    const sid = decodeURIComponent(cookie.match(/toneledger\.sid=([^;]+)/)![1]).slice(2).split('.')[0];
    const hours = t.deps.env.SESSION_ABSOLUTE_HOURS;
    await t.deps.pool.query(
      `UPDATE http_sessions SET sess = jsonb_set(sess::jsonb, '{startedAt}', to_jsonb($2::bigint))::json WHERE sid = $1`,
      [sid, Date.now() - (hours * 3600 + 60) * 1000],
    );
    const res = await supertest(t.app).get('/api/me').set('Cookie', cookie);
    expect(res.status).toBe(401);
  });
});
