import { z } from 'zod';
import type { Request } from 'express';
import { dataEnvelope } from '@toneledger/common/schemas/envelope';
import { route, type RouteDef } from '../../http/route';
import { upsertOnSignIn } from '../../services/user.service';
import { recordAudit } from '../../services/audit.service';
import { idOf } from '../../middleware/request-id';
import { SESSION_COOKIE } from '../../auth/session';
import type { AppDeps } from '../../deps';

/** Only paths inside this app: "/x", never "//host" or "/\host". */
export const returnToSchema = z
  .string()
  .max(2000)
  .regex(/^\/(?![/\\])[^\s]*$/, 'returnTo must be a path inside this application')
  .default('/');

const PENDING_TTL_MS = 10 * 60_000;

function save(req: Request) {
  return new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
}

function regenerate(req: Request) {
  return new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
}

export function authRoutes(deps: AppDeps): RouteDef[] {
  const { env, oidc } = deps;
  return [
    route({
      method: 'get',
      path: '/auth/login',
      summary: "Starts sign-in: redirects to the identity provider (authorization code flow with PKCE and state)",
      tags: ['session'],
      access: 'public',
      query: z.object({ returnTo: returnToSchema }),
      response: { description: '302 to the identity provider' },
      handler: async ({ query, req, res }) => {
        const start = await oidc.startSignIn();
        req.session.pendingSignIn = { state: start.state, codeVerifier: start.codeVerifier, returnTo: query.returnTo, at: Date.now() };
        await save(req);
        res.redirect(302, start.url);
      },
    }),
    route({
      method: 'get',
      path: '/auth/callback',
      summary: 'Where the identity provider returns; opens the session and redirects to returnTo',
      tags: ['session'],
      access: 'public',
      response: { description: '302 into the application' },
      handler: async ({ req, res }) => {
        const pending = req.session.pendingSignIn;
        if (!pending || Date.now() - pending.at > PENDING_TTL_MS) {
          req.log.warn('sign-in callback without a pending sign-in');
          return res.redirect(302, '/signed-out?error=expired');
        }
        let identity;
        try {
          identity = await oidc.finishSignIn(new URL(req.originalUrl, env.PUBLIC_URL), pending);
        } catch (err) {
          req.log.warn({ err }, 'sign-in callback refused');
          delete req.session.pendingSignIn;
          await save(req);
          return res.redirect(302, '/signed-out?error=sign_in_failed');
        }
        const user = await upsertOnSignIn(identity, { adminEmails: env.ADMIN_EMAILS, defaultRole: env.DEFAULT_ROLE }, idOf(req));
        // A new session id at sign-in: a session fixed before sign-in is worth nothing after it.
        await regenerate(req);
        req.session.userId = user.id;
        req.session.startedAt = Date.now();
        req.session.idToken = identity.idToken;
        await save(req);
        res.redirect(302, pending.returnTo);
      },
    }),
    route({
      method: 'post',
      path: '/auth/logout',
      summary: "Ends the session here and returns the provider's end-session URL so its session ends too",
      tags: ['session'],
      access: 'public',
      response: { description: 'Where to send the browser next', schema: dataEnvelope(z.object({ redirectTo: z.string() })) },
      handler: async ({ user, req, res }) => {
        const idToken = req.session?.idToken ?? null;
        if (user) {
          await recordAudit({ actor: { id: user.id, name: user.name }, action: 'session.signed_out', entityType: 'user', entityId: user.id, requestId: idOf(req) });
        }
        await new Promise<void>((resolve) => (req.session ? req.session.destroy(() => resolve()) : resolve()));
        res.clearCookie(SESSION_COOKIE, { path: '/' });
        let redirectTo = '/signed-out';
        try {
          redirectTo = (await oidc.endSessionUrl(idToken)) ?? redirectTo;
        } catch (err) {
          req.log.warn({ err }, 'identity provider unreachable at sign-out; local session ended');
        }
        return { data: { redirectTo } };
      },
    }),
  ];
}
