import type { Writable } from 'node:stream';
import type { Role } from '@toneledger/common/domain/roles';
import { printListQuerySchema } from '@toneledger/common/schemas/catalogue';
import type { PrintSelection } from '@toneledger/common/schemas/bulk';
import { listedIds, printJson, writePrintRowsCsv } from './print-export.service';
import { resolveSelection, tooManyError } from './bulk-selection';
import { validationFailed } from '../errors';

/**
 * A selection's export, through the catalogue's own export code (print-export.service.ts): the CSV
 * has the list export's columns for the role, streamed a chunk at a time with no cap; the JSON holds
 * each print as its single export gives it, so it is capped like an apply (BULK_APPLY_MAX).
 */

const CHUNK = 2000;

async function* chunksOf(selection: PrintSelection, role: Role | null): AsyncGenerator<string[]> {
  if (selection.kind === 'query') {
    yield* listedIds(printListQuerySchema.parse({ ...selection.query }), role);
    return;
  }
  // Ticked ids, in catalogue order, each checked to exist (a missing one is refused before any byte is sent).
  const { rows } = await resolveSelection(selection, role);
  for (let i = 0; i < rows.length; i += CHUNK) yield rows.slice(i, i + CHUNK).map((r) => r.id);
}

export async function writeSelectionCsv(selection: PrintSelection, role: Role | null, out: Writable): Promise<number> {
  if (selection.kind === 'ids') await resolveSelection(selection, role);
  return writePrintRowsCsv(chunksOf(selection, role), role, out);
}

/** `{ exportedAt, prints: [...] }`; `start` runs once the selection is known to be good, before the first byte. */
export async function writeSelectionJson(selection: PrintSelection, role: Role | null, out: Writable, start: () => void): Promise<number> {
  const { rows, total, tooMany } = await resolveSelection(selection, role);
  if (tooMany) throw tooManyError(total);
  if (rows.length === 0) throw validationFailed([{ path: 'selection', message: 'No print matches this selection', code: 'empty' }]);
  start();
  out.write(`{"exportedAt":${JSON.stringify(new Date().toISOString())},"prints":[`);
  let n = 0;
  for (const r of rows) {
    const { exportedAt: _e, ...doc } = await printJson(r.id, role);
    const chunk = `${n ? ',' : ''}${JSON.stringify(doc)}`;
    if (!out.write(chunk)) await new Promise((resolve) => out.once('drain', resolve));
    n++;
  }
  out.write(']}');
  return n;
}
