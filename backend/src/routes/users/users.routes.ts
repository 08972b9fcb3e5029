import { usersApi } from '@toneledger/common/api/users';
import { implement, type RouteDef } from '../../http/route';
import { changeRole, deactivateUser, listUsers, reactivateUser } from '../../services/user.service';

export function usersRoutes(): RouteDef[] {
  return implement(usersApi, {
    list: async ({ query }) => {
      const { rows, total } = await listUsers(query);
      return { data: rows, pagination: { page: query.page, pageSize: query.pageSize, total } };
    },
    changeRole: async ({ params, body, actor, requestId }) => ({ data: await changeRole(params.id, body.role, body.reason, actor, requestId) }),
    deactivate: async ({ params, body, actor, requestId }) => ({ data: await deactivateUser(params.id, body.reason, actor, requestId) }),
    reactivate: async ({ params, actor, requestId }) => ({ data: await reactivateUser(params.id, actor, requestId) }),
  });
}
