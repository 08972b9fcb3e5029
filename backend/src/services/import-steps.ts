import { processStepInputSchema, type ProcessStepInput } from '@toneledger/common/schemas/catalogue';
import { enteredFields, readCode, readYesNo, toCell, type FieldSpec } from '@toneledger/common/fields/field';
import { STEP_FIELDS, stepLabelOf } from '@toneledger/common/fields/step';
import type { CsvIssue, ReadFile } from './import-csv';
import type { Lookups } from './import-lookups';
import { cellInRow, type DbRow } from './print-csv';

/**
 * The steps file: one row per step, keyed by the print's accession number and the step's place.
 * Each row is checked with the contract's step schema; a print's steps are put in order of their
 * numbers, which must differ. What a row writes is read from the step field table.
 */

export const MAX_STEPS = 60;

/** The fields of a step a person enters, in column order. */
const STEP_ENTERED = enteredFields(STEP_FIELDS);

export interface PlannedStep {
  position: number;
  input: ProcessStepInput;
  /** The step as CSV cells (names for references), to compare with the catalogue's. */
  cells: Record<string, string>;
}

export interface PrintSteps {
  /** The first row of the print's steps in the file, and the accession number as written there. */
  row: number;
  accessionNumber: string;
  steps: PlannedStep[];
}

export interface Change {
  field: string;
  label: string;
  before: string;
  after: string;
}

/** Reads and checks every row; returns each print's steps by lower-case accession number. Issues are added to `issues`. */
export function readSteps(file: ReadFile, l: Lookups, issues: CsvIssue[]): Map<string, PrintSteps> {
  const out = new Map<string, PrintSteps>();
  const positions = new Map<string, Map<number, number>>();
  for (const { row, cells } of file.rows) {
    const add = (column: string, message: string) => issues.push({ file: 'steps', row, column, value: cells[column] ?? null, message });
    const before = issues.length;
    const s = (column: string) => (cells[column] ?? '').trim();
    const accession = s('accession_number');
    if (!accession) add('accession_number', 'Enter the accession number of the print');
    const position = Number(s('step'));
    if (!/^\d+$/.test(s('step')) || position < 1 || position > MAX_STEPS) add('step', `A whole number from 1 to ${MAX_STEPS}`);
    const key = accession.toLowerCase();
    const taken = positions.get(key) ?? new Map<number, number>();
    positions.set(key, taken);
    if (taken.has(position)) add('step', `Step ${position} of ${accession} is also in row ${taken.get(position)}`);
    else taken.set(position, row);

    const candidate: Record<string, unknown> = {};
    const names: Record<string, string> = {};
    for (const f of STEP_ENTERED) {
      const cell = file.header.includes(f.column) ? s(f.column) : '';
      candidate[f.inputKey] = readStepCell(f, cell, l, add, names);
    }
    const parsed = processStepInputSchema.safeParse(candidate);
    if (!parsed.success) {
      for (const i of parsed.error.issues) {
        const column = STEP_ENTERED.find((f) => f.inputKey === String(i.path[0]))?.column ?? String(i.path[0] ?? '');
        if (!issues.slice(before).some((x) => x.column === column)) add(column, i.message);
      }
    }
    if (issues.length > before || !parsed.success) continue;
    const stepCells = Object.fromEntries(STEP_ENTERED.map((f) => [f.column, names[f.column] ?? toCell(parsed.data[f.inputKey as keyof ProcessStepInput])]));
    const entry = out.get(key) ?? { row, accessionNumber: accession, steps: [] };
    entry.steps.push({ position, input: parsed.data, cells: stepCells });
    out.set(key, entry);
  }
  for (const [key, entry] of out) {
    entry.steps.sort((a, b) => a.position - b.position);
    if (entry.steps.length > MAX_STEPS) {
      issues.push({ file: 'steps', row: entry.row, column: 'step', value: null, message: `At most ${MAX_STEPS} steps per print (${key} has ${entry.steps.length})` });
    }
  }
  return out;
}

function readStepCell(f: FieldSpec, cell: string, l: Lookups, add: (column: string, message: string) => void, names: Record<string, string>): unknown {
  const t = f.type;
  if (t.kind === 'code') {
    const code = readCode(t, cell);
    if (code === undefined) add(f.column, `Not one of: ${t.codes.join(', ')}`);
    return code ?? null;
  }
  if (t.kind === 'yes_no') {
    const value = readYesNo(cell);
    if (value === undefined) add(f.column, 'Write yes, no, or leave it empty for unknown');
    return value ?? null;
  }
  if (t.kind === 'reference') {
    if (!cell) return null;
    const found = l[t.to].get(cell);
    if (found === 'ambiguous') add(f.column, `More than one ${t.to} has this name`);
    else if (!found) add(f.column, 'No recipe with this name: add it under Recipes first');
    else {
      names[f.column] = found.name;
      return found.id;
    }
    return null;
  }
  return cell;
}

const summary = (cells: Record<string, string>) => Object.values(cells).filter(Boolean).join(', ');

/** A print's steps in the catalogue as CSV cells. */
export function stepCellsInRows(rows: DbRow[]): Record<string, string>[] {
  return rows.map((r) => Object.fromEntries(STEP_ENTERED.map((f) => [f.column, cellInRow(f, r)])));
}

/** What replacing a print's steps changes, step by step: a step added or removed, or each field of a step that differs. */
export function stepChanges(before: Record<string, string>[], after: Record<string, string>[]): Change[] {
  const changes: Change[] = [];
  for (let i = 0; i < Math.max(before.length, after.length); i++) {
    const [b, a] = [before[i], after[i]];
    const n = i + 1;
    if (!b || !a) {
      changes.push({ field: `steps.${n}`, label: `Step ${n}`, before: b ? summary(b) : '', after: a ? summary(a) : '' });
      continue;
    }
    for (const f of STEP_ENTERED) {
      if (b[f.column] !== a[f.column]) changes.push({ field: `steps.${n}.${f.column}`, label: `Step ${n}: ${stepLabelOf(f.key)}`, before: b[f.column], after: a[f.column] });
    }
  }
  return changes;
}
