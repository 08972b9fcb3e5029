import { meApi } from '@toneledger/common/api/users';
import { implement, type RouteDef } from '../../http/route';
import { findUser } from '../../services/user.service';
import { presentMe } from '../../presenters/user.presenter';
import { sessionExpiresAt } from '../../auth/session';
import { unauthenticated } from '../../errors';
import type { AppDeps } from '../../deps';

export function meRoutes(deps: AppDeps): RouteDef[] {
  return implement(meApi, {
    get: async ({ actor, req }) => {
      const found = await findUser(actor.id);
      if (!found) throw unauthenticated();
      return { data: presentMe(found, sessionExpiresAt(req, deps.env), deps.env.NODE_ENV) };
    },
  });
}
