import { QueryTypes } from 'sequelize';
import { stringify } from 'csv-stringify/sync';
import type { Writable } from 'node:stream';
import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { can, type Role } from '@toneledger/common/domain/roles';
import { db } from '../db';
import { buildListSql, listMovements, loadPrint, printHistory } from './print.service';
import { presentPrint } from '../presenters/catalogue.presenter';

/** Export columns: the import columns (so an export can be read back in) plus the record id and warnings. */
const PUBLIC_COLUMNS = [
  'accession_number', 'title', 'maker', 'date_made', 'process', 'support', 'paper', 'status', 'enclosure', 'light_responsivity',
  'image_width_mm', 'image_height_mm', 'sheet_width_mm', 'sheet_height_mm', 'mount_width_mm', 'mount_height_mm',
  'inscriptions', 'provenance', 'credit_line', 'toner_classes', 'warnings', 'id', 'updated_at',
] as const;
const RESTRICTED_COLUMNS = ['location', 'staff_notes'] as const;

const CHUNK = 2000;

/** Writes the filtered list as CSV (RFC 4180, UTF-8), page by page so memory stays flat. */
export async function writePrintsCsv(query: PrintListQuery, role: Role | null, out: Writable): Promise<number> {
  const restricted = can(role, 'catalogue.read_restricted');
  const columns = restricted ? [...PUBLIC_COLUMNS.slice(0, 8), 'location', ...PUBLIC_COLUMNS.slice(8, 19), 'staff_notes', ...PUBLIC_COLUMNS.slice(19)] : [...PUBLIC_COLUMNS];
  out.write(stringify([columns]));
  let written = 0;
  for (let page = 1; ; page++) {
    const sql = buildListSql({ ...query, page, pageSize: CHUNK }, role);
    const ids = await db().query<{ id: string }>(sql.select, { bind: sql.params, type: QueryTypes.SELECT });
    if (!ids.length) break;
    const rows = await db().query<Record<string, unknown>>(
      `SELECT p.*, e.name AS enclosure_name, l.path_label AS location_label
         FROM prints p LEFT JOIN enclosure_types e ON e.id = p.enclosure_id LEFT JOIN locations l ON l.id = p.location_id
        WHERE p.id = ANY($1)`,
      { bind: [ids.map((r) => r.id)], type: QueryTypes.SELECT },
    );
    const byId = new Map(rows.map((r) => [r.id as string, r]));
    const records = ids.map(({ id }) => {
      const r = byId.get(id)!;
      const value: Record<string, unknown> = {
        accession_number: r.accession_number, title: r.title, maker: r.maker_name, date_made: r.date_made, process: r.process,
        support: r.support, paper: r.paper_label, status: r.status, location: r.location_label, enclosure: r.enclosure_name,
        light_responsivity: r.light_responsivity, image_width_mm: r.image_width_mm, image_height_mm: r.image_height_mm,
        sheet_width_mm: r.sheet_width_mm, sheet_height_mm: r.sheet_height_mm, mount_width_mm: r.mount_width_mm, mount_height_mm: r.mount_height_mm,
        inscriptions: r.inscriptions, provenance: r.provenance, credit_line: r.credit_line, staff_notes: r.staff_notes,
        toner_classes: (r.toner_classes as string[]).join(';'), warnings: (r.warning_codes as string[]).join(';'), id: r.id,
        updated_at: new Date(r.updated_at as string).toISOString(),
      };
      return columns.map((c) => value[c] ?? '');
    });
    if (!out.write(stringify(records))) await new Promise((resolve) => out.once('drain', resolve));
    written += records.length;
    if (ids.length < CHUNK) break;
  }
  return written;
}

/** One print with everything the role may see: record, process history, and for staff its movements and audit history. */
export async function printJson(id: string, role: Role | null) {
  const print = presentPrint(await loadPrint(id), role);
  if (!can(role, 'catalogue.read_restricted')) return { exportedAt: new Date().toISOString(), print };
  return { exportedAt: new Date().toISOString(), print, movements: await listMovements(id), history: await printHistory(id) };
}
