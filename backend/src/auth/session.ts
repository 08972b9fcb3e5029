import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import pg from 'pg';
import type { NextFunction, Request, Response } from 'express';
import type { Env } from '../config/env';
import type { CurrentUser } from './current-user';

declare module 'express-session' {
  interface SessionData {
    userId?: string;
    startedAt?: number;
    idToken?: string | null;
    pendingSignIn?: { state: string; codeVerifier: string; returnTo: string; at: number };
  }
}

declare module 'express-serve-static-core' {
  interface Request {
    user?: CurrentUser | null;
  }
}

export const SESSION_COOKIE = 'toneledger.sid';

export function sessionMiddleware(e: Env, pool: pg.Pool) {
  const PgStore = connectPgSimple(session);
  const store = new PgStore({ pool, tableName: 'http_sessions', pruneSessionInterval: 15 * 60 });
  // Idle expiry moves with every request, but the database row is touched at most once a minute:
  // a session seen a moment ago needs no write on each of its requests.
  const touch = store.touch.bind(store);
  const lastTouched = new Map<string, number>();
  store.touch = (sid, sess, cb) => {
    const now = Date.now();
    if (now - (lastTouched.get(sid) ?? 0) < 60_000) return cb?.();
    lastTouched.set(sid, now);
    if (lastTouched.size > 10_000) for (const [k, t] of lastTouched) if (now - t > 60_000) lastTouched.delete(k);
    return touch(sid, sess, cb);
  };
  return session({
    name: SESSION_COOKIE,
    secret: e.SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: e.NODE_ENV === 'production',
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: e.PUBLIC_URL.startsWith('https://'),
      maxAge: e.SESSION_IDLE_MINUTES * 60_000,
      path: '/',
    },
  });
}

export function sessionExpiresAt(req: Request, e: Env): Date {
  const idle = Date.now() + e.SESSION_IDLE_MINUTES * 60_000;
  const absolute = (req.session.startedAt ?? Date.now()) + e.SESSION_ABSOLUTE_HOURS * 3_600_000;
  return new Date(Math.min(idle, absolute));
}

/** Puts the signed-in user on the request, with the role read fresh from the database (one indexed read). */
export function loadUser(e: Env, pool: pg.Pool) {
  return async (req: Request, _res: Response, next: NextFunction) => {
    req.user = null;
    const s = req.session;
    if (!s?.userId) return next();
    if (!s.startedAt || Date.now() - s.startedAt > e.SESSION_ABSOLUTE_HOURS * 3_600_000) {
      await new Promise<void>((resolve) => s.destroy(() => resolve()));
      return next();
    }
    const { rows } = await pool.query<CurrentUser>('SELECT id, name, email, role FROM users WHERE id = $1', [s.userId]);
    if (rows[0]) req.user = rows[0];
    next();
  };
}
