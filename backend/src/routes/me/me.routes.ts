import { meApi } from '@toneledger/common/api/users';
import { implement, type RouteDef } from '../../http/route';
import { getMe } from '../../services/user.service';
import { sessionExpiresAt } from '../../auth/session';
import type { AppDeps } from '../../deps';

export function meRoutes(deps: AppDeps): RouteDef[] {
  return implement(meApi, {
    get: ({ actor, req }) => getMe(actor.id, sessionExpiresAt(req, deps.env), deps.env.NODE_ENV).then((data) => ({ data })),
  });
}
