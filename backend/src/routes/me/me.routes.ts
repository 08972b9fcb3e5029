import { dataEnvelope } from '@toneledger/common/schemas/envelope';
import { meSchema } from '@toneledger/common/schemas/users';
import { route, type RouteDef } from '../../http/route';
import { findUser } from '../../services/user.service';
import { presentMe } from '../../presenters/user.presenter';
import { sessionExpiresAt } from '../../auth/session';
import { unauthenticated } from '../../errors';
import type { AppDeps } from '../../deps';

export function meRoutes(deps: AppDeps): RouteDef[] {
  return [
    route({
      method: 'get',
      path: '/api/me',
      summary: 'The signed-in user, their role and permissions',
      tags: ['session'],
      access: 'signed_in',
      response: { description: 'The signed-in user', schema: dataEnvelope(meSchema) },
      handler: async ({ user, req }) => {
        const found = await findUser(user!.id);
        if (!found) throw unauthenticated();
        return { data: presentMe(found, sessionExpiresAt(req, deps.env), deps.env.NODE_ENV) };
      },
    }),
  ];
}
