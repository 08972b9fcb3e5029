import { useId, useMemo, useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { accessionRule, checkAccession } from '@toneledger/common/domain/accession';
import { parseEdtf } from '@toneledger/common/domain/edtf';
import { printSchema, staleEditDetailsSchema, type Print } from '@toneledger/common/schemas/catalogue';
import { LIGHT_RESPONSIVITY, PAT_RESULT, PROCESS, STATUS, SUPPORT } from '@toneledger/common/schemas/vocab';
import { Button, buttonClasses } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { TextAreaField } from '@/components/ui/text-area-field';
import { isApiError } from '@/lib/api-client';
import { useEnclosures, useLocations, useMakers, usePapers } from '@/lib/reference-api';
import { useCatalogueSettings } from '@/lib/settings-api';
import { useCreatePrint } from '@/features/catalogue/api/create-print';
import { useUpdatePrint } from '@/features/catalogue/api/update-print';
import { StaleEditNotice } from '@/features/catalogue/components/stale-edit-notice';
import { WarningsPanel } from '@/features/catalogue/components/warnings-panel';
import { edtfSummary } from '@/features/catalogue/utils/format';
import {
  FIELD_LABELS,
  changedFields,
  checkCreate,
  checkUpdate,
  emptyPrintValues,
  printToValues,
  rebaseValues,
  serverIssuesToErrors,
  staleChanges,
  type FieldErrors,
  type PrintField,
  type PrintFormValues,
} from '@/features/catalogue/utils/print-form';
import { previewWarnings } from '@/features/catalogue/utils/warnings';

interface Conflict {
  current: Print;
  lastChangedBy: string | null;
  lastChangedAt: string | null;
}

export type PrintFormProps =
  | { mode: 'create'; onSaved: (print: Print) => void; cancelTo: string }
  | { mode: 'edit'; print: Print; onSaved: (print: Print) => void; cancelTo: string };

function fieldId(prefix: string, field: string) {
  return `${prefix}-${field}`;
}

function bufferingText(value: boolean | null): string {
  return value === true ? 'alkaline-buffered' : value === false ? 'unbuffered' : 'buffering unknown';
}

/**
 * Create or edit a print. Checked on submit with the schema the server uses; every field keeps
 * what was typed whatever the server answers. On edit only changed fields are sent, on top of the
 * version the form opened; if someone saved in between, the form shows what they changed and lets
 * the person re-apply their edits to the current version.
 */
export function PrintForm(props: PrintFormProps) {
  const prefix = `print${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  const opened = props.mode === 'edit' ? props.print : null;
  const [base, setBase] = useState<Print | null>(opened);
  const [values, setValues] = useState<PrintFormValues>(() => (opened ? printToValues(opened) : emptyPrintValues()));
  const [errors, setErrors] = useState<FieldErrors>({});
  const [conflict, setConflict] = useState<Conflict | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const summaryRef = useRef<HTMLDivElement>(null);

  const settings = useCatalogueSettings();
  const makers = useMakers();
  const papers = usePapers();
  const enclosures = useEnclosures();
  const locations = useLocations(undefined, props.mode === 'create');
  const create = useCreatePrint();
  const update = useUpdatePrint();
  const mutation = props.mode === 'create' ? create : update;

  const baseValues = useMemo(() => (base ? printToValues(base) : null), [base]);

  function set(field: keyof PrintFormValues) {
    return (event: { target: { value: string } }) => {
      const value = field === 'valuationCurrency' ? event.target.value.toUpperCase() : event.target.value;
      setValues((v) => ({ ...v, [field]: value }));
    };
  }

  // Live checks, as the person types.
  const pattern = settings.data?.accessionPattern;
  const accessionExample = useMemo(() => {
    if (!pattern) return null;
    try {
      return accessionRule(pattern).example;
    } catch {
      return null;
    }
  }, [pattern]);
  const accessionChanged = !baseValues || values.accessionNumber !== baseValues.accessionNumber;
  const accessionCheck = pattern && values.accessionNumber.trim() !== '' && accessionChanged ? checkAccession(pattern, values.accessionNumber) : null;
  const edtf = values.dateMade.trim() === '' ? null : parseEdtf(values.dateMade.trim());
  const warnings = previewWarnings({
    process: values.process,
    enclosureId: values.enclosureId,
    enclosures: enclosures.data?.data ?? [],
    steps: base?.steps ?? [],
  });

  function showErrors(next: FieldErrors) {
    setErrors(next);
    // Move focus to the list of problems, which links to each field.
    requestAnimationFrame(() => summaryRef.current?.focus());
  }

  function liveErrors(): FieldErrors {
    const extra: FieldErrors = {};
    if (accessionCheck && !accessionCheck.ok) extra.accessionNumber = accessionCheck.message;
    if (edtf && !edtf.ok) extra.dateMade = `Not a date this catalogue can read: ${edtf.error}`;
    return extra;
  }

  function handleServerError(error: unknown) {
    if (!isApiError(error)) return;
    if (error.code === 'conflict' && props.mode === 'edit') {
      const stale = staleEditDetailsSchema.safeParse(error.details);
      const current = stale.success ? printSchema.safeParse(stale.data.current) : null;
      if (stale.success && current?.success) {
        setConflict({ current: current.data, lastChangedBy: stale.data.lastChangedBy, lastChangedAt: stale.data.lastChangedAt });
        return;
      }
    }
    const fieldErrors = serverIssuesToErrors(error.details);
    if (Object.keys(fieldErrors).length > 0) showErrors(fieldErrors);
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    setNotice(null);
    mutation.reset();
    if (props.mode === 'create') {
      const checked = checkCreate(values);
      const found = { ...(checked.ok ? {} : checked.errors), ...liveErrors() };
      if (!checked.ok || Object.keys(found).length > 0) return showErrors(found);
      setErrors({});
      create.mutate(checked.data, { onSuccess: props.onSaved, onError: handleServerError });
      return;
    }
    if (!base || !baseValues) return;
    const checked = checkUpdate(baseValues, values, base.version);
    const found = { ...(checked.ok ? {} : checked.errors), ...liveErrors() };
    if (!checked.ok || Object.keys(found).length > 0) return showErrors(found);
    setErrors({});
    if (changedFields(baseValues, values).length === 0) {
      setNotice('Nothing has changed, so there is nothing to save.');
      return;
    }
    update.mutate({ id: base.id, update: checked.data }, { onSuccess: props.onSaved, onError: handleServerError });
  }

  function reapply() {
    if (!conflict || !base) return;
    const both = staleChanges(base, conflict.current, values).filter((c) => c.alsoChangedByYou);
    setValues(rebaseValues(base, conflict.current, values));
    setBase(conflict.current);
    setConflict(null);
    mutation.reset();
    setNotice(
      `Your edits are now on top of version ${conflict.current.version}.` +
        (both.length ? ` You and ${conflict.lastChangedBy ?? 'the other person'} both changed: ${both.map((c) => c.label).join(', ')}; your values are in the form.` : '') +
        ' Check the form, then press Save.',
    );
  }

  function discard() {
    if (!conflict) return;
    setValues(printToValues(conflict.current));
    setBase(conflict.current);
    setConflict(null);
    setErrors({});
    mutation.reset();
    setNotice(`The form now shows version ${conflict.current.version}. Your edits were discarded.`);
  }

  function describeMine(field: PrintField): string {
    const value = values[field];
    if (value === '') return '';
    switch (field) {
      case 'makerId':
        return makers.data?.data.find((m) => m.id === value)?.name ?? value;
      case 'paperId':
        return papers.data?.data.find((p) => p.id === value)?.label ?? value;
      case 'enclosureId':
        return enclosures.data?.data.find((e) => e.id === value)?.name ?? value;
      case 'process':
        return PROCESS.labels[value as keyof typeof PROCESS.labels] ?? value;
      case 'support':
        return SUPPORT.labels[value as keyof typeof SUPPORT.labels] ?? value;
      case 'status':
        return STATUS.labels[value as keyof typeof STATUS.labels] ?? value;
      case 'lightResponsivity':
        return LIGHT_RESPONSIVITY.labels[value as keyof typeof LIGHT_RESPONSIVITY.labels] ?? value;
      default:
        return value;
    }
  }

  const id = (field: string) => fieldId(prefix, field);
  const errorEntries = Object.entries(errors).filter(([, message]) => message) as [string, string][];
  const otherError = mutation.isError && !conflict && !(isApiError(mutation.error) && Object.keys(serverIssuesToErrors(mutation.error.details)).length > 0);
  const edtfPreviewId = id('dateMade-preview');
  const accessionLiveId = id('accession-live');

  return (
    <form onSubmit={submit} noValidate aria-label={props.mode === 'create' ? 'New print' : 'Edit print'} className="flex max-w-5xl flex-col gap-5">
      {conflict && base ? (
        <StaleEditNotice
          changes={staleChanges(base, conflict.current, values)}
          lastChangedBy={conflict.lastChangedBy}
          lastChangedAt={conflict.lastChangedAt}
          currentVersion={conflict.current.version}
          describeMine={describeMine}
          onReapply={reapply}
          onDiscard={discard}
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
              {errorEntries.map(([field, message]) => (
                <li key={field}>
                  {field in FIELD_LABELS ? (
                    <a href={`#${id(field)}`} className="text-danger-700">
                      {FIELD_LABELS[field as keyof typeof FIELD_LABELS]}: {message}
                    </a>
                  ) : (
                    message
                  )}
                </li>
              ))}
            </ul>
          </Notice>
        ) : null}
      </div>
      {otherError ? <ErrorNotice error={mutation.error} title="Not saved." /> : null}

      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4 sm:grid-cols-2">
        <legend className="px-1 font-serif text-lg font-semibold">Identification</legend>
        <div className="flex flex-col gap-1">
          <TextField
            id={id('accessionNumber')}
            label="Accession number"
            value={values.accessionNumber}
            onChange={set('accessionNumber')}
            error={errors.accessionNumber}
            hint={pattern ? `Pattern ${pattern}${accessionExample ? `, for example ${accessionExample}` : ''}` : undefined}
            className="mono"
            autoComplete="off"
            maxLength={60}
            required
          />
          <p id={accessionLiveId} aria-live="polite" className="text-xs text-sepia-800">
            {accessionCheck && !accessionCheck.ok && !errors.accessionNumber ? accessionCheck.message : ''}
          </p>
        </div>
        <TextField id={id('title')} label="Title" value={values.title} onChange={set('title')} error={errors.title} maxLength={500} required />
        <SelectField id={id('makerId')} label="Maker" value={values.makerId} onChange={set('makerId')} error={errors.makerId}>
          <option value="">Not recorded</option>
          {makers.data?.data.map((m) => (
            <option key={m.id} value={m.id}>
              {m.name}
              {m.lifeDates ? ` (${m.lifeDates})` : ''}
            </option>
          ))}
        </SelectField>
        <div className="flex flex-col gap-1">
          <TextField
            id={id('dateMade')}
            label="Date made"
            value={values.dateMade}
            onChange={set('dateMade')}
            error={errors.dateMade}
            hint="EDTF: 1968, 1968-04, 1968-04~ (about), 1971? (uncertain), 196X (1960s), 1964/1969"
            aria-describedby={`${errors.dateMade ? `${id('dateMade')}-error` : `${id('dateMade')}-hint`} ${edtfPreviewId}`}
            className="mono"
            autoComplete="off"
            maxLength={100}
          />
          <p id={edtfPreviewId} aria-live="polite" className={`text-xs ${edtf && !edtf.ok ? 'text-danger-700' : 'text-ink-800'}`}>
            {edtf ? (edtf.ok ? <>Reads as: {edtfSummary(edtf)}</> : edtf.error) : ''}
          </p>
        </div>
      </fieldset>

      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4 sm:grid-cols-2 lg:grid-cols-3">
        <legend className="px-1 font-serif text-lg font-semibold">Making and materials</legend>
        <SelectField id={id('process')} label="Process" value={values.process} onChange={set('process')} error={errors.process}>
          {PROCESS.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <SelectField id={id('support')} label="Support" value={values.support} onChange={set('support')} error={errors.support}>
          <option value="">Not recorded</option>
          {SUPPORT.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <SelectField id={id('paperId')} label="Paper" value={values.paperId} onChange={set('paperId')} error={errors.paperId}>
          <option value="">Not recorded</option>
          {papers.data?.data.map((p) => (
            <option key={p.id} value={p.id}>
              {p.label}
            </option>
          ))}
        </SelectField>
        <SelectField id={id('status')} label="Status" value={values.status} onChange={set('status')} error={errors.status}>
          {STATUS.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <SelectField
          id={id('lightResponsivity')}
          label="Light responsivity"
          value={values.lightResponsivity}
          onChange={set('lightResponsivity')}
          error={errors.lightResponsivity}
        >
          <option value="">Not recorded</option>
          {LIGHT_RESPONSIVITY.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
      </fieldset>

      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4 sm:grid-cols-2 lg:grid-cols-3">
        <legend className="px-1 font-serif text-lg font-semibold">Dimensions (mm, width × height)</legend>
        {(['imageWidthMm', 'imageHeightMm', 'sheetWidthMm', 'sheetHeightMm', 'mountWidthMm', 'mountHeightMm'] as const).map((field) => (
          <TextField
            key={field}
            id={id(field)}
            label={FIELD_LABELS[field]}
            value={values[field]}
            onChange={set(field)}
            error={errors[field]}
            inputMode="decimal"
            className="num"
          />
        ))}
      </fieldset>

      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4 lg:grid-cols-2">
        <legend className="px-1 font-serif text-lg font-semibold">Housing</legend>
        <div className="flex flex-col gap-4">
          <SelectField id={id('enclosureId')} label="Enclosure" value={values.enclosureId} onChange={set('enclosureId')} error={errors.enclosureId}>
            <option value="">Not recorded</option>
            {enclosures.data?.data.map((e) => (
              <option key={e.id} value={e.id}>
                {e.name} — {bufferingText(e.alkalineBuffered)}, PAT {PAT_RESULT.labels[e.patResult].toLowerCase()}
              </option>
            ))}
          </SelectField>
          {props.mode === 'create' ? (
            <SelectField
              id={id('locationId')}
              label="Location"
              value={values.locationId}
              onChange={set('locationId')}
              error={errors.locationId}
              hint="Where the print is placed first; recorded as its first movement."
            >
              <option value="">Not recorded</option>
              {locations.data?.data.map((l) => (
                <option key={l.id} value={l.id}>
                  {l.pathLabel}
                </option>
              ))}
            </SelectField>
          ) : (
            <p className="text-sm text-ink-700">
              Location: {base?.location?.pathLabel ?? 'not recorded'}. To change it, use Move on the print's page, so the movement is recorded.
            </p>
          )}
        </div>
        <WarningsPanel
          title="Warnings preview"
          warnings={warnings}
          live
          intro={
            props.mode === 'create'
              ? 'Worked out as you choose, with the rules applied on save. Toner classes come from the process history, which is added after the print is saved.'
              : "Worked out as you choose, with the rules applied on save, using this print's process history."
          }
          empty="No warnings with these choices."
        />
      </fieldset>

      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4">
        <legend className="px-1 font-serif text-lg font-semibold">Inscriptions, provenance and credit</legend>
        <TextAreaField id={id('inscriptions')} label="Inscriptions" value={values.inscriptions} onChange={set('inscriptions')} error={errors.inscriptions} maxLength={5000} />
        <TextAreaField id={id('provenance')} label="Provenance" value={values.provenance} onChange={set('provenance')} error={errors.provenance} maxLength={5000} />
        <TextField id={id('creditLine')} label="Credit line" value={values.creditLine} onChange={set('creditLine')} error={errors.creditLine} maxLength={500} />
      </fieldset>

      <fieldset className="grid gap-4 rounded border border-paper-300 bg-white p-4 sm:grid-cols-2">
        <legend className="px-1 font-serif text-lg font-semibold">Staff only</legend>
        <p className="text-xs text-ink-700 sm:col-span-2">Staff notes and valuation are not shown to viewers.</p>
        <TextAreaField
          id={id('staffNotes')}
          label="Staff notes"
          value={values.staffNotes}
          onChange={set('staffNotes')}
          error={errors.staffNotes}
          fieldClassName="sm:col-span-2"
          maxLength={10000}
        />
        <TextField
          id={id('valuationAmount')}
          label="Valuation amount"
          value={values.valuationAmount}
          onChange={set('valuationAmount')}
          error={errors.valuationAmount}
          inputMode="decimal"
          className="num"
        />
        <TextField
          id={id('valuationCurrency')}
          label="Valuation currency"
          value={values.valuationCurrency}
          onChange={set('valuationCurrency')}
          error={errors.valuationCurrency}
          hint="Three-letter code, e.g. GBP, EUR"
          maxLength={3}
          className="mono uppercase"
        />
      </fieldset>

      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" disabled={mutation.isPending || conflict !== null}>
          {mutation.isPending ? 'Saving…' : 'Save'}
        </Button>
        <Link to={props.cancelTo} className={buttonClasses('quiet', 'md', 'no-underline')}>
          Cancel
        </Link>
      </div>
    </form>
  );
}
