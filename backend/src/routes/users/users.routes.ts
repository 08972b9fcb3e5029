import { dataEnvelope, pageEnvelope } from '@toneledger/common/schemas/envelope';
import { roleChangeSchema, userIdParamsSchema, userListQuerySchema, userSchema } from '@toneledger/common/schemas/users';
import { route, type RouteDef } from '../../http/route';
import { changeRole, listUsers } from '../../services/user.service';
import { presentUser } from '../../presenters/user.presenter';
import { idOf } from '../../middleware/request-id';

export function usersRoutes(): RouteDef[] {
  return [
    route({
      method: 'get',
      path: '/api/users',
      summary: 'Everyone who has signed in or been provisioned, with their role',
      tags: ['users'],
      access: 'users.manage',
      query: userListQuerySchema,
      response: { description: 'A page of users', schema: pageEnvelope(userSchema) },
      handler: async ({ query }) => {
        const { rows, total } = await listUsers(query);
        return { data: rows.map(presentUser), pagination: { page: query.page, pageSize: query.pageSize, total } };
      },
    }),
    route({
      method: 'patch',
      path: '/api/users/:id/role',
      summary: "Changes a user's role (409 if it would leave no administrator)",
      tags: ['users'],
      access: 'users.manage',
      params: userIdParamsSchema,
      body: roleChangeSchema,
      response: { description: 'The changed user', schema: dataEnvelope(userSchema) },
      handler: async ({ params, body, user, req }) => {
        const changed = await changeRole(params.id, body.role, body.reason, { id: user!.id, name: user!.name }, idOf(req));
        return { data: presentUser(changed) };
      },
    }),
  ];
}
