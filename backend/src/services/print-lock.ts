import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db';
import { conflict, notFound } from '../errors';

/**
 * The deaccession guard. A deaccessioned print stays findable and readable, but its record and every
 * record that hangs from it (process steps, images, condition reports and addenda, measurements,
 * movements, loans and exhibitions it belongs to, schedule overrides, treatments…) are read-only.
 * Every write path that changes a print or a dependent record calls `assertPrintEditable` (or
 * `assertPrintsEditable` for many) inside its transaction, before writing: a deaccessioned print is
 * refused with 409 `conflict` in the error envelope, `details.deaccessioned` holding the day.
 */
export type PrintRef = string | { id: string; status?: string | null; deaccessionedOn?: string | null };

type Row = { id: string; status: string; deaccessioned_on: string | null };

export function deaccessionedMessage(on: string | null): string {
  return on
    ? `This print was deaccessioned on ${on}; its record is read-only.`
    : 'This print was deaccessioned; its record is read-only.';
}

function refuse(row: Row): never {
  throw conflict(deaccessionedMessage(row.deaccessioned_on), { printId: row.id, deaccessioned: row.deaccessioned_on ?? true });
}

/**
 * Throws 409 when the print is deaccessioned, 404 when there is no such print. Given a loaded print
 * whose status is not deaccessioned, it answers without reading the database.
 */
export async function assertPrintEditable(printOrId: PrintRef, t?: Transaction | null): Promise<void> {
  if (typeof printOrId !== 'string' && printOrId.status != null && printOrId.status !== 'deaccessioned') return;
  const id = typeof printOrId === 'string' ? printOrId : printOrId.id;
  const rows = await db().query<Row>(`SELECT id, status, deaccessioned_on::text AS deaccessioned_on FROM prints WHERE id = $1`, {
    bind: [id], type: QueryTypes.SELECT, transaction: t ?? undefined,
  });
  if (!rows[0]) throw notFound('The print');
  if (rows[0].status === 'deaccessioned') refuse(rows[0]);
}

/** The same for many prints at once (bulk actions, loans, exhibitions, rounds): the first deaccessioned one refuses them all. Unknown ids are left to the caller. */
export async function assertPrintsEditable(ids: readonly string[], t?: Transaction | null): Promise<void> {
  if (ids.length === 0) return;
  const rows = await db().query<Row>(
    `SELECT id, status, deaccessioned_on::text AS deaccessioned_on FROM prints WHERE id = ANY($1::uuid[]) AND status = 'deaccessioned' ORDER BY id LIMIT 1`,
    { bind: [[...new Set(ids)]], type: QueryTypes.SELECT, transaction: t ?? undefined },
  );
  if (rows[0]) refuse(rows[0]);
}

/** Whether the print is deaccessioned (for screens and previews that warn rather than refuse). */
export async function deaccessionedPrintIds(ids: readonly string[], t?: Transaction | null): Promise<Set<string>> {
  if (ids.length === 0) return new Set();
  const rows = await db().query<{ id: string }>(`SELECT id FROM prints WHERE id = ANY($1::uuid[]) AND status = 'deaccessioned'`, {
    bind: [[...new Set(ids)]], type: QueryTypes.SELECT, transaction: t ?? undefined,
  });
  return new Set(rows.map((r) => r.id));
}
