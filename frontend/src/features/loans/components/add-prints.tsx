import { useFieldArray } from 'react-hook-form';
import { CURRENCIES } from '@toneledger/common/domain/currencies';
import { can, type Role } from '@toneledger/common/domain/roles';
import { loanObjectsInputSchema, type LoanDetail } from '@toneledger/common/schemas/loans';
import { NumberInput, SelectInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { Button } from '@/components/ui/button';
import { PrintFinder } from '@/components/ui/print-finder';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useSetLoanObjects } from '@/features/loans/api/save-loan';
import { typedNumber } from '@/lib/forms/typed-number';

const CURRENCY_OPTIONS = CURRENCIES.map((c) => ({ value: c.code, label: `${c.code} · ${c.name}` }));

interface Chosen {
  printId: string;
  accessionNumber: string;
  title: string;
  insuranceValue: string;
  currency: string;
}

interface AddValues {
  objects: Chosen[];
}

/** The chosen prints as the request body: values as numbers, and no value keys at all for a role that may not see values. */
function toBody(values: AddValues, withValues: boolean, version: number) {
  return {
    version,
    objects: values.objects.map((o) =>
      withValues ? { printId: o.printId, insuranceValue: typedNumber(o.insuranceValue), currency: o.currency } : { printId: o.printId },
    ),
  };
}

/**
 * Adds prints to a loan: find them by accession number or words in the catalogue, then give each its
 * insurance or indemnity value (registrars and administrators only) and add them together.
 */
export function AddPrints({ loan, role, onDone }: { loan: LoanDetail; role: Role; onDone: () => void }) {
  const withValues = can(role, 'valuation.read');
  const save = useSetLoanObjects(loan.id);
  const form = useSchemaForm({
    schema: loanObjectsInputSchema,
    defaultValues: { objects: [] } as AddValues,
    toBody: (v: AddValues) => toBody(v, withValues, loan.version),
  });
  const rows = useFieldArray({ control: form.control, name: 'objects' });
  const onLoan = new Set(loan.objects.map((o) => o.printId));
  const chosen = new Set(rows.fields.map((r) => r.printId));

  const labelFor = (path: string, label: string | null) => {
    const match = /^objects\.(\d+)\.(\w+)/.exec(path);
    if (!match) return label;
    const row = form.getValues(`objects.${Number(match[1])}`);
    return `${row?.accessionNumber ?? `Print ${Number(match[1]) + 1}`} · ${match[2] === 'currency' ? 'Currency' : 'Value'}`;
  };

  return (
    <section aria-label="Add prints to the loan" className="flex flex-col gap-3 rounded border border-paper-300 bg-paper-50 p-3 print:hidden">
      <PrintFinder
        taken={onLoan}
        takenLabel="On the loan"
        chosen={chosen}
        onChoose={(p) => rows.append({ printId: p.id, accessionNumber: p.accessionNumber, title: p.title, insuranceValue: '', currency: '' })}
      />
      <SchemaForm
        form={form}
        aria-label="Prints to add"
        labelFor={labelFor}
        failureTitle="The prints were not added."
        className="gap-3"
        onValid={(body) => save.mutate(body, { onSuccess: onDone, onError: form.serverError })}
      >
        {rows.fields.length === 0 ? (
          <p className="text-sm text-ink-700">Find prints above and choose them; they are added together.</p>
        ) : (
          <ul className="flex flex-col gap-2">
            {rows.fields.map((row, index) => (
              <li key={row.id} className="flex flex-wrap items-end gap-3 border-b border-paper-200 pb-2">
                <p className="min-w-48 text-sm">
                  <span className="mono">{row.accessionNumber}</span> {row.title}
                </p>
                {withValues ? (
                  <>
                    <NumberInput name={`objects.${index}.insuranceValue`} label="Insurance value" fieldClassName="w-40" />
                    <SelectInput name={`objects.${index}.currency`} label="Currency" options={CURRENCY_OPTIONS} empty="Not given" fieldClassName="w-56" />
                  </>
                ) : null}
                <Button size="sm" variant="quiet" onClick={() => rows.remove(index)} aria-label={`Leave out ${row.accessionNumber}`}>
                  Leave out
                </Button>
              </li>
            ))}
          </ul>
        )}
        <SubmitCancel label="Add to the loan" busy={save.isPending} busyLabel="Adding…" disabled={rows.fields.length === 0} onCancel={onDone} />
      </SchemaForm>
    </section>
  );
}
