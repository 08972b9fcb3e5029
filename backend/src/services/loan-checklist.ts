import { can, type Role } from '@toneledger/common/domain/roles';
import { LOAN_DIRECTION_LABELS, LOAN_STATUS_LABELS } from '@toneledger/common/schemas/loans';
import { toCsv, type CsvCell } from './csv-cells';
import { loanDetail } from './loan.service';

/**
 * The loan checklist as CSV: one row per print, in the loan's order, with the signed reports made for
 * the loan. The value and currency columns (header and cells) only for a role with `valuation.read`.
 */
export async function loanChecklistCsv(id: string, role: Role | null): Promise<{ reference: string; csv: string }> {
  const loan = await loanDetail(id, role);
  const values = can(role, 'valuation.read');
  const out = loan.direction === 'out';
  const header: string[] = [
    'loan_reference', 'direction', 'other_institution', 'status', 'position', 'accession_number', 'title', 'borrowed',
    ...(values ? ['insurance_value', 'currency'] : []),
    out ? 'outgoing_report_on' : 'incoming_report_on', out ? 'outgoing_report_grade' : 'incoming_report_grade',
    out ? 'returning_report_on' : 'sent_back_report_on', out ? 'returning_report_grade' : 'sent_back_report_grade', 'warnings',
  ];
  const rows: CsvCell[][] = loan.objects.map((o, i) => [
    loan.reference, LOAN_DIRECTION_LABELS[loan.direction], loan.otherInstitution, LOAN_STATUS_LABELS[loan.status], i + 1, o.accessionNumber, o.printTitle,
    o.borrowed ? 'yes' : 'no',
    ...(values ? [o.insuranceValue ?? null, o.currency ?? null] : []),
    o.outgoingReport?.examinedOn ?? null, o.outgoingReport?.grade ?? null, o.returningReport?.examinedOn ?? null, o.returningReport?.grade ?? null,
    o.warnings.map((w) => w.message).join('; '),
  ]);
  return { reference: loan.reference, csv: toCsv([header, ...rows]) };
}
