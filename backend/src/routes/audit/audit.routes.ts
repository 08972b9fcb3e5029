import { auditApi } from '@toneledger/common/api/users';
import { implement, type RouteDef } from '../../http/route';
import { auditChoices, checkAuditQuery, listAudit, writeAuditCsv } from '../../services/audit-read.service';

export function auditRoutes(): RouteDef[] {
  return implement(auditApi, {
    list: async ({ query }) => {
      const { rows, total } = await listAudit(query);
      return { data: rows, pagination: { page: query.page, pageSize: query.pageSize, total } };
    },
    choices: async () => ({ data: await auditChoices() }),
    exportCsv: async ({ query, res }) => {
      checkAuditQuery(query);
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="audit-${new Date().toISOString().slice(0, 10)}.csv"`);
      await writeAuditCsv(query, res);
      res.end();
    },
  });
}
