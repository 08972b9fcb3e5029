import { Link } from 'react-router-dom';
import { can, type Role } from '@toneledger/common/domain/roles';
import { GRADE_LABELS, type Grade } from '@toneledger/common/schemas/condition';
import { LOAN_STATUS_LABELS, type LoanDetail } from '@toneledger/common/schemas/loans';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { TableHead, type TableColumn } from '@/components/ui/table-head';
import { formatDay } from '@/lib/format';
import { useRemoveLoanObject } from '@/features/loans/api/save-loan';
import { reportContextFor } from '@/features/loans/utils/loan-form';

type LoanObject = LoanDetail['objects'][number];
type Report = LoanObject['outgoingReport'];

const money = (value: number, currency: string | null | undefined) => {
  if (!currency) return new Intl.NumberFormat('en-GB').format(value);
  try {
    return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(value);
  } catch {
    return `${new Intl.NumberFormat('en-GB').format(value)} ${currency}`;
  }
};

/** Whether prints may still be taken off: nothing has left yet. */
export function objectsEditable(loan: LoanDetail): boolean {
  return loan.status === 'proposed' || loan.status === 'approved' || loan.status === 'agreed';
}

/**
 * Whether a report at this end of the loan can be written now: the first (outgoing, or arrival for a
 * loan in) until the loan ends early; the one for the way back only while the prints are at the other end.
 */
export function reportDue(loan: Pick<LoanDetail, 'status'>, end: 'outgoing' | 'returning'): boolean {
  if (end === 'returning') return loan.status === 'on_loan';
  return !['declined', 'cancelled'].includes(loan.status);
}

function ReportCell({ loan, object, end, report, role }: { loan: LoanDetail; object: LoanObject; end: 'outgoing' | 'returning'; report: Report; role: Role }) {
  if (report) {
    return (
      <Link to={`/condition/reports/${report.id}`} className="whitespace-nowrap">
        Signed {formatDay(report.examinedOn)}
        {report.grade ? ` · ${GRADE_LABELS[report.grade as Grade] ?? report.grade}` : ''}
      </Link>
    );
  }
  if (can(role, 'condition.write') && reportDue(loan, end)) {
    const context = reportContextFor(loan.direction, end);
    const to = `/condition/prints/${object.printId}/reports/new?context=${context}&loanId=${loan.id}`;
    return (
      <Link to={to} className="whitespace-nowrap print:hidden">
        Write the {end} report
      </Link>
    );
  }
  return <span className="text-ink-600">None signed</span>;
}

/** The prints on a loan: their condition reports at each end, warnings, and values for those who may read them. */
export function LoanObjects({ loan, role }: { loan: LoanDetail; role: Role }) {
  const showValues = can(role, 'valuation.read');
  const mayRemove = can(role, 'loans.write') && objectsEditable(loan);
  const remove = useRemoveLoanObject(loan.id);
  const columns: TableColumn[] = [
    'Accession no.',
    'Title',
    ...(showValues ? [{ label: 'Value', align: 'right' } as const] : []),
    loan.direction === 'out' ? 'Outgoing report' : 'Arrival report',
    loan.direction === 'out' ? 'Returning report' : 'Report on return',
    'Warnings',
    ...(mayRemove ? [''] : []),
  ];
  return (
    <section aria-labelledby="loan-objects" className="flex flex-col gap-2">
      <h2 id="loan-objects" className="text-lg">
        Objects ({loan.objects.length})
      </h2>
      {remove.isError ? <ErrorNotice error={remove.error} title="The print was not taken off the loan." /> : null}
      {loan.objects.length === 0 ? (
        <p className="text-sm text-ink-700">No prints on this loan yet.</p>
      ) : (
        <div className="overflow-x-auto rounded border border-paper-300 bg-white">
          <table className="w-full border-collapse text-left text-sm">
            <caption className="sr-only">Prints on loan {loan.reference}</caption>
            <TableHead columns={columns} />
            <tbody>
              {loan.objects.map((o) => (
                <tr key={o.printId} className="border-t border-paper-200 align-top break-inside-avoid">
                  <td className="px-2 py-1.5 whitespace-nowrap">
                    <Link to={`/catalogue/prints/${o.printId}`} className="mono">
                      {o.accessionNumber}
                    </Link>
                    {o.borrowed ? <span className="ml-1 text-xs text-ink-700">(borrowed)</span> : null}
                  </td>
                  <td className="px-2 py-1.5">{o.printTitle}</td>
                  {showValues ? (
                    <td className="num px-2 py-1.5 text-right whitespace-nowrap">{o.insuranceValue != null ? money(o.insuranceValue, o.currency) : '—'}</td>
                  ) : null}
                  <td className="px-2 py-1.5">
                    <ReportCell loan={loan} object={o} end="outgoing" report={o.outgoingReport} role={role} />
                  </td>
                  <td className="px-2 py-1.5">
                    <ReportCell loan={loan} object={o} end="returning" report={o.returningReport} role={role} />
                  </td>
                  <td className="px-2 py-1.5">
                    {o.warnings.length === 0 ? (
                      <span className="text-ink-600">None</span>
                    ) : (
                      <ul className="text-xs text-sepia-800">
                        {o.warnings.map((w) => (
                          <li key={w.code}>{w.message}</li>
                        ))}
                      </ul>
                    )}
                  </td>
                  {mayRemove ? (
                    <td className="px-2 py-1.5 print:hidden">
                      <Button
                        size="sm"
                        variant="quiet"
                        disabled={remove.isPending}
                        onClick={() => remove.mutate({ printId: o.printId, version: loan.version })}
                        aria-label={`Take ${o.accessionNumber} off the loan`}
                      >
                        Take off
                      </Button>
                    </td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {!objectsEditable(loan) && can(role, 'loans.write') ? (
        <p className="text-xs text-ink-700 print:hidden">The object list is fixed while the loan is {LOAN_STATUS_LABELS[loan.status].toLowerCase()}.</p>
      ) : null}
    </section>
  );
}
