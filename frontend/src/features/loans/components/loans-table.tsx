import { createColumnHelper } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import { LOAN_DIRECTION_LABELS, LOAN_PURPOSE_LABELS, LOAN_STATUS_LABELS, type Loan } from '@toneledger/common/schemas/loans';
import { DataTable } from '@/components/ui/data-table';
import { formatDay } from '@/lib/format';
import { useServerTable } from '@/lib/server-table';
import type { LoanListQuery } from '@/features/loans/api/keys';

const column = createColumnHelper<Loan>();

const columns = [
  column.accessor('reference', {
    header: 'Reference',
    enableSorting: false,
    cell: (info) => (
      <Link to={`/loans/${info.row.original.id}`} className="mono whitespace-nowrap">
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor('direction', { header: 'Direction', enableSorting: false, cell: (info) => LOAN_DIRECTION_LABELS[info.getValue()] }),
  column.accessor('otherInstitution', {
    header: 'Other institution',
    enableSorting: false,
    cell: (info) => <span className="font-medium text-ink-900">{info.getValue()}</span>,
  }),
  column.accessor('purpose', {
    header: 'Purpose',
    enableSorting: false,
    cell: (info) => {
      const loan = info.row.original;
      return loan.exhibition ? `${LOAN_PURPOSE_LABELS[info.getValue()]}: ${loan.exhibition.title}` : LOAN_PURPOSE_LABELS[info.getValue()];
    },
  }),
  column.accessor('status', {
    header: 'Status',
    enableSorting: false,
    cell: (info) => <span className="whitespace-nowrap">{LOAN_STATUS_LABELS[info.getValue()]}</span>,
  }),
  column.accessor('dispatchOn', { header: 'Dispatch', enableSorting: false, cell: (info) => <span className="whitespace-nowrap">{formatDay(info.getValue())}</span> }),
  column.accessor('returnOn', { header: 'Return', enableSorting: false, cell: (info) => <span className="whitespace-nowrap">{formatDay(info.getValue())}</span> }),
  column.accessor('objectCount', {
    header: () => <span className="block text-right">Objects</span>,
    enableSorting: false,
    cell: (info) => <span className="num block text-right">{info.getValue()}</span>,
  }),
];

export interface LoansTableProps {
  loans: Loan[];
  query: LoanListQuery;
  total: number;
  busy: boolean;
}

/** Loans, latest first, paged by the server: the table only mirrors the query in the URL. */
export function LoansTable({ loans, query, total, busy }: LoansTableProps) {
  const table = useServerTable({ data: loans, columns, getRowId: (loan) => loan.id, query, total, sorting: [], onSortingChange: () => {} });
  return <DataTable table={table} caption="Loans out and in, latest first" empty="No loan matches these filters." busy={busy} />;
}
