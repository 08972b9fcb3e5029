import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db';
import type { AuditActor } from './audit.service';

/**
 * Addenda: the one way to correct or add to a signed record (a condition report or a treatment).
 * Both kinds are rows of the append-only `addenda` table (a trigger refuses UPDATE and DELETE), each
 * belonging to exactly one record. Written here for both, inside the caller's transaction.
 */
export type AddendumTarget = { reportId: string } | { treatmentId: string };
export interface AddendumRow { id: string; authorName: string; writtenAt: string; text: string }

const column = (target: AddendumTarget) => ('reportId' in target ? 'report_id' : 'treatment_id');
const idOf = (target: AddendumTarget) => ('reportId' in target ? target.reportId : target.treatmentId);

export async function writeAddendum(target: AddendumTarget, text: string, actor: AuditActor, t: Transaction): Promise<AddendumRow> {
  const [row] = await db().query<{ id: string; author_name: string; written_at: Date; text: string }>(
    `INSERT INTO addenda (${column(target)}, author_id, author_name, text) VALUES ($1, $2, $3, $4) RETURNING id, author_name, written_at, text`,
    { bind: [idOf(target), actor.id, actor.name ?? 'Unknown', text], type: QueryTypes.SELECT, transaction: t },
  );
  return { id: row.id, authorName: row.author_name, writtenAt: new Date(row.written_at).toISOString(), text: row.text };
}

export async function addendaOf(target: AddendumTarget, t?: Transaction): Promise<AddendumRow[]> {
  const rows = await db().query<{ id: string; author_name: string; written_at: Date; text: string }>(
    `SELECT id, author_name, written_at, text FROM addenda WHERE ${column(target)} = $1 ORDER BY written_at, id`,
    { bind: [idOf(target)], type: QueryTypes.SELECT, transaction: t },
  );
  return rows.map((r) => ({ id: r.id, authorName: r.author_name, writtenAt: new Date(r.written_at).toISOString(), text: r.text }));
}
