import { useId, useState } from 'react';
import { useController, useWatch } from 'react-hook-form';
import { CONDITION_CONTEXTS, CONDITION_CONTEXT_LABELS, GRADE_LABELS, reportInputSchema, reportSchema, type ConditionReport, type ConditionTerm, type GradeDefinitions } from '@toneledger/common/schemas/condition';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { DateInput, SelectInput, TextAreaInput } from '@/components/form/fields';
import { useFieldId } from '@/components/form/form-context';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { changesOnly } from '@/lib/forms/stale-edit';
import { useRecordEdit } from '@/lib/forms/use-record-edit';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useCreateReport, useDiscardReport, useSignReport, useUpdateReport } from '@/features/condition/api/save-report';
import { GradeField } from '@/features/condition/components/grade-field';
import { ObservationsEditor } from '@/features/condition/components/observations-editor';
import { todayIso } from '@/features/condition/utils/format';
import {
  FIELD_LABELS as L,
  REPORT_FORM_FIELDS,
  describeField,
  emptyReportValues,
  errorLabel,
  reportToValues,
  reportValuesToBody,
  type ReportField,
  type ReportFormValues,
} from '@/features/condition/utils/report-form';

interface Shared {
  images: PrintImage[];
  terms: ConditionTerm[];
  definitions: GradeDefinitions;
}

export type ReportFormProps =
  | (Shared & {
      mode: 'create';
      printId: string;
      /** Opened from a loan: the context the loan needs and the loan the report is made for. */
      prefill?: { context?: ReportFormValues['context']; loanId?: string };
      onCreated: (report: ConditionReport) => void;
      onCancel: () => void;
    })
  | (Shared & { mode: 'edit'; report: ConditionReport; onDiscarded: (report: ConditionReport) => void });

export const SIGN_WARNING = 'Signing locks the report; later corrections are addenda.';

const CONTEXTS = CONDITION_CONTEXTS.map((c) => ({ value: c, label: CONDITION_CONTEXT_LABELS[c] }));

function Grade({ definitions }: { definitions: GradeDefinitions }) {
  const { field, fieldState } = useController<ReportFormValues, 'grade'>({ name: 'grade' });
  return <GradeField id={useFieldId('grade')} name="grade" value={field.value} onChange={field.onChange} definitions={definitions} error={fieldState.error?.message} />;
}

/**
 * A condition report being written: a new one, or the author's own draft. Checked with the shared
 * schema before sending; whatever the server answers, what was typed stays in the form. A draft is
 * saved with only the fields that changed, on the version it opened; a save made elsewhere in the
 * meantime is shown, field by field, before anything is overwritten.
 */
export function ReportForm(props: ReportFormProps) {
  const opened = props.mode === 'edit' ? props.report : null;
  const [confirmSign, setConfirmSign] = useState(false);
  const [confirmDiscard, setConfirmDiscard] = useState(false);
  const create = useCreateReport();
  const update = useUpdateReport();
  const sign = useSignReport();
  const discard = useDiscardReport();
  const busy = create.isPending || update.isPending || sign.isPending || discard.isPending;

  const prefill = props.mode === 'create' ? props.prefill : undefined;
  const form = useSchemaForm({
    schema: reportInputSchema,
    defaultValues: opened ? reportToValues(opened) : { ...emptyReportValues(todayIso()), ...(prefill?.context ? { context: prefill.context } : {}) },
    // A report made for a loan carries the loan's id (it is not a field of the form).
    toBody: (values: ReportFormValues) => ({ ...reportValuesToBody(values), ...(prefill?.loanId ? { loanId: prefill.loanId } : {}) }),
  });
  const edit = useRecordEdit(form, {
    record: opened,
    recordSchema: reportSchema,
    toValues: reportToValues,
    fields: REPORT_FORM_FIELDS,
    comparable: reportValuesToBody,
    describe: (key, values) => describeField(values, key as ReportField, props.terms),
  });
  const values = useWatch({ control: form.control }) as ReportFormValues;
  const observationsHeading = useId();
  const dirty = edit.base ? edit.changed(values).length > 0 : true;

  const failed = edit.failed;

  /** Saves the draft if anything changed; the saved report, or null when it was not saved. */
  async function saveDraft(body: ReturnType<typeof reportInputSchema.parse>, current: ReportFormValues): Promise<ConditionReport | null> {
    create.reset();
    update.reset();
    sign.reset();
    try {
      if (props.mode === 'create') return await create.mutateAsync({ printId: props.printId, input: body });
      if (!edit.base) return null;
      const changed = edit.changed(current);
      if (changed.length === 0) return edit.base;
      const saved = await update.mutateAsync({ id: edit.base.id, update: changesOnly(body, changed, edit.base.version) as never });
      edit.saved(saved);
      return saved;
    } catch (error) {
      failed(error);
      return null;
    }
  }

  async function onValid(body: ReturnType<typeof reportInputSchema.parse>, current: ReportFormValues) {
    const saved = await saveDraft(body, current);
    if (!saved) return;
    if (props.mode === 'create') props.onCreated(saved);
    else form.setNotice(`Draft saved (version ${saved.version}).`);
  }

  async function signNow() {
    if (form.getValues('grade') === '') {
      setConfirmSign(false);
      form.showErrors({ grade: 'Give an overall grade before signing' });
      return;
    }
    let checked = false;
    await form.submit(async (body, current) => {
      checked = true;
      const saved = await saveDraft(body, current);
      if (!saved) return setConfirmSign(false);
      try {
        await sign.mutateAsync({ id: saved.id, version: saved.version });
      } catch (error) {
        setConfirmSign(false);
        failed(error);
      }
    })();
    if (!checked) setConfirmSign(false);
  }

  return (
    <SchemaForm
      form={form}
      edit={edit}
      subject="this draft"
      onValid={onValid}
      labelFor={errorLabel}
      aria-label={props.mode === 'create' ? 'New condition report' : 'Draft condition report'}
      className="max-w-5xl gap-5"
    >
      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4 sm:grid-cols-3">
        <legend className="px-1 font-serif text-lg font-semibold">Examination</legend>
        <DateInput name="examinedOn" label={L.examinedOn} required />
        <SelectInput name="context" label={L.context} options={CONTEXTS} />
        <DateInput name="nextCheckOn" label={L.nextCheckOn} hint="Proposed date of the next examination" />
      </fieldset>

      <section className="rounded border border-paper-300 bg-white p-4">
        <Grade definitions={props.definitions} />
      </section>

      <section className="rounded border border-paper-300 bg-paper-50 p-4" aria-labelledby={observationsHeading}>
        <h2 id={observationsHeading} className="mb-3 text-lg">
          {L.observations}
        </h2>
        <ObservationsEditor terms={props.terms} images={props.images} />
      </section>

      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4">
        <legend className="px-1 font-serif text-lg font-semibold">Summary and advice</legend>
        <TextAreaInput name="summary" label={L.summary} rows={4} />
        <TextAreaInput
          name="recommendations"
          label={L.recommendations}
          hint="Advice on care, housing, display or loan. Treatment decisions rest with qualified conservators."
          rows={3}
        />
      </fieldset>

      {confirmSign ? (
        <div role="alertdialog" aria-label="Confirm signing" className="rounded border border-sepia-200 bg-sepia-50 p-4 text-sm">
          <p className="font-semibold text-sepia-800">{SIGN_WARNING}</p>
          <p className="mt-1">
            Overall grade: {values.grade ? GRADE_LABELS[values.grade] : 'not given'}. {dirty ? 'Your unsaved changes are saved first.' : ''}
          </p>
          <div className="mt-3 flex gap-2">
            <Button variant="primary" onClick={signNow} disabled={busy}>
              {sign.isPending ? 'Signing…' : 'Sign and lock'}
            </Button>
            <Button onClick={() => setConfirmSign(false)} disabled={busy}>
              Keep editing
            </Button>
          </div>
        </div>
      ) : null}

      {confirmDiscard && props.mode === 'edit' ? (
        <div role="alertdialog" aria-label="Confirm discarding" className="rounded border border-danger-200 bg-danger-50 p-4 text-sm">
          <p>Discard this draft? It is removed from the print's reports; the audit trail keeps a copy.</p>
          {discard.isError ? <ErrorNotice error={discard.error} title="The draft was not discarded." /> : null}
          <div className="mt-3 flex gap-2">
            <Button variant="danger" disabled={busy} onClick={() => edit.base && discard.mutate({ report: edit.base }, { onSuccess: () => props.onDiscarded(edit.base!) })}>
              Discard draft
            </Button>
            <Button onClick={() => setConfirmDiscard(false)} disabled={busy}>
              Keep the draft
            </Button>
          </div>
        </div>
      ) : null}

      <div className="flex flex-wrap items-center gap-2 print:hidden">
        <Button type="submit" variant="primary" disabled={busy}>
          {create.isPending || update.isPending ? 'Saving…' : 'Save draft'}
        </Button>
        {props.mode === 'edit' ? (
          <>
            <Button onClick={() => setConfirmSign(true)} disabled={busy || confirmSign}>
              Sign report
            </Button>
            <Button variant="quiet" onClick={() => setConfirmDiscard(true)} disabled={busy || confirmDiscard}>
              Discard…
            </Button>
            <span className="text-xs text-ink-700">{dirty ? 'Unsaved changes' : `Saved · version ${edit.base?.version ?? ''}`}</span>
          </>
        ) : (
          <Button variant="quiet" onClick={props.onCancel} disabled={busy}>
            Cancel
          </Button>
        )}
      </div>
    </SchemaForm>
  );
}
