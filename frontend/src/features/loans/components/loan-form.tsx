import { useWatch } from 'react-hook-form';
import { LOAN_DIRECTION_LABELS, LOAN_DIRECTIONS, LOAN_PURPOSE_LABELS, LOAN_PURPOSES, loanDetailSchema, loanInputSchema, loanUpdateSchema, type LoanDetail } from '@toneledger/common/schemas/loans';
import { CheckboxInput, DateInput, NumberInput, SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { useExhibitions } from '@/lib/exhibitions-api';
import { changesOnly } from '@/lib/forms/stale-edit';
import { useRecordEdit } from '@/lib/forms/use-record-edit';
import { NOTHING_TO_SAVE, useSchemaForm } from '@/lib/forms/use-schema-form';
import { useCreateLoan, useUpdateLoan } from '@/features/loans/api/save-loan';
import {
  CONDITION_LABELS as C, LOAN_EDIT_FIELDS, LOAN_FIELD_LABELS as L, emptyLoanValues, loanEditValuesToBody, loanToValues, loanValuesToBody,
  type LoanFormValues,
} from '@/features/loans/utils/loan-form';

const DIRECTIONS = LOAN_DIRECTIONS.map((d) => ({ value: d, label: LOAN_DIRECTION_LABELS[d] }));
const PURPOSES = LOAN_PURPOSES.map((p) => ({ value: p, label: LOAN_PURPOSE_LABELS[p] }));

function Fieldset({ legend, children }: { legend: string; children: React.ReactNode }) {
  return (
    <fieldset className="rounded border border-paper-300 bg-white px-4 pt-2 pb-4">
      <legend className="px-1 text-sm font-semibold text-ink-800">{legend}</legend>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">{children}</div>
    </fieldset>
  );
}

function ExhibitionChoice() {
  const purpose = useWatch({ name: 'purpose' }) as string;
  const exhibitions = useExhibitions({ page: 1, pageSize: 200 }, purpose === 'exhibition');
  if (purpose !== 'exhibition') return null;
  const options = (exhibitions.data?.data ?? []).map((e) => ({ value: e.id, label: e.title }));
  return <SelectInput name="exhibitionId" label={L.exhibitionId} empty="Not recorded here" options={options} hint="When the show is recorded in the exhibitions area." />;
}

/** The fields of a loan: who, why, when, how, and the conditions the lender asks for. */
function LoanFields({ creating }: { creating: boolean }) {
  return (
    <div className="flex flex-col gap-4">
      <Fieldset legend="The loan">
        {creating ? <SelectInput name="direction" label={L.direction} options={DIRECTIONS} /> : null}
        <TextInput name="reference" label={L.reference} className="mono" />
        <TextInput name="otherInstitution" label={L.otherInstitution} hint="The borrower (loan out) or the lender (loan in)." />
        <SelectInput name="purpose" label={L.purpose} options={PURPOSES} />
        <ExhibitionChoice />
        <TextInput name="contactName" label={L.contactName} />
        <TextInput name="contactEmail" label={L.contactEmail} type="email" />
        <TextInput name="venue" label={L.venue} />
        <TextInput name="courier" label={L.courier} />
      </Fieldset>
      <Fieldset legend="Dates">
        {creating ? <DateInput name="proposedOn" label={L.proposedOn} hint="For a loan recorded after the fact; today when empty." /> : null}
        <DateInput name="dispatchOn" label={L.dispatchOn} />
        <DateInput name="opensOn" label={L.opensOn} />
        <DateInput name="closesOn" label={L.closesOn} />
        <DateInput name="returnOn" label={L.returnOn} />
      </Fieldset>
      <Fieldset legend={L.conditions}>
        <NumberInput name="conditions.maxLux" label={C.maxLux} />
        <NumberInput name="conditions.maxAnnualLuxHours" label={C.maxAnnualLuxHours} />
        <NumberInput name="conditions.temperatureMinC" label={C.temperatureMinC} />
        <NumberInput name="conditions.temperatureMaxC" label={C.temperatureMaxC} />
        <NumberInput name="conditions.rhMinPercent" label={C.rhMinPercent} />
        <NumberInput name="conditions.rhMaxPercent" label={C.rhMaxPercent} />
        <CheckboxInput
          name="conditions.noAlkalineBufferedMounts"
          label={C.noAlkalineBufferedMounts}
          hint="Asked for Prussian-blue images, which alkaline buffers can fade."
          fieldClassName="sm:col-span-2"
        />
        <TextAreaInput name="conditions.other" label={C.other} rows={2} fieldClassName="sm:col-span-2 lg:col-span-4" />
      </Fieldset>
      <Fieldset legend="Credit and notes">
        <TextAreaInput name="creditLine" label={L.creditLine} rows={2} fieldClassName="sm:col-span-2" />
        <TextAreaInput name="notes" label={L.notes} rows={2} fieldClassName="sm:col-span-2" />
      </Fieldset>
    </div>
  );
}

const labelFor = (path: string, label: string | null) => {
  const [head, tail] = path.split('.');
  if (head === 'conditions' && tail) return C[tail as keyof typeof C] ?? label;
  return L[head as keyof typeof L] ?? label;
};

export function LoanCreateForm({ direction, onSaved, onCancel }: { direction?: 'out' | 'in'; onSaved: (loan: LoanDetail) => void; onCancel: () => void }) {
  const create = useCreateLoan();
  const form = useSchemaForm({ schema: loanInputSchema, defaultValues: emptyLoanValues(direction), toBody: loanValuesToBody });
  return (
    <SchemaForm
      form={form}
      aria-label="New loan"
      labelFor={labelFor}
      className="gap-4"
      onValid={(body) => create.mutate(body, { onSuccess: onSaved, onError: form.serverError })}
    >
      <LoanFields creating />
      <SubmitCancel label="Propose the loan" busy={create.isPending} busyLabel="Saving…" onCancel={onCancel} />
    </SchemaForm>
  );
}

/** Edits a loan: only the changed fields are sent, on the version the form opened; a save made meanwhile is shown first. */
export function LoanEditForm({ loan, onSaved, onCancel }: { loan: LoanDetail; onSaved: (loan: LoanDetail) => void; onCancel: () => void }) {
  const update = useUpdateLoan(loan.id);
  const form = useSchemaForm({ schema: loanUpdateSchema, defaultValues: loanToValues(loan), toBody: (v: LoanFormValues) => ({ ...loanEditValuesToBody(v), version: loan.version }) });
  const edit = useRecordEdit(form, { record: loan, recordSchema: loanDetailSchema, toValues: loanToValues, fields: LOAN_EDIT_FIELDS, comparable: loanEditValuesToBody });

  function onValid(body: Record<string, unknown>, values: LoanFormValues) {
    if (!edit.base) return;
    const changed = edit.changed(values);
    if (changed.length === 0) return form.setNotice(NOTHING_TO_SAVE);
    update.mutate(changesOnly(body, changed, edit.base.version) as never, {
      onSuccess: onSaved,
      onError: edit.failed,
    });
  }

  return (
    <SchemaForm form={form} edit={edit} subject="this loan" aria-label="Edit loan" labelFor={labelFor} className="gap-4" onValid={onValid}>
      <LoanFields creating={false} />
      <SubmitCancel label="Save the loan" busy={update.isPending} busyLabel="Saving…" onCancel={onCancel} />
    </SchemaForm>
  );
}
