import { QueryTypes } from 'sequelize';
import type { Writable } from 'node:stream';
import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { can, type Role } from '@toneledger/common/domain/roles';
import { mayRead } from '@toneledger/common/fields/field';
import { PRINT_FIELDS } from '@toneledger/common/fields/print';
import { STEP_FIELDS } from '@toneledger/common/fields/step';
import { db } from '../db';
import { buildListSql, listMovements, loadPrint, printHistory } from './print.service';
import { presentPrint } from '../presenters/catalogue.presenter';
import { PRINT_ROWS_SQL, STEP_ROWS_SQL, exportCellInRow, type DbRow } from './print-csv';
import { toCsv, type CsvCell } from './csv-cells';

const CHUNK = 2000;

/** The ids of the filtered list, in its order, a chunk at a time. */
export async function* listedIds(query: PrintListQuery, role: Role | null): AsyncGenerator<string[]> {
  for (let page = 1; ; page++) {
    const sql = buildListSql({ ...query, page, pageSize: CHUNK }, role);
    const ids = (await db().query<{ id: string }>(sql.select, { bind: sql.params, type: QueryTypes.SELECT })).map((r) => r.id);
    if (!ids.length) return;
    yield ids;
    if (ids.length < CHUNK) return;
  }
}

async function write(out: Writable, rows: CsvCell[][]) {
  if (!out.write(toCsv(rows))) await new Promise((resolve) => out.once('drain', resolve));
}

/**
 * Writes the filtered list as CSV (RFC 4180, UTF-8), page by page so memory stays flat: one column
 * per print field the role may read (fields/print.ts), in table order. Computed and system columns
 * (toner classes, warnings, id, last changed) come last; an import reads the same file and ignores them.
 * Text that a spreadsheet would run as a formula is written with a leading ' (csv-cells.ts).
 */
export async function writePrintsCsv(query: PrintListQuery, role: Role | null, out: Writable): Promise<number> {
  return writePrintRowsCsv(listedIds(query, role), role, out);
}

/** The same CSV for any ids, a chunk at a time, in the order given (a bulk action's selection). */
export async function writePrintRowsCsv(chunks: AsyncIterable<string[]>, role: Role | null, out: Writable): Promise<number> {
  const fields = PRINT_FIELDS.filter((f) => mayRead(role, f));
  out.write(toCsv([fields.map((f) => f.column)]));
  let written = 0;
  for await (const ids of chunks) {
    const rows = await db().query<DbRow>(`${PRINT_ROWS_SQL} WHERE p.id = ANY($1)`, { bind: [ids], type: QueryTypes.SELECT });
    const byId = new Map(rows.map((r) => [r.id as string, r]));
    await write(out, ids.map((id) => fields.map((f) => exportCellInRow(f, byId.get(id)!))));
    written += ids.length;
  }
  return written;
}

/**
 * Writes the process histories of the filtered list as CSV: one row per step, keyed by the print's
 * accession number and the step's place (fields/step.ts), prints in the list's order.
 */
export async function writeStepsCsv(query: PrintListQuery, role: Role | null, out: Writable): Promise<number> {
  out.write(toCsv([STEP_FIELDS.map((f) => f.column)]));
  let written = 0;
  for await (const ids of listedIds(query, role)) {
    const rows = await db().query<DbRow>(`${STEP_ROWS_SQL} WHERE s.print_id = ANY($1)`, { bind: [ids], type: QueryTypes.SELECT });
    const order = new Map(ids.map((id, i) => [id, i]));
    rows.sort((a, b) => order.get(a.print_id as string)! - order.get(b.print_id as string)! || (a.position as number) - (b.position as number));
    await write(out, rows.map((r) => STEP_FIELDS.map((f) => exportCellInRow(f, r))));
    written += rows.length;
  }
  return written;
}

/** One print with everything the role may see: record, process history, and for staff its movements and audit history. */
export async function printJson(id: string, role: Role | null) {
  const print = presentPrint(await loadPrint(id), role);
  if (!can(role, 'catalogue.read_restricted')) return { exportedAt: new Date().toISOString(), print };
  return { exportedAt: new Date().toISOString(), print, movements: await listMovements(id), history: await printHistory(id, role) };
}
