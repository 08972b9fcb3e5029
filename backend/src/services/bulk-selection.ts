import { createHash } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import type { Role } from '@toneledger/common/domain/roles';
import { BULK_APPLY_MAX, type PrintSelection } from '@toneledger/common/schemas/bulk';
import { printListQuerySchema } from '@toneledger/common/schemas/catalogue';
import { db } from '../db';
import { validationFailed } from '../errors';
import { buildListSql } from './print-list.service';

/**
 * A bulk action's selection, resolved on the server: ticked ids, or every print matching the
 * catalogue list's filters (the list's own WHERE clause, `buildListSql`), in catalogue order. At most
 * BULK_APPLY_MAX + 1 rows are read, so a larger selection is known to be too large without reading it all.
 */

export interface SelectedPrint {
  id: string;
  accession_number: string;
  title: string;
  status: string;
  version: number;
  process: string;
  location_id: string | null;
  location_label: string | null;
  enclosure_id: string | null;
  enclosure_name: string | null;
  warning_codes: string[];
  over_light_budget: boolean;
}

export interface ResolvedSelection {
  rows: SelectedPrint[];
  /** Every print in the selection (counted when there are more than BULK_APPLY_MAX). */
  total: number;
  tooMany: boolean;
}

const COLUMNS = `p.id, p.accession_number, p.title, p.status, p.version, p.process, p.location_id, l.path_label AS location_label,
  p.enclosure_id, e.name AS enclosure_name, p.warning_codes, p.over_light_budget`;
const FROM = 'FROM prints p LEFT JOIN locations l ON l.id = p.location_id LEFT JOIN enclosure_types e ON e.id = p.enclosure_id';

/** The WHERE clause and bind values of a selection. */
function whereOf(selection: PrintSelection, role: Role | null): { where: string; params: unknown[] } {
  if (selection.kind === 'ids') return { where: 'WHERE p.id = ANY($1::uuid[])', params: [[...new Set(selection.ids)]] };
  const sql = buildListSql(printListQuerySchema.parse({ ...selection.query, page: 1, pageSize: 1 }), role);
  return { where: sql.where, params: sql.countParams };
}

/**
 * Reads the selected prints (locked FOR UPDATE when `lock`, inside the apply's transaction). Ticked
 * ids that name no print are refused with their place in the list.
 */
export async function resolveSelection(selection: PrintSelection, role: Role | null, t?: Transaction, lock = false): Promise<ResolvedSelection> {
  const { where, params } = whereOf(selection, role);
  const limit = `$${params.length + 1}`;
  const rows = await db().query<SelectedPrint>(
    `SELECT ${COLUMNS} ${FROM} ${where} ORDER BY p.accession_sort, p.id LIMIT ${limit}${lock ? ' FOR UPDATE OF p' : ''}`,
    { bind: [...params, BULK_APPLY_MAX + 1], type: QueryTypes.SELECT, transaction: t },
  );
  if (selection.kind === 'ids') {
    const found = new Set(rows.map((r) => r.id));
    const issues = selection.ids.flatMap((id, i) => (found.has(id) ? [] : [{ path: `selection.ids.${i}`, message: 'No such print', code: 'not_found' }]));
    if (issues.length) throw validationFailed(issues, 'Some of the selected prints were not found.');
  }
  if (rows.length <= BULK_APPLY_MAX) return { rows, total: rows.length, tooMany: false };
  const [{ n }] = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM prints p ${where}`, { bind: params, type: QueryTypes.SELECT, transaction: t });
  return { rows: rows.slice(0, BULK_APPLY_MAX), total: n, tooMany: true };
}

/** The refusal of an apply past the cap, in the product's words. */
export function tooManyError(total: number) {
  return validationFailed(
    [{ path: 'selection', message: `At most ${BULK_APPLY_MAX.toLocaleString('en-GB')} prints at once: this selection has ${total.toLocaleString('en-GB')}. Narrow the search and apply it in parts.`, code: 'too_many' }],
    'The selection is too large for one action.',
  );
}

/**
 * SHA-256 of the action, its target's version and every selected print's id and version, in order:
 * the preview gives it, the apply recomputes it under lock and refuses when it differs.
 */
export function fingerprintOf(action: string, params: unknown, targetVersion: number | null, rows: readonly SelectedPrint[]): string {
  const h = createHash('sha256');
  h.update(JSON.stringify({ action, params, targetVersion }));
  for (const r of rows) h.update(`\n${r.id}:${r.version}`);
  return h.digest('hex');
}

/** A selection's steps, for the warnings a new enclosure would bring (compatibility.ts). */
export async function stepsOf(ids: readonly string[], t?: Transaction) {
  const rows = await db().query<{ print_id: string; type: string; toner_class: string | null; agent: string | null; alkaline: boolean | null }>(
    'SELECT print_id, type, toner_class, agent, alkaline FROM process_steps WHERE print_id = ANY($1::uuid[]) ORDER BY print_id, position',
    { bind: [[...ids]], type: QueryTypes.SELECT, transaction: t },
  );
  const out = new Map<string, { type: string; tonerClass: string | null; agent: string | null; alkaline: boolean | null }[]>();
  for (const r of rows) {
    const list = out.get(r.print_id) ?? [];
    list.push({ type: r.type, tonerClass: r.toner_class, agent: r.agent, alkaline: r.alkaline });
    out.set(r.print_id, list);
  }
  return out;
}
