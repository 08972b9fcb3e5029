import { auditApi } from '@toneledger/common/api/users';
import { implement, type RouteDef } from '../../http/route';
import { listAudit } from '../../services/audit.service';

export function auditRoutes(): RouteDef[] {
  return implement(auditApi, {
    list: async ({ query }) => {
      const { rows, total } = await listAudit(query);
      return { data: rows, pagination: { page: query.page, pageSize: query.pageSize, total } };
    },
  });
}
