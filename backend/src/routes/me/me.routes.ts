import { meApi } from '@toneledger/common/api/users';
import { implement, type RouteDef } from '../../http/route';
import { getMe } from '../../services/user.service';
import { sessionExpiresAt } from '../../auth/session';
import type { AppDeps } from '../../deps';

export function meRoutes(deps: AppDeps): RouteDef[] {
  return implement(meApi, {
    // req.user is the actor, with the columns GET /api/me shows, read with the session on this request.
    get: ({ req }) => ({ data: getMe(req.user!, sessionExpiresAt(req, deps.env), deps.env.NODE_ENV) }),
  });
}
