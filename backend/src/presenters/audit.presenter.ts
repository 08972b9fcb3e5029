import type { AuditEvent } from '@toneledger/common/schemas/audit';
import type { AuditEventModel } from '../models';

export function presentAuditEvent(e: AuditEventModel): AuditEvent {
  return {
    id: String(e.id),
    at: e.at.toISOString(),
    actorId: e.actorId,
    actorName: e.actorName,
    action: e.action,
    entityType: e.entityType,
    entityId: e.entityId,
    before: e.before ?? null,
    after: e.after ?? null,
    requestId: e.requestId,
  };
}
