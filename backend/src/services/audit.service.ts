import type { Transaction } from 'sequelize';
import { AuditEventModel } from '../models';
import type { AuditListQuery } from '@toneledger/common/schemas/audit';
import type { WhereOptions } from 'sequelize';
import { presentAuditEvent } from '../presenters/audit.presenter';

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

export async function listAudit(query: AuditListQuery) {
  const where: WhereOptions<AuditEventModel> = {};
  if (query.action) Object.assign(where, { action: query.action });
  if (query.entityType) Object.assign(where, { entityType: query.entityType });
  if (query.entityId) Object.assign(where, { entityId: query.entityId });
  if (query.actorId) Object.assign(where, { actorId: query.actorId });
  const { rows, count } = await AuditEventModel.findAndCountAll({
    where,
    order: [
      ['at', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  });
  return { rows: rows.map(presentAuditEvent), total: count };
}

