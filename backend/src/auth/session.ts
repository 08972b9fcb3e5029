import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import pg from 'pg';
import type { NextFunction, Request, Response } from 'express';
import type { Env } from '../config/env';
import type { SignedInUser } from './current-user';

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
    user?: SignedInUser | null;
    /** The user row read with the session (one query); loadUser takes it from here. */
    sessionUser?: SignedInUser | null;
  }
}

export const SESSION_COOKIE = 'toneledger.sid';

const TABLE = 'http_sessions';
const USER_COLUMNS = 'u.id, u.name, u.email, u.role, u.created_at AS "createdAt", u.last_sign_in_at AS "lastSignInAt"';
const UUID = '^[0-9a-fA-F]{8}-[0-9a-fA-F]{4}-[0-9a-fA-F]{4}-[0-9a-fA-F]{4}-[0-9a-fA-F]{12}$';
const SESSION_WITH_USER =
  `SELECT s.sess, ${USER_COLUMNS} FROM ${TABLE} s ` +
  // A deactivated person has no user here, so their session (if any survived) signs no one in.
  `LEFT JOIN users u ON u.id = CASE WHEN s.sess->>'userId' ~ '${UUID}' THEN (s.sess->>'userId')::uuid END AND u.deactivated_at IS NULL ` +
  'WHERE s.sid = $1 AND s.expire >= to_timestamp($2)';
const SESSION_USER = Symbol('sessionUser');

type StoredSession = session.SessionData & { [SESSION_USER]?: SignedInUser | null };

export function sessionMiddleware(e: Env, pool: pg.Pool) {
  const PgStore = connectPgSimple(session);
  const store = new PgStore({ pool, tableName: TABLE, pruneSessionInterval: 15 * 60 });
  // One round trip per request for the session and its user: the store's read joins the users row
  // (role included), so the role is as fresh as the session itself, read on every request and
  // never kept between requests. The row travels on the loaded object under a symbol (never
  // serialised, never stored) and createSession moves it to the request before express-session
  // hashes the session to see whether it changed. Expiry is checked as connect-pg-simple does.
  store.get = (sid, cb) => {
    // A named statement: each connection parses and plans it once, not on every request.
    pool.query({ name: 'session-with-user', text: SESSION_WITH_USER, values: [sid, Math.ceil(Date.now() / 1000)] }).then(
      ({ rows }) => {
        const row = rows[0] as ({ sess: session.SessionData | string } & Record<string, unknown>) | undefined;
        if (!row) return cb(null, null);
        let sess: StoredSession;
        try {
          sess = typeof row.sess === 'string' ? JSON.parse(row.sess) : row.sess;
        } catch {
          return store.destroy(sid, (err) => cb(err));
        }
        sess[SESSION_USER] = row.id
          ? { id: row.id as string, name: row.name as string, email: row.email as string | null, role: row.role as SignedInUser['role'], createdAt: row.createdAt as Date, lastSignInAt: row.lastSignInAt as Date | null }
          : null;
        cb(null, sess);
      },
      (err: Error) => cb(err),
    );
  };
  const createSession = store.createSession.bind(store);
  store.createSession = (req, sess) => {
    const stored = sess as StoredSession;
    if (SESSION_USER in stored) {
      (req as Request).sessionUser = stored[SESSION_USER] ?? null;
      delete stored[SESSION_USER];
    }
    return createSession(req, sess);
  };
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

/**
 * Puts the signed-in user on the request, with the role read fresh from the database on this
 * request: the row read with the session (see sessionMiddleware), or one indexed read when the
 * session did not come from the store in this request. Nothing is cached between requests, so a
 * changed role applies to the user's very next request.
 */
export function loadUser(e: Env, pool: pg.Pool) {
  return async function loadUser(req: Request, _res: Response, next: NextFunction) {
    req.user = null;
    const joined = req.sessionUser;
    req.sessionUser = undefined;
    const s = req.session;
    if (!s?.userId) return next();
    if (!s.startedAt || Date.now() - s.startedAt > e.SESSION_ABSOLUTE_HOURS * 3_600_000) {
      await new Promise<void>((resolve) => s.destroy(() => resolve()));
      return next();
    }
    if (joined !== undefined && (joined === null || joined.id === s.userId)) {
      req.user = joined;
      return next();
    }
    const { rows } = await pool.query<SignedInUser>(`SELECT ${USER_COLUMNS} FROM users u WHERE u.id = $1 AND u.deactivated_at IS NULL`, [s.userId]);
    if (rows[0]) req.user = rows[0];
    next();
  };
}
