import { QueryTypes, type Transaction } from 'sequelize';
import { cohortQuerySchema, type SavedQuery, type savedQueryInputSchema, type savedQueryListSchema, type savedQueryUpdateSchema } from '@toneledger/common/schemas/research';
import type { z } from 'zod';
import { db } from '../db';
import { forbidden, notFound } from '../errors';
import { recordAudit } from './audit.service';
import { staleEdit } from './versioning';

/**
 * Saved cohort queries: private to their owner unless shared (then every role that runs queries sees
 * them); only the owner changes or deletes one, with the version it read (409 otherwise). Audited.
 */

export interface Actor { id: string; name: string | null }

interface Row {
  id: string; name: string; description: string | null; query: unknown; shared: boolean; owner_id: string; owner_name: string;
  created_at: Date; updated_at: Date; version: number;
}

function present(r: Row): SavedQuery {
  return {
    id: r.id, name: r.name, description: r.description, query: cohortQuerySchema.parse(r.query), shared: r.shared,
    owner: { id: r.owner_id, name: r.owner_name }, createdAt: r.created_at.toISOString(), updatedAt: r.updated_at.toISOString(), version: r.version,
  };
}

const COLUMNS = 'id, name, description, query, shared, owner_id, owner_name, created_at, updated_at, version';

async function visible(id: string, actor: Actor, t?: Transaction, lock = false): Promise<Row> {
  const [row] = await db().query<Row>(`SELECT ${COLUMNS} FROM research_queries WHERE id = $1${lock ? ' FOR UPDATE' : ''}`, { bind: [id], transaction: t, type: QueryTypes.SELECT });
  if (!row || (!row.shared && row.owner_id !== actor.id)) throw notFound('The saved query');
  return row;
}

export async function listSavedQueries(query: z.infer<typeof savedQueryListSchema>, actor: Actor) {
  const mineOnly = query.mine === 'true';
  const where = mineOnly ? 'owner_id = $1' : '(owner_id = $1 OR shared)';
  const offset = (query.page - 1) * query.pageSize;
  const [rows, [{ total }]] = await Promise.all([
    db().query<Row>(`SELECT ${COLUMNS} FROM research_queries WHERE ${where} ORDER BY updated_at DESC, id LIMIT $2 OFFSET $3`, { bind: [actor.id, query.pageSize, offset], type: QueryTypes.SELECT }),
    db().query<{ total: number }>(`SELECT count(*)::int AS total FROM research_queries WHERE ${where}`, { bind: [actor.id], type: QueryTypes.SELECT }),
  ]);
  return { data: rows.map(present), pagination: { page: query.page, pageSize: query.pageSize, total } };
}

export async function getSavedQuery(id: string, actor: Actor): Promise<SavedQuery> {
  return present(await visible(id, actor));
}

export async function saveQuery(input: z.infer<typeof savedQueryInputSchema>, actor: Actor, requestId: string | null): Promise<SavedQuery> {
  return db().transaction(async (t) => {
    const [row] = await db().query<Row>(
      `INSERT INTO research_queries (name, description, query, shared, owner_id, owner_name) VALUES ($1, $2, $3::jsonb, $4, $5, $6) RETURNING ${COLUMNS}`,
      { bind: [input.name, input.description ?? null, JSON.stringify(input.query), input.shared, actor.id, actor.name ?? 'Unknown'], transaction: t, type: QueryTypes.SELECT },
    );
    const out = present(row!);
    await recordAudit({ actor, action: 'research_query.created', entityType: 'research_query', entityId: out.id, after: out, requestId }, t);
    return out;
  });
}

export async function updateSavedQuery(id: string, update: z.infer<typeof savedQueryUpdateSchema>, actor: Actor, requestId: string | null): Promise<SavedQuery> {
  return db().transaction(async (t) => {
    const row = await visible(id, actor, t, true);
    if (row.owner_id !== actor.id) throw forbidden('Only the owner of a saved query may change it.');
    if (row.version !== update.version) throw await staleEdit('research_query', id, present(row), t);
    const [next] = await db().query<Row>(
      `UPDATE research_queries SET name = coalesce($2, name), description = CASE WHEN $3::boolean THEN $4 ELSE description END,
              query = coalesce($5::jsonb, query), shared = coalesce($6, shared), version = version + 1, updated_at = now()
        WHERE id = $1 RETURNING ${COLUMNS}`,
      { bind: [id, update.name ?? null, update.description !== undefined, update.description ?? null, update.query ? JSON.stringify(update.query) : null, update.shared ?? null], transaction: t, type: QueryTypes.SELECT },
    );
    const out = present(next!);
    await recordAudit({ actor, action: 'research_query.updated', entityType: 'research_query', entityId: id, before: present(row), after: out, requestId }, t);
    return out;
  });
}

export async function deleteSavedQuery(id: string, version: number, actor: Actor, requestId: string | null): Promise<void> {
  await db().transaction(async (t) => {
    const row = await visible(id, actor, t, true);
    if (row.owner_id !== actor.id) throw forbidden('Only the owner of a saved query may delete it.');
    if (row.version !== version) throw await staleEdit('research_query', id, present(row), t);
    await db().query('DELETE FROM research_queries WHERE id = $1', { bind: [id], transaction: t });
    await recordAudit({ actor, action: 'research_query.deleted', entityType: 'research_query', entityId: id, before: present(row), requestId }, t);
  });
}
