import { QueryTypes, type Transaction } from 'sequelize';
import { BULK_IDS_MAX, BULK_PREVIEW_ROWS, type BulkAction, type BulkPreview, type BulkPreviewRow, type BulkWarning } from '@toneledger/common/schemas/bulk';
import { STATUS } from '@toneledger/common/schemas/vocab';
import { db } from '../db';
import { validationFailed } from '../errors';
import { stepsOf, type SelectedPrint } from './bulk-selection';
import { warningsOf } from './print-derive';

/**
 * What a bulk action would do to each selected print, and its warnings: the preview shows it and the
 * apply runs it, from the same plan, so the two cannot disagree. Nothing here writes.
 */

export interface PlannedRow {
  print: SelectedPrint;
  outcome: BulkPreviewRow['outcome'];
  before: string | null;
  after: string | null;
  note: string | null;
  newWarnings: string[];
  /** Rehouse: the print's warning codes after the change. */
  codesAfter?: string[];
}

export interface Target { id: string; label: string; version: number }

export interface Plan { target: Target; rows: PlannedRow[]; warnings: BulkWarning[] }

const DEACCESSIONED = 'Deaccessioned: its record is read-only';

/** Codes of the enclosure rules in compatibility.ts: a rehouse can clear them. */
const ENCLOSURE_CODES = ['prussian_blue_in_buffered_enclosure', 'enclosure_failed_pat', 'buffering_unknown_for_prussian_blue', 'enclosure_without_pat'] as const;
const SEVERITY: Record<string, BulkWarning['severity']> = {
  prussian_blue_in_buffered_enclosure: 'high', enclosure_failed_pat: 'high', buffering_unknown_for_prussian_blue: 'medium', enclosure_without_pat: 'low',
};
const prints = (n: number, what = 'print') => `${n.toLocaleString('en-GB')} ${what}${n === 1 ? '' : 's'}`;

/** A warning the new enclosure would bring, counted over the prints it concerns. */
function newEnclosureWarning(code: string, n: number, enclosure: string): string {
  switch (code) {
    case 'prussian_blue_in_buffered_enclosure': return `${prints(n, 'iron-blue print')} would move into an alkaline-buffered enclosure ("${enclosure}"): iron blue fades under alkaline conditions.`;
    case 'buffering_unknown_for_prussian_blue': return `${prints(n, 'iron-blue print')} would move into an enclosure whose buffering is not recorded ("${enclosure}").`;
    case 'enclosure_failed_pat': return `${prints(n)} would move into an enclosure that failed the Photographic Activity Test ("${enclosure}").`;
    default: return `${prints(n)} would move into an enclosure with no Photographic Activity Test result on record ("${enclosure}").`;
  }
}

/** A warning the selected prints carry now, which rehousing them would answer. */
function standingEnclosureWarning(code: string, n: number): string {
  const are = n === 1 ? 'is' : 'are';
  switch (code) {
    case 'prussian_blue_in_buffered_enclosure': return `${prints(n, 'iron-blue print')} of this selection ${are} in alkaline-buffered enclosures: rehouse them in unbuffered ones that passed the Photographic Activity Test.`;
    case 'buffering_unknown_for_prussian_blue': return `${prints(n, 'iron-blue print')} of this selection ${are} in enclosures whose buffering is not recorded.`;
    case 'enclosure_failed_pat': return `${prints(n)} of this selection ${are} in enclosures that failed the Photographic Activity Test.`;
    default: return `${prints(n)} of this selection ${are} in enclosures with no Photographic Activity Test result on record.`;
  }
}

function group(rows: PlannedRow[], codesOf: (r: PlannedRow) => readonly string[], message: (code: string, n: number) => string): BulkWarning[] {
  const out: BulkWarning[] = [];
  for (const code of ENCLOSURE_CODES) {
    const ids = rows.filter((r) => codesOf(r).includes(code)).map((r) => r.print.id);
    if (ids.length) out.push({ code, severity: SEVERITY[code], message: message(code, ids.length), count: ids.length, printIds: ids.slice(0, BULK_IDS_MAX), offer: 'rehouse' });
  }
  return out;
}

/** Enclosure warnings the prints being changed carry now: every action but rehouse offers to rehouse them. */
function standing(rows: PlannedRow[]): BulkWarning[] {
  return group(rows.filter((r) => r.outcome === 'change'), (r) => r.print.warning_codes, standingEnclosureWarning);
}

function row(print: SelectedPrint, outcome: PlannedRow['outcome'], before: string | null, after: string | null, note: string | null = null): PlannedRow {
  return { print, outcome, before, after, note, newWarnings: [] };
}

const editable = (p: SelectedPrint) => p.status !== 'deaccessioned';

export async function planMove(selected: SelectedPrint[], body: { toLocationId: string }, t?: Transaction): Promise<Plan> {
  const [to] = await db().query<{ id: string; path_label: string; version: number }>('SELECT id, path_label, version FROM locations WHERE id = $1', {
    bind: [body.toLocationId], type: QueryTypes.SELECT, transaction: t,
  });
  if (!to) throw validationFailed([{ path: 'toLocationId', message: 'No such location', code: 'not_found' }]);
  const rows = selected.map((p) => {
    if (!editable(p)) return row(p, 'refused', p.location_label, null, DEACCESSIONED);
    if (p.location_id === to.id) return row(p, 'unchanged', p.location_label, p.location_label, 'Already there');
    return row(p, 'change', p.location_label, to.path_label);
  });
  return { target: { id: to.id, label: to.path_label, version: to.version }, rows, warnings: standing(rows) };
}

export async function planRehouse(selected: SelectedPrint[], body: { enclosureId: string }, t?: Transaction): Promise<Plan> {
  const [enc] = await db().query<{ id: string; name: string; alkaline_buffered: boolean | null; pat_result: 'passed' | 'failed' | 'not_tested'; version: number }>(
    'SELECT id, name, alkaline_buffered, pat_result, version FROM enclosure_types WHERE id = $1',
    { bind: [body.enclosureId], type: QueryTypes.SELECT, transaction: t },
  );
  if (!enc) throw validationFailed([{ path: 'enclosureId', message: 'No such enclosure type', code: 'not_found' }]);
  const steps = await stepsOf(selected.map((p) => p.id), t);
  const facts = { name: enc.name, alkalineBuffered: enc.alkaline_buffered, patResult: enc.pat_result };
  const rows = selected.map((p) => {
    if (!editable(p)) return row(p, 'refused', p.enclosure_name, null, DEACCESSIONED);
    if (p.enclosure_id === enc.id) return row(p, 'unchanged', p.enclosure_name, p.enclosure_name, 'Already in this enclosure');
    // The same rules as a print's own warnings (print-derive.ts → compatibility.ts); the light warning stays as it is.
    const codesAfter = [...warningsOf(p.process, steps.get(p.id) ?? [], facts).map((w) => w.code), ...(p.over_light_budget ? ['over_light_budget'] : [])];
    const r = row(p, 'change', p.enclosure_name, enc.name);
    r.codesAfter = codesAfter;
    r.newWarnings = codesAfter.filter((c) => !p.warning_codes.includes(c));
    return r;
  });
  const warnings = group(rows.filter((r) => r.outcome === 'change'), (r) => r.newWarnings, (code, n) => newEnclosureWarning(code, n, enc.name));
  return { target: { id: enc.id, label: enc.name, version: enc.version }, rows, warnings };
}

const SET_BY_LOAN = 'On a loan out that has left: the loan sets its status';

export async function planStatus(selected: SelectedPrint[], body: { status: string }, t?: Transaction): Promise<Plan> {
  const label = STATUS.labels[body.status as keyof typeof STATUS.labels];
  const onLoan = selected.filter((p) => p.status === 'on_loan').map((p) => p.id);
  const away = new Set(onLoan.length ? (await db().query<{ id: string }>(
    `SELECT DISTINCT o.print_id AS id FROM loan_objects o JOIN loans l ON l.id = o.loan_id
      WHERE o.print_id = ANY($1::uuid[]) AND l.direction = 'out' AND l.status IN ('in_transit', 'on_loan')`,
    { bind: [onLoan], type: QueryTypes.SELECT, transaction: t },
  )).map((r) => r.id) : []);
  const now = (p: SelectedPrint) => STATUS.labels[p.status as keyof typeof STATUS.labels] ?? p.status;
  const rows = selected.map((p) => {
    if (!editable(p)) return row(p, 'refused', now(p), null, DEACCESSIONED);
    if (away.has(p.id)) return row(p, 'refused', now(p), null, SET_BY_LOAN);
    if (p.status === body.status) return row(p, 'unchanged', now(p), now(p), 'Already so');
    return row(p, 'change', now(p), label);
  });
  return { target: { id: body.status, label, version: 0 }, rows, warnings: standing(rows) };
}

export async function planRound(selected: SelectedPrint[], body: { roundId: string }, t?: Transaction): Promise<Plan> {
  const [round] = await db().query<{ id: string; title: string; planned_on: string; status: string; version: number }>(
    'SELECT id, title, planned_on::text, status, version FROM inspection_rounds WHERE id = $1',
    { bind: [body.roundId], type: QueryTypes.SELECT, transaction: t },
  );
  if (!round) throw validationFailed([{ path: 'roundId', message: 'No such inspection round', code: 'not_found' }]);
  if (round.status !== 'planned') throw validationFailed([{ path: 'roundId', message: 'This round is no longer planned; choose a planned one', code: 'closed' }]);
  const inRound = new Set((await db().query<{ id: string }>('SELECT print_id AS id FROM inspection_round_items WHERE round_id = $1 AND print_id = ANY($2::uuid[])', {
    bind: [round.id, selected.map((p) => p.id)], type: QueryTypes.SELECT, transaction: t,
  })).map((r) => r.id));
  const label = `${round.title} (${round.planned_on})`;
  const rows = selected.map((p) => {
    if (!editable(p)) return row(p, 'refused', null, null, DEACCESSIONED);
    if (inRound.has(p.id)) return row(p, 'unchanged', label, label, 'Already in this round');
    return row(p, 'change', null, label);
  });
  return { target: { id: round.id, label, version: round.version }, rows, warnings: standing(rows) };
}

export async function planExhibition(selected: SelectedPrint[], body: { exhibitionId: string }, t?: Transaction): Promise<Plan> {
  const [ex] = await db().query<{ id: string; title: string; version: number }>('SELECT id, title, version FROM exhibitions WHERE id = $1', {
    bind: [body.exhibitionId], type: QueryTypes.SELECT, transaction: t,
  });
  if (!ex) throw validationFailed([{ path: 'exhibitionId', message: 'No such exhibition', code: 'not_found' }]);
  const listed = new Set((await db().query<{ id: string }>('SELECT print_id AS id FROM exhibition_objects WHERE exhibition_id = $1 AND print_id = ANY($2::uuid[])', {
    bind: [ex.id, selected.map((p) => p.id)], type: QueryTypes.SELECT, transaction: t,
  })).map((r) => r.id));
  const rows = selected.map((p) => {
    if (!editable(p)) return row(p, 'refused', null, null, DEACCESSIONED);
    if (listed.has(p.id)) return row(p, 'unchanged', ex.title, ex.title, 'Already on the object list');
    return row(p, 'change', null, ex.title);
  });
  return { target: { id: ex.id, label: ex.title, version: ex.version }, rows, warnings: standing(rows) };
}

export function presentPreview(action: BulkAction, plan: Plan, total: number, tooMany: boolean, limit: number, fingerprint: string): BulkPreview {
  const count = (o: PlannedRow['outcome']) => plan.rows.filter((r) => r.outcome === o).length;
  return {
    action, total, tooMany, limit, fingerprint,
    changing: count('change'), unchanged: count('unchanged'), refused: count('refused'),
    rows: plan.rows.slice(0, BULK_PREVIEW_ROWS).map((r) => ({
      printId: r.print.id, accessionNumber: r.print.accession_number, title: r.print.title,
      outcome: r.outcome, before: r.before, after: r.after, note: r.note, newWarnings: r.newWarnings,
    })),
    warnings: plan.warnings,
  };
}

