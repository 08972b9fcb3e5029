import type { AuditEvent, AuditRecord } from '@toneledger/common/schemas/audit';
import { actionLabel, auditSentence, readableChanges } from '@toneledger/common/fields/audit-words';
import type { AuditEventModel } from '../models';

/**
 * One audit event, with its action as a sentence and each change as label, before and after in
 * people's words (fields/audit-words.ts). `recordName` names the record when its snapshots do not
 * (a print moved: the snapshot holds only the place), e.g. "print 1987.14.3"; `record` is the record in
 * words and its page (services/audit-records.service.ts).
 */
export function presentAuditEvent(e: AuditEventModel, recordName: string | null, record: AuditRecord): AuditEvent {
  const before = e.before ?? null;
  const after = e.after ?? null;
  return {
    id: String(e.id),
    at: e.at.toISOString(),
    actorId: e.actorId,
    actorName: e.actorName,
    action: e.action,
    entityType: e.entityType,
    entityId: e.entityId,
    before,
    after,
    requestId: e.requestId,
    sentence: auditSentence({ actorName: e.actorName, action: e.action, entityType: e.entityType, before, after }, recordName ?? null),
    actionLabel: actionLabel(e.action),
    changes: e.action === 'session.signed_in' || e.action === 'session.signed_out' ? [] : readableChanges(e.entityType, before, after),
    record,
  };
}
