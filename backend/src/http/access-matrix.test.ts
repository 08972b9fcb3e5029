import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import type { z } from 'zod';
import { can, ROLES, type Role } from '@toneledger/common/domain/roles';
import { errorEnvelopeSchema } from '@toneledger/common/schemas/envelope';
import type { Endpoint } from '@toneledger/common/api/endpoint';
import { testApp, sessionFor, signIn } from '../../test/app';
import { DEMO_ACCOUNTS } from '../seed/demo-accounts';
import { allRoutes } from '../app';

/**
 * Every route the app serves × every caller (no session, and each role), checked against the
 * route's declared `access`. The list is `allRoutes()`, so a new route is covered the day it is added.
 *
 *   no session                → 401 unless the route is public
 *   a role without permission → 403
 *   a role with it            → anything but 401/403 (400, 404, 409 are fine: the ids are random)
 *   and never a 5xx; every error body is the one envelope.
 */

const t = testApp();
afterAll(() => t.close());

const cookie = {} as Record<Role, string>;
beforeAll(async () => {
  for (const r of ROLES) cookie[r] = await sessionFor(t.app, r);
});

/**
 * Routes called differently, with the reason. Nothing is left out: each one is still called by
 * every caller, only how its session is obtained changes.
 */
const SPECIAL: Record<string, string> = {
  // Ends the session it is called with: a role calls it on a fresh session of its own, so the
  // sessions the rest of the matrix uses stay open.
  'POST /auth/logout': 'fresh session per role',
};

const WRITES = new Set(['post', 'put', 'patch', 'delete']);
const keyOf = (e: Endpoint) => `${e.method.toUpperCase()} ${e.path}`;

/** A valid-looking value for each path parameter: the first value of an enum, otherwise a random UUID. */
function urlFor(e: Endpoint): string {
  const shape = (e.params as z.ZodObject | undefined)?.shape as Record<string, { options?: readonly unknown[] }> | undefined;
  return e.path.replace(/:([A-Za-z0-9_]+)/g, (_m, name: string) => {
    const options = shape?.[name]?.options;
    return encodeURIComponent(String(options?.length ? options[0] : randomUUID()));
  });
}

function expected(access: Endpoint['access'], role: Role | null): 'allowed' | 401 | 403 {
  if (access === 'public') return 'allowed';
  if (!role) return 401;
  if (access === 'signed_in') return 'allowed';
  return can(role, access) ? 'allowed' : 403;
}

async function call(e: Endpoint, role: Role | null) {
  let session = role ? cookie[role] : undefined;
  if (role && SPECIAL[keyOf(e)]) {
    const account = DEMO_ACCOUNTS.find((a) => a.role === role)!;
    session = await signIn(t.app, account.email, account.password);
  }
  let req = supertest(t.app)[e.method](urlFor(e)).redirects(0);
  if (session) req = req.set('Cookie', session);
  if (WRITES.has(e.method)) req = req.set('Origin', t.origin).send({});
  return req;
}

const routes = allRoutes(t.deps);

describe('access matrix', () => {
  it('covers every route the app serves, each once', () => {
    const keys = routes.map((r) => keyOf(r.endpoint));
    expect(new Set(keys).size).toBe(keys.length);
    expect(keys.length).toBeGreaterThan(50);
    for (const special of Object.keys(SPECIAL)) expect(keys).toContain(special);
  });

  it.each(routes.map((r) => [keyOf(r.endpoint), r.endpoint] as const))('%s', async (_name, e) => {
    for (const role of [null, ...ROLES] as const) {
      const res = await call(e, role);
      const who = `${keyOf(e)} as ${role ?? 'no session'} (access ${e.access})`;
      const want = expected(e.access, role);
      const seen = `${who} → ${res.status} ${res.text?.slice(0, 300)}`;
      if (want === 'allowed') expect([401, 403], seen).not.toContain(res.status);
      else expect(res.status, seen).toBe(want);
      expect(res.status, seen).toBeLessThan(500);
      if (res.status >= 400) {
        const env = errorEnvelopeSchema.safeParse(res.body);
        expect(env.success, `${seen}: not the error envelope`).toBe(true);
        expect(env.data!.error.status, seen).toBe(res.status);
        if (res.status === 401) expect(env.data!.error.code, seen).toBe('unauthenticated');
        if (res.status === 403) expect(env.data!.error.code, seen).toBe('forbidden');
      }
    }
  }, 30_000);
});
