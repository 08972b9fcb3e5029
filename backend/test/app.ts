import { pino } from 'pino';
import supertest from 'supertest';
import type { Express } from 'express';
import { env } from '../src/config/env';
import { buildApp } from '../src/app';
import { composeDeps, disposeDeps } from '../src/compose';
import type { AppDeps } from '../src/deps';
import { DEMO_ACCOUNTS } from '../src/seed/demo-accounts';
import type { Role } from '@toneledger/common/domain/roles';

export interface TestApp {
  app: Express;
  deps: AppDeps;
  origin: string;
  close(): Promise<void>;
}

let open = 0;

/** The real app, on the test database and the local fakes, with logging silenced. */
export function testApp(overrides: Partial<AppDeps> = {}): TestApp {
  const logger = pino({ level: 'silent' });
  const deps = { ...composeDeps(env(), null, logger), ...overrides };
  const app = buildApp(deps, logger);
  open += 1;
  // Apps in one test file share the database connection; the last one closed closes it.
  const close = async () => {
    open -= 1;
    await disposeDeps(deps, { closeDatabase: open === 0 });
  };
  return { app, deps, origin: new URL(env().PUBLIC_URL).origin, close };
}

class Jar {
  private cookies = new Map<string, string>();
  take(setCookie: string[] | undefined) {
    for (const line of setCookie ?? []) {
      const [pair, ...attrs] = line.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      const expired = attrs.some((a) => /^\s*expires=Thu, 01 Jan 1970/i.test(a)) || value === '';
      if (expired) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }
  header(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }
}

/**
 * Signs in through the real flow: the app's /auth/login, the identity provider's own login page
 * and consent, and back to /auth/callback. Returns the app's session cookie header. `app` is the app
 * in this process or the base URL of a running server (then the whole flow goes to that server).
 */
export async function signIn(app: Express | string, email: string, password: string): Promise<string> {
  const appJar = new Jar();
  const idpJar = new Jar();
  const issuer = new URL(env().OIDC_ISSUER);

  const start = await supertest(app).get('/auth/login?returnTo=/home');
  if (start.status !== 302) throw new Error(`/auth/login answered ${start.status}`);
  appJar.take(start.headers['set-cookie'] as unknown as string[]);
  let next = new URL(start.headers.location);

  for (let hop = 0; hop < 12; hop++) {
    if (next.origin !== issuer.origin) {
      // Back at the app: the callback.
      const cb = await supertest(app).get(next.pathname + next.search).set('Cookie', appJar.header());
      appJar.take(cb.headers['set-cookie'] as unknown as string[]);
      if (cb.status !== 302 || cb.headers.location !== '/home') {
        throw new Error(`callback answered ${cb.status} → ${cb.headers.location}`);
      }
      return appJar.header();
    }
    let res = await fetch(next, { redirect: 'manual', headers: { cookie: idpJar.header() } });
    idpJar.take(res.headers.getSetCookie());
    if (res.status === 200 && next.pathname.startsWith('/interaction/')) {
      const html = await res.text();
      const action = html.match(/action="([^"]+)"/)?.[1];
      if (!action) throw new Error('no login form on the identity provider page');
      res = await fetch(new URL(action, issuer), {
        method: 'POST',
        redirect: 'manual',
        headers: { cookie: idpJar.header(), 'content-type': 'application/x-www-form-urlencoded' },
        body: new URLSearchParams({ email, password }).toString(),
      });
      idpJar.take(res.headers.getSetCookie());
      if (res.status === 200) throw new Error('the identity provider refused the password');
    }
    const location = res.headers.get('location');
    if (!location) throw new Error(`identity provider answered ${res.status} without a redirect at ${next.pathname}`);
    next = new URL(location, next);
  }
  throw new Error('too many redirects while signing in');
}

/** The real app with a pg-boss queue: jobs are sent to PostgreSQL and run by the test server's workers. */
export async function testAppWithQueue(): Promise<TestApp> {
  const { startQueue } = await import('../src/jobs/queue');
  const queue = await startQueue(env().DATABASE_URL, pino({ level: 'silent' }));
  const t = testApp({ queue });
  return { ...t, close: async () => { await queue.stop(); await t.close(); } };
}

const cache = new Map<string, string>();

/** A session cookie for the demo account of a role, signed in once per test file. */
export async function sessionFor(app: Express, role: Role): Promise<string> {
  const cached = cache.get(role);
  if (cached) return cached;
  const account = DEMO_ACCOUNTS.find((a) => a.role === role)!;
  const cookie = await signIn(app, account.email, account.password);
  cache.set(role, cookie);
  return cookie;
}
