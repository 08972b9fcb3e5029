import { warnUncheckedPattern } from './settings.service';
import { createHash } from 'node:crypto';
import { checkAccession } from '@toneledger/common/domain/accession';
import { readCode, toCell, type FieldSpec } from '@toneledger/common/fields/field';
import { ENTERED_PRINT_FIELDS, PRINT_FIELDS, labelOf } from '@toneledger/common/fields/print';
import { printInputSchema, type PrintInput, type ProcessStepInput } from '@toneledger/common/schemas/catalogue';
import { TONER_CLASS } from '@toneledger/common/schemas/vocab';
import type { CsvIssue, ReadFile } from './import-csv';
import type { Existing, Lookups, Named } from './import-lookups';
import { readSteps, stepCellsInRows, stepChanges, type Change, type PrintSteps } from './import-steps';
import { accessionSortKey, deriveDate, tonerClassesOf, warningsOf } from './print-derive';
import { cellInRow, snakeCase, valueInRow } from './print-csv';

/**
 * Checking an import: every row of the prints file (and of the steps file) against the contract's
 * schemas and the catalogue, and what each good row would do — create a print, update the print
 * with its accession number (and exactly what changes), or nothing. Nothing is written here; the
 * same check runs again inside the commit's transaction.
 *
 * Cells: on a new print an empty or missing column takes the field's default (fields/print.ts). On
 * an update a missing column leaves the field as it is; an empty cell takes the default (none, or
 * the default code), as on a new print. Computed and system columns are read and ignored, except
 * `toner_classes` on a new print that has no rows in the steps file: each class becomes a toning step.
 */

export type RowAction = 'create' | 'update' | 'unchanged';

export interface PlannedRow {
  row: number;
  accessionNumber: string;
  action: RowAction;
  changes: Change[];
  /** The print updated: its id, version and place. */
  existing: { id: string; version: number; locationId: string | null } | null;
  /** Model attributes to write: every field on a create; only the changed ones, with what derives from them, on an update. */
  values: Record<string, unknown>;
  /** A maker the catalogue does not have yet (created by the commit). */
  newMaker: string | null;
  /** The process history to write; null keeps it (an update) or leaves it empty (a create). */
  steps: ProcessStepInput[] | null;
  /** A create: where the print is placed first. An update: where it moves to (null: it stays). */
  locationId: string | null;
}

export interface Plan {
  rows: PlannedRow[];
  issues: CsvIssue[];
  newMakers: string[];
  ignoredColumns: string[];
  stepRows: number;
  /** Fingerprint of what the plan does, to tell whether the catalogue changed between the check and the commit. */
  hash: string;
}

const INPUT_KEYS = new Map<string, string>(ENTERED_PRINT_FIELDS.map((f) => [f.inputKey, f.column]));

/** The value of an entered field as the contract's input takes it, from the print's database row. */
function inputInRow(f: FieldSpec, existing: Existing): unknown {
  return f.type.kind === 'reference' ? existing.row[snakeCase(f.inputKey!)] ?? null : valueInRow(f, existing.row);
}

interface RowState {
  add: (column: string, message: string) => void;
  /** Canonical names of the references the row matched, by column. */
  names: Record<string, string>;
  newMaker: string | null;
}

/** A cell as the contract's input takes it: a code, the id of a matched record, or the text. */
function readCell(f: FieldSpec, cell: string, l: Lookups, state: RowState): unknown {
  const t = f.type;
  if (t.kind === 'code') {
    const code = readCode(t, cell);
    if (code === undefined) state.add(f.column, `Not one of: ${t.codes.join(', ')}`);
    return code ?? null;
  }
  if (t.kind !== 'reference') return cell;
  if (!cell) return null;
  const found: Named | 'ambiguous' | undefined = l[t.to].get(cell);
  if (found === 'ambiguous') {
    state.add(f.column, `More than one ${t.to} has this name`);
    return null;
  }
  if (found) {
    state.names[f.column] = found.name;
    return found.id;
  }
  if (t.to === 'maker') {
    state.newMaker = cell;
    state.names[f.column] = cell;
  } else if (t.to === 'paper') state.add(f.column, 'No paper with this name: add it under Papers first (manufacturer product, surface)');
  else if (t.to === 'location') state.add(f.column, 'No place with this path or code: add it under Locations first');
  else state.add(f.column, 'No enclosure type with this name');
  return null;
}

/** Toning steps from the toner_classes cell of a new print without rows in the steps file. */
function toningFrom(cell: string, state: RowState): ProcessStepInput[] {
  const steps: ProcessStepInput[] = [];
  for (const part of cell.split(';').map((x) => x.trim()).filter(Boolean)) {
    const tc = readCode(TONER_CLASS, part) as ProcessStepInput['tonerClass'] | undefined;
    if (tc === undefined) state.add('toner_classes', `"${part}" is not one of: ${TONER_CLASS.codes.join(', ')}`);
    else if (tc && !steps.some((s) => s.tonerClass === tc)) steps.push({ type: 'toning', tonerClass: tc, notes: 'Toner class from CSV import' });
  }
  return steps;
}

/**
 * Checks both files against the catalogue (`existing`: the prints with the file's accession
 * numbers) and plans every good row.
 */
/** ' on YYYY-MM-DD' for a deaccession day as the driver reads it (a date column: text, or a Date at local midnight). */
function dayText(value: unknown): string {
  if (typeof value === 'string' && /^\d{4}-\d{2}-\d{2}/.test(value)) return ` on ${value.slice(0, 10)}`;
  if (value instanceof Date && !Number.isNaN(value.getTime())) {
    return ` on ${value.getFullYear()}-${String(value.getMonth() + 1).padStart(2, '0')}-${String(value.getDate()).padStart(2, '0')}`;
  }
  return '';
}

export function checkImport(prints: ReadFile, stepsFile: ReadFile | null, l: Lookups, existing: Map<string, Existing>): Plan {
  const issues: CsvIssue[] = [...prints.issues, ...(stepsFile?.issues ?? [])];
  const stepsByPrint = stepsFile ? readSteps(stepsFile, l, issues) : new Map<string, PrintSteps>();
  const seen = new Map<string, number>();
  const rows: PlannedRow[] = [];
  const newMakers = new Map<string, string>();
  const has = (column: string) => prints.header.includes(column);
  /** Whether a new print took toning steps from its toner_classes cell (the column is then not ignored). */
  let tonerClassesRead = false;

  for (const { row, cells } of prints.rows) {
    const state: RowState = { add: (column, message) => issues.push({ file: 'prints', row, column, value: cells[column] ?? null, message }), names: {}, newMaker: null };
    const before = issues.length;
    const s = (column: string) => (cells[column] ?? '').trim();

    let accession = s('accession_number');
    if (accession) {
      const check = checkAccession(l.pattern, accession);
      if (check.ok) {
        accession = check.normalised;
        warnUncheckedPattern(l.pattern, check.unchecked);
      }
      else state.add('accession_number', check.message);
      const key = accession.toLowerCase();
      if (seen.has(key)) state.add('accession_number', `Repeats the accession number of row ${seen.get(key)}`);
      else seen.set(key, row);
    }
    const current = existing.get(accession.toLowerCase()) ?? null;

    const candidate: Record<string, unknown> = {};
    for (const f of ENTERED_PRINT_FIELDS) {
      if (!has(f.column) && current) {
        candidate[f.inputKey] = inputInRow(f, current);
        if (f.type.kind === 'reference') state.names[f.column] = cellInRow(f, current.row);
        continue;
      }
      const cell = (has(f.column) ? s(f.column) : '') || (f.default ?? '');
      candidate[f.inputKey] = readCell(f, cell, l, state);
    }
    const parsed = printInputSchema.safeParse(candidate);
    if (!parsed.success) {
      for (const i of parsed.error.issues) {
        const column = INPUT_KEYS.get(String(i.path[0])) ?? String(i.path[0] ?? '');
        if (!issues.slice(before).some((x) => x.column === column)) state.add(column, i.message);
      }
    }
    let date = null;
    try {
      date = deriveDate(typeof candidate.dateMade === 'string' ? candidate.dateMade : null);
    } catch (err) {
      state.add('date_made', (err as { details?: { message: string }[] }).details?.[0]?.message ?? 'Not an EDTF date');
    }
    const fileSteps = stepsByPrint.get(accession.toLowerCase());
    stepsByPrint.delete(accession.toLowerCase());
    const toning = !current && !fileSteps && has('toner_classes') ? toningFrom(s('toner_classes'), state) : [];
    if (toning.length) tonerClassesRead = true;
    if (current?.row.location_id && parsed.success && !parsed.data.locationId) {
      state.add('location', 'A print in the catalogue cannot be left without a place: name the place it moves to');
    }
    if (issues.length > before || !parsed.success || !date) continue;

    const v = { ...parsed.data, accessionNumber: accession } as PrintInput;
    const after = (f: FieldSpec) => state.names[f.column] ?? (f.type.kind === 'reference' ? '' : toCell(v[f.inputKey as keyof PrintInput]));
    if (state.newMaker && !newMakers.has(state.newMaker.toLowerCase())) newMakers.set(state.newMaker.toLowerCase(), state.newMaker);
    // A new maker is created once, named as the file first writes it; every row naming it stores that name.
    if (state.newMaker) state.names.maker = state.newMaker = newMakers.get(state.newMaker.toLowerCase())!;
    const derived = (changed: (key: string) => boolean) => ({
      ...(changed('accessionNumber') ? { accessionSort: accessionSortKey(v.accessionNumber) } : {}),
      ...(changed('dateMade') ? date : {}),
      ...(changed('makerId') ? { makerName: state.names.maker || null } : {}),
      ...(changed('paperId') ? { paperLabel: state.names.paper || null } : {}),
    });

    if (!current) {
      const steps = fileSteps ? fileSteps.steps.map((x) => x.input) : toning;
      const enclosure = v.enclosureId ? l.enclosure.get(state.names.enclosure) : null;
      const facts = steps.map((x) => ({ type: x.type, tonerClass: x.tonerClass ?? null, agent: x.agent ?? null, alkaline: x.alkaline ?? null }));
      const { locationId, ...fields } = v;
      rows.push({
        row, accessionNumber: accession, action: 'create', changes: [], existing: null, newMaker: state.newMaker, steps: steps.length ? steps : null,
        locationId: locationId ?? null,
        values: {
          ...fields, ...derived(() => true), tonerClasses: tonerClassesOf(facts),
          warningCodes: warningsOf(v.process, facts, enclosure && enclosure !== 'ambiguous' ? (enclosure as Required<Named>) : null).map((w) => w.code),
        },
      });
      continue;
    }

    const changes: Change[] = [];
    const values: Record<string, unknown> = {};
    let moveTo: string | null = null;
    for (const f of ENTERED_PRINT_FIELDS) {
      const [was, now] = [cellInRow(f, current.row), after(f)];
      if (was === now) continue;
      changes.push({ field: f.column, label: labelOf(f.key), before: was, after: now });
      if (f.createOnly) moveTo = v[f.inputKey as keyof PrintInput] as string | null;
      else values[f.inputKey] = v[f.inputKey as keyof PrintInput] ?? null;
    }
    Object.assign(values, derived((key) => key in values));
    let steps: ProcessStepInput[] | null = null;
    if (fileSteps) {
      const stepChanged = stepChanges(stepCellsInRows(current.steps), fileSteps.steps.map((x) => x.cells));
      if (stepChanged.length) {
        changes.push(...stepChanged);
        steps = fileSteps.steps.map((x) => x.input);
      }
    }
    if (changes.length && current.row.status === 'deaccessioned') {
      state.add('accession_number', `This print was deaccessioned${dayText(current.row.deaccessioned_on)} (deaccessioned: read-only); leave its row out or as the print stands`);
      continue;
    }
    rows.push({
      row, accessionNumber: accession, action: changes.length ? 'update' : 'unchanged', changes, newMaker: state.newMaker, steps, values,
      existing: { id: String(current.row.id), version: Number(current.row.version), locationId: (current.row.location_id as string | null) ?? null },
      locationId: moveTo,
    });
  }
  for (const [, left] of stepsByPrint) {
    issues.push({ file: 'steps', row: left.row, column: 'accession_number', value: left.accessionNumber, message: 'No row of the prints file has this accession number' });
  }
  const ignoredColumns = prints.header.filter(
    (c) => PRINT_FIELDS.some((f) => f.column === c && f.origin !== 'entered') && !(c === 'toner_classes' && tonerClassesRead),
  );
  const plan = { rows, issues, newMakers: [...newMakers.values()].sort(), ignoredColumns, stepRows: stepsFile?.rows.length ?? 0 };
  const hash = createHash('sha256').update(JSON.stringify([plan.newMakers, rows.map((r) => [r.row, r.accessionNumber, r.action, r.changes])])).digest('hex');
  return { ...plan, hash };
}
