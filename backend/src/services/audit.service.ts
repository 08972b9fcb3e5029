import type { Transaction } from 'sequelize';
import { AuditEventModel } from '../models';

export interface AuditActor {
  id: string | null;
  name: string | null;
}

export interface AuditEntry {
  actor: AuditActor | null;
  action: string;
  entityType: string;
  entityId?: string | null;
  before?: unknown;
  after?: unknown;
  requestId?: string | null;
  ip?: string | null;
}

/** Writes one append-only audit row, inside the caller's transaction when given. */
export async function recordAudit(entry: AuditEntry, transaction?: Transaction): Promise<AuditEventModel> {
  return AuditEventModel.create(
    {
      actorId: entry.actor?.id ?? null,
      actorName: entry.actor?.name ?? null,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId ?? null,
      before: entry.before ?? null,
      after: entry.after ?? null,
      requestId: entry.requestId ?? null,
      ip: entry.ip ?? null,
    },
    { transaction },
  );
}

// Reading the trail (filters, sentences, the CSV export) is audit-read.service.ts.
