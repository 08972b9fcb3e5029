import type { Writable } from 'node:stream';
import type { Role } from '@toneledger/common/domain/roles';
import type { ConditionReport, Observation } from '@toneledger/common/schemas/condition';
import { CONDITION_CONTEXT_LABELS, GRADE_LABELS } from '@toneledger/common/schemas/condition';
import type { Movement } from '@toneledger/common/schemas/catalogue';
import { LOAN_DIRECTION_LABELS, LOAN_PURPOSE_LABELS, LOAN_STATUS_LABELS, type Loan } from '@toneledger/common/schemas/loans';
import type { LoansExportQuery } from '@toneledger/common/schemas/exports';
import { printLinkedData } from '@toneledger/common/fields/linked-data';
import { listReports } from '../condition.service';
import { listMovements, loadPrint } from '../print.service';
import { listLoans, loanDetail } from '../loan.service';
import { isoCell, streamCsv, streamJsonArray, type ExportColumn } from './columns';

/**
 * Exports of the condition reports of a print, its movements, and the loans list. Codes are written
 * in the CSV as the words people read ("Outgoing loan", "In transit"); the JSON keeps the codes.
 */

/** A code as words when it has no label table: `outgoing_loan` → "Outgoing loan". */
export const words = (code: string | null | undefined) => (code ? (code.charAt(0).toUpperCase() + code.slice(1)).replace(/_/g, ' ') : null);

// ── Condition reports: one row per observation ──

export interface ObservationRow { report: ConditionReport; observation: Observation | null }

const R = 'Condition report';
const O = 'Observation';
export const CONDITION_REPORT_COLUMNS: ExportColumn<ObservationRow>[] = [
  { name: 'accession_number', meaning: "The print's accession number.", type: 'text', source: 'Print: accession number', cell: (r) => r.report.accessionNumber },
  { name: 'report_id', meaning: "The report's id.", type: 'id', source: `${R}: id`, cell: (r) => r.report.id },
  { name: 'examined_on', meaning: 'The day the print was examined (ISO 8601).', type: 'date', source: `${R}: examined on`, cell: (r) => isoCell(r.report.examinedOn) },
  { name: 'examiner', meaning: 'Who examined the print.', type: 'text', source: `${R}: examiner`, cell: (r) => r.report.examinerName },
  { name: 'context', meaning: 'Why the print was examined (routine, incoming, outgoing loan…).', type: 'text', source: `${R}: context`, cell: (r) => CONDITION_CONTEXT_LABELS[r.report.context] },
  { name: 'grade', meaning: 'Overall condition: good, fair, poor or unacceptable, as defined in the condition settings.', type: 'text', source: `${R}: grade`, cell: (r) => (r.report.grade ? GRADE_LABELS[r.report.grade] : null) },
  { name: 'status', meaning: 'Draft, or signed (then locked; corrections by addenda).', type: 'text', source: `${R}: status`, cell: (r) => words(r.report.status) },
  { name: 'signed_at', meaning: 'When the report was signed (ISO 8601, UTC).', type: 'date-time', source: `${R}: signed at`, cell: (r) => isoCell(r.report.signedAt) },
  { name: 'summary', meaning: "The examiner's summary.", type: 'text', source: `${R}: summary`, cell: (r) => r.report.summary },
  { name: 'recommendations', meaning: 'What the examiner recommends.', type: 'text', source: `${R}: recommendations`, cell: (r) => r.report.recommendations },
  { name: 'next_check_on', meaning: 'When the print should be examined again (ISO 8601).', type: 'date', source: `${R}: next check`, cell: (r) => isoCell(r.report.nextCheckOn) },
  { name: 'loan_reference', meaning: 'The loan the report was made for, if any.', type: 'text', source: 'Loan: reference', cell: (r) => r.report.loan?.reference ?? null },
  { name: 'addenda', meaning: 'How many addenda were added after signing.', type: 'integer', source: `${R}: addenda`, cell: (r) => r.report.addenda.length },
  { name: 'observation', meaning: "The observation's place in the report (1, 2, 3…); empty for a report without observations.", type: 'integer', source: `${O}: position`, cell: (r) => r.observation?.position ?? null },
  { name: 'term', meaning: 'The deterioration term observed.', type: 'text', source: `${O}: term (condition vocabulary)`, cell: (r) => r.observation?.termLabel ?? null },
  { name: 'side', meaning: 'Recto or verso.', type: 'text', source: `${O}: side`, cell: (r) => words(r.observation?.side) },
  { name: 'area', meaning: 'Where on that side: image, margin, edge, corner, overall.', type: 'text', source: `${O}: area`, cell: (r) => words(r.observation?.area) },
  { name: 'extent', meaning: 'Localised, scattered, overall, or a percentage of the area.', type: 'text', source: `${O}: extent`, cell: (r) => words(r.observation?.extent) },
  { name: 'extent_percent', meaning: 'The share of the area affected, when the extent is a percentage.', type: 'number', unit: '%', source: `${O}: extent percent`, cell: (r) => r.observation?.extentPercent ?? null },
  { name: 'severity', meaning: 'Slight, moderate or severe.', type: 'text', source: `${O}: severity`, cell: (r) => words(r.observation?.severity) },
  { name: 'observation_notes', meaning: "The examiner's notes on this observation.", type: 'text', source: `${O}: notes`, cell: (r) => r.observation?.notes ?? null },
  { name: 'has_region', meaning: 'Yes when the observation is marked as a region on an image (the region is in the JSON export).', type: 'yes/no', source: `${O}: region`, cell: (r) => (r.observation ? (r.observation.region ? 'yes' : 'no') : null) },
];

export async function writeConditionReportsCsv(printId: string, out: Writable): Promise<number> {
  const reports = await listReports(printId);
  const rows = reports.flatMap((report): ObservationRow[] => (report.observations.length ? report.observations.map((observation) => ({ report, observation })) : [{ report, observation: null }]));
  return streamCsv(out, CONDITION_REPORT_COLUMNS, [rows]);
}

export async function conditionReportsJson(printId: string) {
  const print = await loadPrint(printId);
  const reports = await listReports(printId);
  return {
    exportedAt: new Date().toISOString(),
    print: { id: print.id, accessionNumber: print.accessionNumber, title: print.title, process: print.process, linkedData: printLinkedData(print.process) },
    reports,
  };
}

// ── Movements ──

export interface MovementRow { accessionNumber: string; movement: Movement }

export const MOVEMENT_COLUMNS: ExportColumn<MovementRow>[] = [
  { name: 'accession_number', meaning: "The print's accession number.", type: 'text', source: 'Print: accession number', cell: (r) => r.accessionNumber },
  { name: 'movement_id', meaning: "The movement's id.", type: 'id', source: 'Movement: id', cell: (r) => r.movement.id },
  { name: 'moved_at', meaning: 'When the print was moved (ISO 8601, UTC).', type: 'date-time', source: 'Movement: moved at', cell: (r) => isoCell(r.movement.movedAt) },
  { name: 'from_location', meaning: 'Where the print was, as the full location path; empty for its first placing.', type: 'text', source: 'Movement: from (Locations)', cell: (r) => r.movement.from?.pathLabel ?? null },
  { name: 'to_location', meaning: 'Where the print went, as the full location path.', type: 'text', source: 'Movement: to (Locations)', cell: (r) => r.movement.to.pathLabel },
  { name: 'moved_by', meaning: 'Who moved it.', type: 'text', source: 'Movement: moved by', cell: (r) => r.movement.movedBy },
  { name: 'reason', meaning: 'Why it was moved.', type: 'text', source: 'Movement: reason', cell: (r) => r.movement.reason },
];

export async function writeMovementsCsv(printId: string, out: Writable): Promise<number> {
  const movements = await listMovements(printId);
  const print = await loadPrint(printId);
  return streamCsv(out, MOVEMENT_COLUMNS, [movements.map((movement) => ({ accessionNumber: print.accessionNumber, movement }))]);
}

export async function movementsJson(printId: string) {
  const movements = await listMovements(printId);
  const print = await loadPrint(printId);
  return {
    exportedAt: new Date().toISOString(),
    print: { id: print.id, accessionNumber: print.accessionNumber, title: print.title, process: print.process, linkedData: printLinkedData(print.process) },
    movements,
  };
}

// ── Loans: the list's own query, a page at a time ──

const L = 'Loan';
export const LOAN_COLUMNS: ExportColumn<Loan>[] = [
  { name: 'reference', meaning: "The loan's reference.", type: 'text', source: `${L}: reference`, cell: (l) => l.reference },
  { name: 'loan_id', meaning: "The loan's id.", type: 'id', source: `${L}: id`, cell: (l) => l.id },
  { name: 'direction', meaning: 'Loan out (from the collection) or loan in (to it).', type: 'text', source: `${L}: direction`, cell: (l) => LOAN_DIRECTION_LABELS[l.direction] },
  { name: 'status', meaning: 'Where the loan stands: proposed, approved, agreed, in transit, on loan, returned; or declined, cancelled.', type: 'text', source: `${L}: status`, cell: (l) => LOAN_STATUS_LABELS[l.status] },
  { name: 'other_institution', meaning: 'The borrower of a loan out, the lender of a loan in.', type: 'text', source: `${L}: other institution`, cell: (l) => l.otherInstitution },
  { name: 'contact_name', meaning: 'The contact there.', type: 'text', source: `${L}: contact name`, cell: (l) => l.contactName },
  { name: 'purpose', meaning: 'Exhibition, research, conservation or photography.', type: 'text', source: `${L}: purpose`, cell: (l) => LOAN_PURPOSE_LABELS[l.purpose] },
  { name: 'exhibition', meaning: 'The exhibition the loan is for, if any.', type: 'text', source: 'Exhibition: title', cell: (l) => l.exhibition?.title ?? null },
  { name: 'venue', meaning: 'Where the prints will be.', type: 'text', source: `${L}: venue`, cell: (l) => l.venue },
  { name: 'dispatch_on', meaning: 'Day of dispatch (ISO 8601).', type: 'date', source: `${L}: dispatch`, cell: (l) => isoCell(l.dispatchOn) },
  { name: 'opens_on', meaning: 'Day the loan period (or exhibition) opens.', type: 'date', source: `${L}: opens`, cell: (l) => isoCell(l.opensOn) },
  { name: 'closes_on', meaning: 'Day it closes.', type: 'date', source: `${L}: closes`, cell: (l) => isoCell(l.closesOn) },
  { name: 'return_on', meaning: 'Day of return.', type: 'date', source: `${L}: return`, cell: (l) => isoCell(l.returnOn) },
  { name: 'courier', meaning: 'Who accompanies the prints.', type: 'text', source: `${L}: courier`, cell: (l) => l.courier },
  { name: 'max_lux', meaning: 'Agreed maximum illuminance.', type: 'number', unit: 'lx', source: `${L}: conditions`, cell: (l) => l.conditions.maxLux },
  { name: 'max_annual_lux_hours', meaning: 'Agreed maximum light exposure per year.', type: 'number', unit: 'lx·h', source: `${L}: conditions`, cell: (l) => l.conditions.maxAnnualLuxHours },
  { name: 'temperature_min_c', meaning: 'Agreed lowest temperature.', type: 'number', unit: '°C', source: `${L}: conditions`, cell: (l) => l.conditions.temperatureMinC },
  { name: 'temperature_max_c', meaning: 'Agreed highest temperature.', type: 'number', unit: '°C', source: `${L}: conditions`, cell: (l) => l.conditions.temperatureMaxC },
  { name: 'rh_min_percent', meaning: 'Agreed lowest relative humidity.', type: 'number', unit: '%', source: `${L}: conditions`, cell: (l) => l.conditions.rhMinPercent },
  { name: 'rh_max_percent', meaning: 'Agreed highest relative humidity.', type: 'number', unit: '%', source: `${L}: conditions`, cell: (l) => l.conditions.rhMaxPercent },
  { name: 'credit_line', meaning: 'The credit line to show with the prints.', type: 'text', source: `${L}: credit line`, cell: (l) => l.creditLine },
  { name: 'prints', meaning: 'How many prints are on the loan.', type: 'integer', source: `${L}: objects`, cell: (l) => l.objectCount },
  { name: 'notes', meaning: 'Notes on the loan.', type: 'text', source: `${L}: notes`, cell: (l) => l.notes },
  { name: 'updated_at', meaning: 'When the loan was last changed (ISO 8601, UTC).', type: 'date-time', source: `${L}: last changed`, cell: (l) => isoCell(l.updatedAt) },
];

const LOAN_PAGE = 200;

/** The loans the list shows for this query, page after page, in the list's order. */
async function* loanPages(query: LoansExportQuery): AsyncGenerator<Loan[]> {
  for (let page = 1; ; page++) {
    const { data } = await listLoans({ ...query, page, pageSize: LOAN_PAGE });
    if (!data.length) return;
    yield data;
    if (data.length < LOAN_PAGE) return;
  }
}

export function writeLoansCsv(query: LoansExportQuery, out: Writable): Promise<number> {
  return streamCsv(out, LOAN_COLUMNS, loanPages(query));
}

/** Each loan with its prints (values only for a role that may read them) and its status history. */
export function writeLoansJson(query: LoansExportQuery, role: Role | null, out: Writable): Promise<number> {
  async function* details() {
    for await (const page of loanPages(query)) {
      const out = [];
      for (const l of page) out.push(await loanDetail(l.id, role));
      yield out;
    }
  }
  return streamJsonArray(out, { exportedAt: new Date().toISOString(), query }, 'loans', details());
}
