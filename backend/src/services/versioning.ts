import { UniqueConstraintError, type Transaction } from 'sequelize';
import { AuditEventModel } from '../models';
import { conflict } from '../errors';

/** The 409 for an edit made against an old version: carries the record as it is now, and who changed it last. */
export async function staleEdit(entityType: string, id: string, current: unknown, transaction?: Transaction) {
  const last = await AuditEventModel.findOne({
    where: { entityType, entityId: id },
    order: [['id', 'DESC']],
    transaction,
  });
  return conflict('Someone saved this record after you opened it. Review their changes, then save yours again.', {
    current,
    lastChangedBy: last?.actorName ?? null,
    lastChangedAt: last ? last.at.toISOString() : null,
  });
}

/** Turns a unique-index violation into a 409 naming the field; rethrows anything else. */
export function rethrowUnique(err: unknown, field: string, message: string): never {
  if (err instanceof UniqueConstraintError) {
    throw conflict(message, [{ path: field, message, code: 'unique' }]);
  }
  throw err;
}

/** Top-level fields whose values differ between two snapshots. */
export function changedFields(before: Record<string, unknown> | null, after: Record<string, unknown> | null) {
  const keys = new Set([...Object.keys(before ?? {}), ...Object.keys(after ?? {})]);
  const out: { field: string; before: unknown; after: unknown }[] = [];
  for (const k of keys) {
    const b = before?.[k] ?? null;
    const a = after?.[k] ?? null;
    if (JSON.stringify(b) !== JSON.stringify(a)) out.push({ field: k, before: b, after: a });
  }
  return out;
}
