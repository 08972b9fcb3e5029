import { useState } from 'react';
import { can, type Role } from '@toneledger/common/domain/roles';
import { LOAN_NEXT, LOAN_STATUS_LABELS, loanStatusInputSchema, type LoanDetail, type LoanStatus } from '@toneledger/common/schemas/loans';
import { DateInput, TextAreaInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { Button } from '@/components/ui/button';
import { TableHead } from '@/components/ui/table-head';
import { formatDateTime, formatDay, todayIso } from '@/lib/format';
import { isApiError } from '@/lib/api-client';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useChangeLoanStatus } from '@/features/loans/api/save-loan';
import { STATUS_ACTIONS } from '@/features/loans/utils/loan-form';

/** Every change of status, dated, with who made it and their note. */
export function StatusHistory({ loan }: { loan: LoanDetail }) {
  return (
    <section aria-labelledby="loan-history" className="flex flex-col gap-2">
      <h2 id="loan-history" className="text-lg">
        Status history
      </h2>
      {loan.statusHistory.length === 0 ? (
        <p className="text-sm text-ink-700">No change recorded.</p>
      ) : (
        <table className="w-full border-collapse rounded border border-paper-300 bg-white text-left text-sm">
          <caption className="sr-only">Status history of loan {loan.reference}</caption>
          <TableHead columns={['On', 'From', 'To', 'By', 'Note']} />
          <tbody>
            {loan.statusHistory.map((h) => (
              <tr key={`${h.at}-${h.to}`} className="border-t border-paper-200 align-top">
                <td className="px-2 py-1.5 whitespace-nowrap">
                  <time dateTime={h.on}>{formatDay(h.on)}</time>
                  <span className="block text-xs text-ink-600">recorded {formatDateTime(h.at)}</span>
                </td>
                <td className="px-2 py-1.5">{h.from ? LOAN_STATUS_LABELS[h.from] : '—'}</td>
                <td className="px-2 py-1.5 font-medium">{LOAN_STATUS_LABELS[h.to]}</td>
                <td className="px-2 py-1.5">{h.by?.name ?? '—'}</td>
                <td className="px-2 py-1.5 whitespace-pre-line">{h.note ?? ''}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}

/** What still stands in the way of the loan's next steps, in the server's plain words. */
export function Blockers({ loan }: { loan: LoanDetail }) {
  if (loan.blockers.length === 0) return null;
  const names = new Map(loan.objects.map((o) => [o.printId, o.accessionNumber]));
  return (
    <section aria-label="Before the next step" className="rounded border border-sepia-200 bg-sepia-50 px-3 py-2 text-sm text-sepia-800">
      <p className="font-semibold">Before the next step</p>
      <ul className="list-disc pl-5">
        {loan.blockers.map((b, index) => (
          <li key={index}>
            To {LOAN_STATUS_LABELS[b.to].toLowerCase()}: {b.message}
            {b.printIds.length > 0 ? <span className="mono"> ({b.printIds.map((id) => names.get(id) ?? id).join(', ')})</span> : null}
          </li>
        ))}
      </ul>
    </section>
  );
}

interface StatusValues {
  to: string;
  on: string;
  note: string;
  version: number;
}

/** The prints a refused status change names (the 409's `printIds`), by accession number. */
export function refusedPrints(failure: unknown, loan: LoanDetail): string[] {
  if (!isApiError(failure) || failure.status !== 409) return [];
  const ids = (failure.details as { printIds?: unknown } | null | undefined)?.printIds;
  if (!Array.isArray(ids)) return [];
  const names = new Map(loan.objects.map((o) => [o.printId, o.accessionNumber]));
  return ids.map((id) => names.get(String(id)) ?? String(id));
}

function StatusForm({ loan, to, onDone }: { loan: LoanDetail; to: LoanStatus; onDone: () => void }) {
  const change = useChangeLoanStatus(loan.id);
  const form = useSchemaForm({
    schema: loanStatusInputSchema,
    defaultValues: { to, on: todayIso(), note: '', version: loan.version } satisfies StatusValues,
    // The form moves the loan as the page shows it: the version it was opened on.
    toBody: (v: StatusValues) => ({ ...v, version: loan.version }),
  });
  const refused = refusedPrints(form.failure, loan);
  return (
    <SchemaForm
      form={form}
      aria-label={`${STATUS_ACTIONS[to]}: ${LOAN_STATUS_LABELS[loan.status]} to ${LOAN_STATUS_LABELS[to]}`}
      failureTitle={`The loan was not moved to ${LOAN_STATUS_LABELS[to].toLowerCase()}.`}
      className="gap-3 rounded border border-paper-300 bg-paper-50 p-3"
      onValid={(body) => change.mutate(body, { onSuccess: onDone, onError: form.serverError })}
    >
      {refused.length > 0 ? (
        <p className="text-sm text-danger-700">
          Refused for <span className="mono">{refused.join(', ')}</span>.
        </p>
      ) : null}
      <p className="text-sm">
        From <strong>{LOAN_STATUS_LABELS[loan.status]}</strong> to <strong>{LOAN_STATUS_LABELS[to]}</strong>
      </p>
      <div className="grid gap-3 sm:grid-cols-[12rem_1fr]">
        <DateInput name="on" label="On" hint="The day it happened." />
        <TextAreaInput name="note" label="Note" rows={2} />
      </div>
      <SubmitCancel label={STATUS_ACTIONS[to]} busy={change.isPending} busyLabel="Saving…" onCancel={onDone} variant={to === 'declined' || to === 'cancelled' ? 'danger' : 'primary'} />
    </SchemaForm>
  );
}

/** The buttons to the loan's next states (for those who manage loans); each opens a dated form with a note. */
export function StatusActions({ loan, role }: { loan: LoanDetail; role: Role }) {
  const [to, setTo] = useState<LoanStatus | null>(null);
  const next = LOAN_NEXT[loan.status];
  if (!can(role, 'loans.write') || next.length === 0) return null;
  return (
    <section aria-label="Move the loan" className="flex flex-col gap-2 print:hidden">
      <div className="flex flex-wrap gap-2">
        {next.map((status) => (
          <Button
            key={status}
            size="sm"
            variant={status === 'declined' || status === 'cancelled' ? 'danger' : 'primary'}
            aria-pressed={to === status}
            onClick={() => setTo(status)}
          >
            {STATUS_ACTIONS[status]}
          </Button>
        ))}
      </div>
      {to ? <StatusForm key={to} loan={loan} to={to} onDone={() => setTo(null)} /> : null}
    </section>
  );
}
