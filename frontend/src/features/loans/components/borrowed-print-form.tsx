import { PROCESS } from '@toneledger/common/schemas/vocab';
import { borrowedPrintInputSchema, type LoanDetail } from '@toneledger/common/schemas/loans';
import { SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useAddBorrowedPrint } from '@/features/loans/api/save-loan';

interface BorrowedValues {
  print: { accessionNumber: string; title: string; process: string; dateMade: string; staffNotes: string };
}

/**
 * A print lent to the collection (a loan in): a record of its own, under the lender's number, that
 * the catalogue shows only when asked; the rest of its record is completed in the catalogue.
 */
export function BorrowedPrintForm({ loan, onDone }: { loan: LoanDetail; onDone: () => void }) {
  const add = useAddBorrowedPrint(loan.id);
  const form = useSchemaForm({
    schema: borrowedPrintInputSchema,
    defaultValues: { print: { accessionNumber: '', title: '', process: '', dateMade: '', staffNotes: '' } } as BorrowedValues,
    toBody: (v: BorrowedValues) => ({ print: v.print, version: loan.version }),
  });
  return (
    <SchemaForm
      form={form}
      aria-label="Record a borrowed print"
      failureTitle="The print was not recorded."
      className="gap-3 rounded border border-paper-300 bg-paper-50 p-3 print:hidden"
      onValid={(body) => add.mutate(body, { onSuccess: onDone, onError: form.serverError })}
    >
      <p className="text-sm text-ink-700">
        A print lent to us by {loan.otherInstitution}: recorded under the lender&rsquo;s own number, kept apart from the collection.
      </p>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <TextInput name="print.accessionNumber" label="Lender's number" className="mono" />
        <TextInput name="print.title" label="Title" fieldClassName="lg:col-span-2" />
        <SelectInput name="print.process" label="Process" options={PROCESS.options} empty="Choose…" />
        <TextInput name="print.dateMade" label="Date made" hint="EDTF, for example 1931, 193X or 1931/1934." />
        <TextAreaInput name="print.staffNotes" label="Staff notes" rows={2} fieldClassName="sm:col-span-2 lg:col-span-3" />
      </div>
      <SubmitCancel label="Record and add to the loan" busy={add.isPending} busyLabel="Saving…" onCancel={onDone} />
    </SchemaForm>
  );
}
