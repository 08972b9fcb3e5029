import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { testApp, sessionFor } from '../../../test/app';
import { parseEnv } from '../../config/env';

const t = testApp();
let admin: string;
let conservator: string;
beforeAll(async () => {
  admin = await sessionFor(t.app, 'admin');
  conservator = await sessionFor(t.app, 'conservator');
});
afterAll(() => t.close());

describe('development mail', () => {
  it('401 without a session, 403 for a conservator', async () => {
    expect((await supertest(t.app).get('/api/dev/mail')).status).toBe(401);
    expect((await supertest(t.app).get('/api/dev/mail').set('Cookie', conservator)).status).toBe(403);
    const post = await supertest(t.app).post('/api/dev/mail/test').set('Cookie', conservator).set('Origin', t.origin).send({});
    expect(post.status).toBe(403);
  });

  it('400 for a malformed address', async () => {
    const res = await supertest(t.app).post('/api/dev/mail/test').set('Cookie', admin).set('Origin', t.origin).send({ to: 'not an address' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toMatchObject({ path: 'to', message: 'Enter an e-mail address' });
  });

  it('a test message goes through SMTP to the sink and shows in the admin list', async () => {
    const to = `check-${Date.now()}@calder-reach.example`;
    const sent = await supertest(t.app).post('/api/dev/mail/test').set('Cookie', admin).set('Origin', t.origin).send({ to });
    expect(sent.status).toBe(202);
    expect(sent.body.data.messageId).toBeTruthy();
    const list = await supertest(t.app).get('/api/dev/mail').set('Cookie', admin);
    expect(list.status).toBe(200);
    const msg = list.body.data.find((m: { to: string[] }) => m.to.includes(to));
    expect(msg).toBeDefined();
    expect(msg.subject).toBe('Toneledger test message');
    expect(msg.text).toMatch(/test message sent by/);
  });
});

describe('environment', () => {
  const base = {
    DATABASE_URL: 'postgres://x@db/x', S3_BUCKET: 'bucket', S3_ACCESS_KEY_ID: 'k', S3_SECRET_ACCESS_KEY: 's',
    OIDC_ISSUER: 'https://id.example', OIDC_CLIENT_ID: 'c', SMTP_URL: 'smtp://mail.example', SESSION_SECRET: 'x'.repeat(32),
  };
  it('in production refuses the development sink, insecure OIDC and a plain-http public URL', () => {
    expect(() => parseEnv({ ...base, NODE_ENV: 'production', PUBLIC_URL: 'http://records.example', MAIL_SINK_API: 'http://127.0.0.1:1', OIDC_ALLOW_INSECURE: 'true' })).toThrow(
      /MAIL_SINK_API[\s\S]*OIDC_ALLOW_INSECURE|OIDC_ALLOW_INSECURE[\s\S]*MAIL_SINK_API/,
    );
    expect(() => parseEnv({ ...base, NODE_ENV: 'production', PUBLIC_URL: 'http://records.example' })).toThrow(/PUBLIC_URL/);
    expect(parseEnv({ ...base, NODE_ENV: 'production', PUBLIC_URL: 'https://records.example' }).NODE_ENV).toBe('production');
  });
  it('names every missing variable', () => {
    expect(() => parseEnv({})).toThrow(/DATABASE_URL[\s\S]*OIDC_ISSUER[\s\S]*SESSION_SECRET/);
  });
});
