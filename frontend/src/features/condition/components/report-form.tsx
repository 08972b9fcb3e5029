import { useId, useRef, useState, type FormEvent } from 'react';
import { staleEditDetailsSchema } from '@toneledger/common/schemas/catalogue';
import {
  CONDITION_CONTEXTS,
  CONDITION_CONTEXT_LABELS,
  GRADE_LABELS,
  reportSchema,
  type ConditionReport,
  type ConditionTerm,
  type GradeDefinitions,
} from '@toneledger/common/schemas/condition';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { TextAreaField } from '@/components/ui/text-area-field';
import { isApiError } from '@/lib/api-client';
import { useCreateReport, useDiscardReport, useSignReport, useUpdateReport } from '@/features/condition/api/save-report';
import { GradeField } from '@/features/condition/components/grade-field';
import { ObservationsEditor } from '@/features/condition/components/observations-editor';
import { StaleReportNotice } from '@/features/condition/components/stale-report-notice';
import { todayIso } from '@/features/condition/utils/format';
import {
  changedFields,
  checkReport,
  checkUpdate,
  describeField,
  emptyReportValues,
  errorLabel,
  rebaseValues,
  reportToValues,
  serverIssuesToErrors,
  staleChanges,
  type FieldErrors,
  type ReportFormValues,
} from '@/features/condition/utils/report-form';

interface Conflict {
  current: ConditionReport;
  lastChangedBy: string | null;
  lastChangedAt: string | null;
}

interface Shared {
  images: PrintImage[];
  terms: ConditionTerm[];
  definitions: GradeDefinitions;
}

export type ReportFormProps =
  | (Shared & { mode: 'create'; printId: string; onCreated: (report: ConditionReport) => void; onCancel: () => void })
  | (Shared & { mode: 'edit'; report: ConditionReport; onDiscarded: (report: ConditionReport) => void });

export const SIGN_WARNING = 'Signing locks the report; later corrections are addenda.';

/**
 * A condition report being written: a new one, or the author's own draft. Checked with the shared
 * schema before sending; whatever the server answers, what was typed stays in the form. A draft is
 * saved with only the fields that changed, on the version it opened; a save made elsewhere in the
 * meantime is shown, field by field, before anything is overwritten.
 */
export function ReportForm(props: ReportFormProps) {
  const prefix = `report${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  const opened = props.mode === 'edit' ? props.report : null;
  const [base, setBase] = useState<ConditionReport | null>(opened);
  const [values, setValues] = useState<ReportFormValues>(() => (opened ? reportToValues(opened) : emptyReportValues(todayIso())));
  const [errors, setErrors] = useState<FieldErrors>({});
  const [conflict, setConflict] = useState<Conflict | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [confirmSign, setConfirmSign] = useState(false);
  const [confirmDiscard, setConfirmDiscard] = useState(false);
  const [failure, setFailure] = useState<unknown>(null);
  const summaryRef = useRef<HTMLDivElement>(null);

  const create = useCreateReport();
  const update = useUpdateReport();
  const sign = useSignReport();
  const discard = useDiscardReport();
  const busy = create.isPending || update.isPending || sign.isPending || discard.isPending;

  const baseValues = base ? reportToValues(base) : null;
  const dirty = baseValues ? changedFields(baseValues, values).length > 0 : true;
  const id = (path: string) => `${prefix}-${path.replace(/\./g, '-')}`;

  function set<K extends keyof ReportFormValues>(field: K, value: ReportFormValues[K]) {
    setValues((v) => ({ ...v, [field]: value }));
  }

  function showErrors(next: FieldErrors) {
    setErrors(next);
    requestAnimationFrame(() => summaryRef.current?.focus());
  }

  /** Sorts a failed request into a stale-edit review, field errors, or a general message. */
  function handleError(error: unknown) {
    if (isApiError(error) && error.code === 'conflict') {
      const stale = staleEditDetailsSchema.safeParse(error.details);
      const current = stale.success ? reportSchema.safeParse(stale.data.current) : null;
      if (stale.success && current?.success) {
        setConflict({ current: current.data, lastChangedBy: stale.data.lastChangedBy, lastChangedAt: stale.data.lastChangedAt });
        return;
      }
    }
    const fieldErrors = isApiError(error) ? serverIssuesToErrors(error.details) : {};
    if (Object.keys(fieldErrors).length > 0) showErrors(fieldErrors);
    else setFailure(error);
  }

  function reset() {
    setNotice(null);
    setFailure(null);
    create.reset();
    update.reset();
    sign.reset();
  }

  /** Saves the draft if anything changed; resolves with the saved report, or null when it was not saved. */
  async function saveDraft(): Promise<ConditionReport | null> {
    if (props.mode === 'create') {
      const checked = checkReport(values);
      if (!checked.ok) {
        showErrors(checked.errors);
        return null;
      }
      setErrors({});
      try {
        return await create.mutateAsync({ printId: props.printId, input: checked.data });
      } catch (error) {
        handleError(error);
        return null;
      }
    }
    if (!base || !baseValues) return null;
    if (!dirty) return base;
    const checked = checkUpdate(baseValues, values, base.version);
    if (!checked.ok) {
      showErrors(checked.errors);
      return null;
    }
    setErrors({});
    try {
      const saved = await update.mutateAsync({ id: base.id, update: checked.data });
      setBase(saved);
      setValues(reportToValues(saved));
      return saved;
    } catch (error) {
      handleError(error);
      return null;
    }
  }

  async function submit(event: FormEvent) {
    event.preventDefault();
    reset();
    const saved = await saveDraft();
    if (!saved) return;
    if (props.mode === 'create') props.onCreated(saved);
    else setNotice(`Draft saved (version ${saved.version}).`);
  }

  async function signNow() {
    reset();
    if (values.grade === '') {
      setConfirmSign(false);
      showErrors({ grade: 'Give an overall grade before signing' });
      return;
    }
    const saved = await saveDraft();
    if (!saved) {
      setConfirmSign(false);
      return;
    }
    try {
      await sign.mutateAsync({ id: saved.id, version: saved.version });
    } catch (error) {
      setConfirmSign(false);
      handleError(error);
    }
  }

  function reapply() {
    if (!conflict || !base) return;
    const both = staleChanges(base, conflict.current, values, props.terms).filter((c) => c.alsoChangedByYou);
    setValues(rebaseValues(base, conflict.current, values));
    setBase(conflict.current);
    setConflict(null);
    reset();
    setNotice(
      `Your edits are now on top of version ${conflict.current.version}.` +
        (both.length ? ` You both changed: ${both.map((c) => c.label).join(', ')}; your values are in the form.` : '') +
        ' Check the form, then save the draft.',
    );
  }

  function discardMine() {
    if (!conflict) return;
    setValues(reportToValues(conflict.current));
    setBase(conflict.current);
    setConflict(null);
    setErrors({});
    reset();
    setNotice(`The form now shows version ${conflict.current.version}. Your edits were discarded.`);
  }

  const errorEntries = Object.entries(errors).filter(([, message]) => message) as [string, string][];

  return (
    <form onSubmit={submit} noValidate aria-label={props.mode === 'create' ? 'New condition report' : 'Draft condition report'} className="flex max-w-5xl flex-col gap-5">
      {conflict && base ? (
        <StaleReportNotice
          changes={staleChanges(base, conflict.current, values, props.terms)}
          lastChangedBy={conflict.lastChangedBy}
          lastChangedAt={conflict.lastChangedAt}
          currentVersion={conflict.current.version}
          describeMine={(field) => describeField(values, field, props.terms)}
          onReapply={reapply}
          onDiscard={discardMine}
        />
      ) : null}
      {notice ? (
        <Notice tone="info" role="status">
          <p>{notice}</p>
        </Notice>
      ) : null}
      <div ref={summaryRef} tabIndex={-1} className="outline-none">
        {errorEntries.length > 0 ? (
          <Notice tone="error" role="alert" title={`Not saved: ${errorEntries.length === 1 ? 'one field needs' : `${errorEntries.length} fields need`} attention.`}>
            <ul className="mt-1 list-disc pl-5">
              {errorEntries.map(([path, message]) => {
                const label = errorLabel(path);
                return (
                  <li key={path}>
                    {label ? (
                      <a href={`#${id(path)}`} className="text-danger-700">
                        {label}: {message}
                      </a>
                    ) : (
                      message
                    )}
                  </li>
                );
              })}
            </ul>
          </Notice>
        ) : null}
      </div>
      {failure ? <ErrorNotice error={failure} title="Not saved." /> : null}

      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4 sm:grid-cols-3">
        <legend className="px-1 font-serif text-lg font-semibold">Examination</legend>
        <TextField id={id('examinedOn')} type="date" label="Examined on" value={values.examinedOn} onChange={(e) => set('examinedOn', e.target.value)} error={errors.examinedOn} required />
        <SelectField id={id('context')} label="Context" value={values.context} onChange={(e) => set('context', e.target.value)} error={errors.context}>
          {CONDITION_CONTEXTS.map((c) => (
            <option key={c} value={c}>
              {CONDITION_CONTEXT_LABELS[c]}
            </option>
          ))}
        </SelectField>
        <TextField
          id={id('nextCheckOn')}
          type="date"
          label="Next check"
          hint="Proposed date of the next examination"
          value={values.nextCheckOn}
          onChange={(e) => set('nextCheckOn', e.target.value)}
          error={errors.nextCheckOn}
        />
      </fieldset>

      <section className="rounded border border-paper-300 bg-white p-4">
        <GradeField id={id('grade')} value={values.grade} onChange={(grade) => set('grade', grade)} definitions={props.definitions} error={errors.grade} />
      </section>

      <section className="rounded border border-paper-300 bg-paper-50 p-4" aria-labelledby={id('observations-heading')}>
        <h2 id={id('observations-heading')} className="mb-3 text-lg">
          Observations
        </h2>
        <ObservationsEditor
          observations={values.observations}
          onChange={(observations) => set('observations', observations)}
          terms={props.terms}
          images={props.images}
          errors={errors}
          fieldId={id}
        />
      </section>

      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4">
        <legend className="px-1 font-serif text-lg font-semibold">Summary and advice</legend>
        <TextAreaField id={id('summary')} label="Summary" value={values.summary} onChange={(e) => set('summary', e.target.value)} error={errors.summary} rows={4} maxLength={10000} />
        <TextAreaField
          id={id('recommendations')}
          label="Recommendations"
          hint="Advice on care, housing, display or loan. Treatment decisions rest with qualified conservators."
          value={values.recommendations}
          onChange={(e) => set('recommendations', e.target.value)}
          error={errors.recommendations}
          rows={3}
          maxLength={10000}
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
            <Button
              variant="danger"
              disabled={busy}
              onClick={() => base && discard.mutate({ report: base }, { onSuccess: () => props.onDiscarded(base) })}
            >
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
            <span className="text-xs text-ink-700">{dirty ? 'Unsaved changes' : `Saved · version ${base?.version ?? ''}`}</span>
          </>
        ) : (
          <Button variant="quiet" onClick={props.onCancel} disabled={busy}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
