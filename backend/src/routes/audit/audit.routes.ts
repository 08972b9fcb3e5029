import { pageEnvelope } from '@toneledger/common/schemas/envelope';
import { auditEventSchema, auditListQuerySchema } from '@toneledger/common/schemas/audit';
import { route, type RouteDef } from '../../http/route';
import { listAudit } from '../../services/audit.service';
import { presentAuditEvent } from '../../presenters/audit.presenter';

export function auditRoutes(): RouteDef[] {
  return [
    route({
      method: 'get',
      path: '/api/audit',
      summary: 'The audit trail, newest first: who, when, what, before and after',
      tags: ['audit'],
      access: 'audit.read',
      query: auditListQuerySchema,
      response: { description: 'A page of audit events', schema: pageEnvelope(auditEventSchema) },
      handler: async ({ query }) => {
        const { rows, total } = await listAudit(query);
        return { data: rows.map(presentAuditEvent), pagination: { page: query.page, pageSize: query.pageSize, total } };
      },
    }),
  ];
}
