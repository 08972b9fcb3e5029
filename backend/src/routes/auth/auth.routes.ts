import type { Request } from 'express';
import { authApi, returnToSchema } from '@toneledger/common/api/auth';
import { implement, type RouteDef } from '../../http/route';
import { upsertOnSignIn } from '../../services/user.service';
import { recordAudit } from '../../services/audit.service';
import { SESSION_COOKIE } from '../../auth/session';
import type { AppDeps } from '../../deps';

export { returnToSchema };

const PENDING_TTL_MS = 10 * 60_000;

function save(req: Request) {
  return new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
}

function regenerate(req: Request) {
  return new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
}

export function authRoutes(deps: AppDeps): RouteDef[] {
  const { env, oidc } = deps;
  return implement(authApi, {
    login: async ({ query, req, res }) => {
        const start = await oidc.startSignIn();
        req.session.pendingSignIn = { state: start.state, codeVerifier: start.codeVerifier, returnTo: query.returnTo, at: Date.now() };
        await save(req);
        res.redirect(302, start.url);
      },
    callback: async ({ req, res, requestId }) => {
        const pending = req.session.pendingSignIn;
        if (!pending || Date.now() - pending.at > PENDING_TTL_MS) {
          req.log.warn('sign-in callback without a pending sign-in');
          res.redirect(302, '/signed-out?error=expired');
          return;
        }
        let identity;
        try {
          identity = await oidc.finishSignIn(new URL(req.originalUrl, env.PUBLIC_URL), pending);
        } catch (err) {
          req.log.warn({ err }, 'sign-in callback refused');
          delete req.session.pendingSignIn;
          await save(req);
          res.redirect(302, '/signed-out?error=sign_in_failed');
          return;
        }
        const user = await upsertOnSignIn(identity, { adminEmails: env.ADMIN_EMAILS, defaultRole: env.DEFAULT_ROLE }, requestId);
        if (user.deactivatedAt) {
          delete req.session.pendingSignIn;
          await save(req);
          res.redirect(302, '/signed-out?error=deactivated');
          return;
        }
        // A new session id at sign-in: a session fixed before sign-in is worth nothing after it.
        await regenerate(req);
        req.session.userId = user.id;
        req.session.startedAt = Date.now();
        req.session.idToken = identity.idToken;
        await save(req);
        res.redirect(302, pending.returnTo);
      },
    logout: async ({ actor: user, req, res, requestId }) => {
        const idToken = req.session?.idToken ?? null;
        if (user) {
          await recordAudit({ actor: { id: user.id, name: user.name }, action: 'session.signed_out', entityType: 'user', entityId: user.id, requestId });
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
  });
}
