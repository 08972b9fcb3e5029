import { z } from 'zod';
import { pageQuerySchema } from './envelope';

export const auditEventSchema = z.object({
  id: z.string(),
  at: z.string().datetime(),
  actorId: z.string().uuid().nullable(),
  actorName: z.string().nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.string().nullable(),
  before: z.unknown().nullable(),
  after: z.unknown().nullable(),
  requestId: z.string().nullable(),
});
export type AuditEvent = z.infer<typeof auditEventSchema>;

export const auditListQuerySchema = pageQuerySchema.extend({
  action: z.string().trim().max(100).optional(),
  entityType: z.string().trim().max(100).optional(),
  entityId: z.string().trim().max(100).optional(),
  actorId: z.string().uuid().optional(),
});
export type AuditListQuery = z.infer<typeof auditListQuerySchema>;
