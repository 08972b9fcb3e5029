import { QueryTypes, type Transaction } from 'sequelize';
import type { z } from 'zod';
import { savedSearchSchema, type SavedSearch, type savedSearchInputSchema, type savedSearchUpdateSchema } from '@toneledger/common/schemas/bulk';
import { db } from '../db';
import { forbidden, notFound } from '../errors';
import { recordAudit } from './audit.service';
import { staleEdit } from './versioning';

/**
 * Saved catalogue searches: a person's own unless shared (then everyone who reads the catalogue sees
 * them in their list); only the owner changes or deletes one, with the version it read (409 otherwise).
 */

export interface Actor { id: string | null; name: string | null }

interface Row { id: string; name: string; query: unknown; shared: boolean; owner_id: string; owner_name: string; created_at: Date; updated_at: Date; version: number }

const COLUMNS = 'id, name, query, shared, owner_id, owner_name, created_at, updated_at, version';
const ENTITY = 'saved_search';

function present(r: Row, actor: Actor): SavedSearch {
  return {
    id: r.id, name: r.name, query: savedSearchSchema.shape.query.parse(r.query), shared: r.shared, mine: r.owner_id === actor.id,
    owner: { id: r.owner_id, name: r.owner_name }, createdAt: r.created_at.toISOString(), updatedAt: r.updated_at.toISOString(), version: r.version,
  };
}

async function visible(id: string, actor: Actor, t: Transaction): Promise<Row> {
  const [row] = await db().query<Row>(`SELECT ${COLUMNS} FROM saved_searches WHERE id = $1 FOR UPDATE`, { bind: [id], transaction: t, type: QueryTypes.SELECT });
  if (!row || (!row.shared && row.owner_id !== actor.id)) throw notFound('The saved search');
  return row;
}

/** My searches first (newest change first), then those others share. */
export async function listSavedSearches(actor: Actor): Promise<SavedSearch[]> {
  const rows = await db().query<Row>(
    `SELECT ${COLUMNS} FROM saved_searches WHERE owner_id = $1 OR shared ORDER BY (owner_id = $1) DESC, lower(name), id LIMIT 500`,
    { bind: [actor.id], type: QueryTypes.SELECT },
  );
  return rows.map((r) => present(r, actor));
}

export async function createSavedSearch(input: z.infer<typeof savedSearchInputSchema>, actor: Actor, requestId: string | null): Promise<SavedSearch> {
  return db().transaction(async (t) => {
    const [row] = await db().query<Row>(
      `INSERT INTO saved_searches (name, query, shared, owner_id, owner_name) VALUES ($1, $2::jsonb, $3, $4, $5) RETURNING ${COLUMNS}`,
      { bind: [input.name, JSON.stringify(input.query), input.shared, actor.id, actor.name ?? 'Unknown'], transaction: t, type: QueryTypes.SELECT },
    );
    const out = present(row!, actor);
    await recordAudit({ actor, action: 'saved_search.created', entityType: ENTITY, entityId: out.id, after: out, requestId }, t);
    return out;
  });
}

export async function updateSavedSearch(id: string, update: z.infer<typeof savedSearchUpdateSchema>, actor: Actor, requestId: string | null): Promise<SavedSearch> {
  return db().transaction(async (t) => {
    const row = await visible(id, actor, t);
    if (row.owner_id !== actor.id) throw forbidden('Only the person who saved a search may change it.');
    if (row.version !== update.version) throw await staleEdit(ENTITY, id, present(row, actor), t);
    const [next] = await db().query<Row>(
      `UPDATE saved_searches SET name = coalesce($2, name), query = coalesce($3::jsonb, query), shared = coalesce($4, shared),
              version = version + 1, updated_at = now() WHERE id = $1 RETURNING ${COLUMNS}`,
      { bind: [id, update.name ?? null, update.query ? JSON.stringify(update.query) : null, update.shared ?? null], transaction: t, type: QueryTypes.SELECT },
    );
    const out = present(next!, actor);
    await recordAudit({ actor, action: 'saved_search.updated', entityType: ENTITY, entityId: id, before: present(row, actor), after: out, requestId }, t);
    return out;
  });
}

export async function deleteSavedSearch(id: string, version: number, actor: Actor, requestId: string | null): Promise<void> {
  await db().transaction(async (t) => {
    const row = await visible(id, actor, t);
    if (row.owner_id !== actor.id) throw forbidden('Only the person who saved a search may delete it.');
    if (row.version !== version) throw await staleEdit(ENTITY, id, present(row, actor), t);
    await db().query('DELETE FROM saved_searches WHERE id = $1', { bind: [id], transaction: t });
    await recordAudit({ actor, action: 'saved_search.deleted', entityType: ENTITY, entityId: id, before: present(row, actor), requestId }, t);
  });
}
