import { useEffect, useId, useState, type FormEvent } from 'react';
import { printSchema, staleEditDetailsSchema, type Print } from '@toneledger/common/schemas/catalogue';
import { STEP_TYPE, THIOSULFATE_METHOD, TONER_CLASS, TONING_EXTENT } from '@toneledger/common/schemas/vocab';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { TextAreaField } from '@/components/ui/text-area-field';
import { isApiError } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import { useRecipes } from '@/lib/reference-api';
import { useReplaceSteps } from '@/features/catalogue/api/replace-steps';
import { ChemistryCaution } from '@/features/catalogue/components/chemistry-caution';
import {
  AGENT_LABELS,
  STEP_FIELDS,
  checkSteps,
  emptyStep,
  issuesToStepErrors,
  moveItem,
  stepToDraft,
  type StepDraft,
  type StepErrors,
  type StepField,
  type StepType,
} from '@/features/catalogue/utils/steps';

interface Conflict {
  current: Print;
  lastChangedBy: string | null;
  lastChangedAt: string | null;
}

type Focus = { key: string; control: 'up' | 'down' | 'first' } | { key: null; control: 'add' } | null;

function sortedDrafts(print: Print): StepDraft[] {
  return [...print.steps].sort((a, b) => a.position - b.position).map(stepToDraft);
}

function StepFields({
  draft,
  index,
  errors,
  onChange,
}: {
  draft: StepDraft;
  index: number;
  errors: StepErrors;
  onChange: (field: StepField, value: string) => void;
}) {
  const recipes = useRecipes();
  const fields = STEP_FIELDS[draft.type];
  const error = (field: StepField) => errors[`${index}.${field}`];
  const bind = (field: StepField) => ({
    id: `${draft.key}-${field}`,
    value: draft[field],
    error: error(field),
    onChange: (event: { target: { value: string } }) => onChange(field, event.target.value),
  });
  return (
    <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
      {fields.includes('tonerClass') ? (
        <SelectField label="Toner class" {...bind('tonerClass')}>
          <option value="">Choose…</option>
          {TONER_CLASS.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
      ) : null}
      {fields.includes('recipeId') ? (
        <SelectField label="Recipe" {...bind('recipeId')} hint="Bath recipes are kept under Bath recipes.">
          <option value="">No recipe recorded</option>
          {recipes.data?.data.map((r) => (
            <option key={r.id} value={r.id}>
              {r.name}
            </option>
          ))}
        </SelectField>
      ) : null}
      {fields.includes('method') ? (
        <SelectField label="Test method" {...bind('method')}>
          <option value="">Choose…</option>
          {THIOSULFATE_METHOD.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
      ) : null}
      {fields.includes('value') ? <TextField label="Measured value" inputMode="decimal" className="num" {...bind('value')} /> : null}
      {fields.includes('unit') ? <TextField label="Unit" hint="As reported, e.g. µg/cm²" maxLength={50} {...bind('unit')} /> : null}
      {fields.includes('agent') ? <TextField label={AGENT_LABELS[draft.type]} maxLength={200} {...bind('agent')} /> : null}
      {fields.includes('dilution') ? <TextField label="Dilution" hint="e.g. 1+9" maxLength={50} {...bind('dilution')} /> : null}
      {fields.includes('concentration') ? <TextField label="Concentration" hint="e.g. 2 g/L" maxLength={100} {...bind('concentration')} /> : null}
      {fields.includes('time') ? (
        <TextField label="Time (m:ss or seconds)" className="num" inputMode="numeric" {...bind('time')} error={error('time')} />
      ) : null}
      {fields.includes('temperatureC') ? <TextField label="Temperature (°C)" className="num" inputMode="decimal" {...bind('temperatureC')} /> : null}
      {fields.includes('extent') ? (
        <SelectField label="Extent" {...bind('extent')}>
          <option value="">Not recorded</option>
          {TONING_EXTENT.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
      ) : null}
      {fields.includes('alkaline') ? (
        <SelectField label="Alkaline" {...bind('alkaline')}>
          <option value="unknown">Unknown</option>
          <option value="yes">Yes</option>
          <option value="no">No</option>
        </SelectField>
      ) : null}
      {fields.includes('notes') ? <TextAreaField label="Notes" rows={2} fieldClassName="sm:col-span-2 lg:col-span-4" maxLength={2000} {...bind('notes')} /> : null}
      {draft.type === 'residual_thiosulfate_test' ? (
        <p className="text-xs text-ink-700 sm:col-span-2 lg:col-span-4">
          The result is recorded as measured. Toneledger does not judge it as a pass or a fail.
        </p>
      ) : null}
    </div>
  );
}

export interface StepsEditorProps {
  print: Print;
  onSaved: (print: Print) => void;
  onCancel: () => void;
}

/**
 * The ordered process history of one print. Steps are added, removed and moved with buttons
 * (keyboard and pointer alike); saving sends the whole list with the version it started from.
 */
export function StepsEditor({ print, onSaved, onCancel }: StepsEditorProps) {
  const [drafts, setDrafts] = useState<StepDraft[]>(() => sortedDrafts(print));
  const [version, setVersion] = useState(print.version);
  const [errors, setErrors] = useState<StepErrors>({});
  const [conflict, setConflict] = useState<Conflict | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [addType, setAddType] = useState<StepType>('development');
  const [focus, setFocus] = useState<Focus>(null);
  const save = useReplaceSteps();
  const baseId = `steps${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  const addId = `${baseId}-add-type`;
  const addButtonId = `${baseId}-add`;
  const controlId = (key: string, control: 'up' | 'down' | 'first') => `${baseId}-${key}-${control === 'first' ? 'type' : control}`;

  // After a step is added, moved or removed, focus goes where the person's attention is.
  useEffect(() => {
    if (!focus) return;
    const target = focus.key === null ? addButtonId : controlId(focus.key, focus.control);
    document.getElementById(target)?.focus();
    setFocus(null);
  }, [focus, drafts]); // eslint-disable-line react-hooks/exhaustive-deps

  function edit(index: number, field: StepField, value: string) {
    setDrafts((list) => list.map((d, i) => (i === index ? { ...d, [field]: value } : d)));
  }

  function changeType(index: number, type: StepType) {
    // Fields of the old kind that the new kind does not record are cleared, so nothing hidden is sent.
    setDrafts((list) =>
      list.map((d, i) => {
        if (i !== index) return d;
        const next = { ...emptyStep(type), key: d.key };
        for (const field of STEP_FIELDS[type]) if (STEP_FIELDS[d.type].includes(field)) (next[field] as string) = d[field];
        return next;
      }),
    );
    setErrors({});
  }

  function move(index: number, delta: number) {
    const key = drafts[index]?.key;
    if (!key) return;
    setDrafts((list) => moveItem(list, index, delta));
    setErrors({});
    const newIndex = index + delta;
    // Keep focus on the same button of the moved step, or on the other one when it reached an end.
    const atEdge = newIndex === 0 || newIndex === drafts.length - 1;
    const control = delta < 0 ? (atEdge ? 'down' : 'up') : atEdge ? 'up' : 'down';
    setFocus({ key, control });
  }

  function remove(index: number) {
    const next = drafts[index + 1] ?? drafts[index - 1];
    setDrafts((list) => list.filter((_, i) => i !== index));
    setErrors({});
    setFocus(next ? { key: next.key, control: 'first' } : { key: null, control: 'add' });
  }

  function add() {
    const step = emptyStep(addType);
    setDrafts((list) => [...list, step]);
    setErrors({});
    setFocus({ key: step.key, control: 'first' });
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    setNotice(null);
    save.reset();
    const checked = checkSteps(drafts, version);
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    save.mutate(
      { printId: print.id, body: checked.data },
      {
        onSuccess: onSaved,
        onError: (error) => {
          if (!isApiError(error)) return;
          if (error.code === 'conflict') {
            const stale = staleEditDetailsSchema.safeParse(error.details);
            const current = stale.success ? printSchema.safeParse(stale.data.current) : null;
            if (stale.success && current?.success) {
              setConflict({ current: current.data, lastChangedBy: stale.data.lastChangedBy, lastChangedAt: stale.data.lastChangedAt });
              return;
            }
          }
          if (Array.isArray(error.details)) {
            const issues = (error.details as unknown[]).flatMap((d) =>
              typeof d === 'object' && d !== null && typeof (d as { message?: unknown }).message === 'string'
                ? [{ path: String((d as { path?: unknown }).path ?? ''), message: (d as { message: string }).message }]
                : [],
            );
            setErrors(issuesToStepErrors(issues));
          }
        },
      },
    );
  }

  function keepMine() {
    if (!conflict) return;
    setVersion(conflict.current.version);
    setConflict(null);
    save.reset();
    setNotice(`Your list will be saved over version ${conflict.current.version}. Check it, then press Save process history.`);
  }

  function loadCurrent() {
    if (!conflict) return;
    setDrafts(sortedDrafts(conflict.current));
    setVersion(conflict.current.version);
    setConflict(null);
    setErrors({});
    save.reset();
    setNotice(`The list now shows version ${conflict.current.version}. Your edits were discarded.`);
  }

  const errorCount = Object.keys(errors).length;
  const formError = errors.form;
  const otherError = save.isError && !conflict && errorCount === 0;

  return (
    <form onSubmit={submit} noValidate aria-label="Process history" className="flex max-w-5xl flex-col gap-4">
      <ChemistryCaution />
      {conflict ? (
        <section role="alert" aria-label="Changed since you opened it" className="rounded border border-sepia-200 bg-sepia-50 p-4 text-sm">
          <h2 className="font-sans text-base font-semibold text-sepia-800">Not saved: this print was changed while you were editing</h2>
          <p className="mt-1">
            {conflict.lastChangedBy ?? 'Someone'} saved it{conflict.lastChangedAt ? ` on ${formatDateTime(conflict.lastChangedAt)}` : ''} (now version{' '}
            {conflict.current.version}). Your list is still here, unsaved. Its process history is now:
          </p>
          {conflict.current.steps.length ? (
            <ol className="mt-2 list-decimal pl-6">
              {[...conflict.current.steps]
                .sort((a, b) => a.position - b.position)
                .map((s) => (
                  <li key={s.id}>
                    {STEP_TYPE.labels[s.type]}
                    {s.tonerClass ? ` — ${TONER_CLASS.labels[s.tonerClass]}` : ''}
                    {s.recipe ? ` (${s.recipe.name})` : ''}
                    {s.agent ? ` — ${s.agent}` : ''}
                  </li>
                ))}
            </ol>
          ) : (
            <p className="mt-2">No steps.</p>
          )}
          <div className="mt-3 flex flex-wrap gap-2">
            <Button variant="primary" onClick={keepMine}>
              Keep my list and save it over version {conflict.current.version}
            </Button>
            <Button onClick={loadCurrent}>Discard my list and load the current one</Button>
          </div>
        </section>
      ) : null}
      {notice ? (
        <Notice tone="info" role="status">
          <p>{notice}</p>
        </Notice>
      ) : null}
      {errorCount > 0 ? (
        <Notice tone="error" role="alert" title={`Not saved: ${errorCount === 1 ? 'one field needs' : `${errorCount} fields need`} attention.`}>
          {formError ? <p>{formError}</p> : <p>The fields are marked below.</p>}
        </Notice>
      ) : null}
      {otherError ? <ErrorNotice error={save.error} title="Not saved." /> : null}

      {drafts.length === 0 ? <p className="text-sm text-ink-700">No steps yet. Add the first one below.</p> : null}
      <ol className="flex flex-col gap-3" aria-label="Steps in order">
        {drafts.map((draft, index) => {
          const label = `step ${index + 1} (${STEP_TYPE.labels[draft.type]})`;
          return (
            <li key={draft.key} className="rounded border border-paper-300 bg-white p-3" aria-label={`Step ${index + 1}: ${STEP_TYPE.labels[draft.type]}`}>
              <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
                <div className="flex items-end gap-3">
                  <span className="num pb-2 font-serif text-lg font-semibold text-ink-900" aria-hidden="true">
                    {index + 1}.
                  </span>
                  <SelectField
                    id={controlId(draft.key, 'first')}
                    label="Step type"
                    value={draft.type}
                    onChange={(event) => changeType(index, event.target.value as StepType)}
                    error={errors[`${index}.type`]}
                    fieldClassName="w-60"
                  >
                    {STEP_TYPE.options.map((o) => (
                      <option key={o.value} value={o.value}>
                        {o.label}
                      </option>
                    ))}
                  </SelectField>
                </div>
                <div className="flex gap-1" role="group" aria-label={`Arrange ${label}`}>
                  <Button size="sm" id={controlId(draft.key, 'up')} aria-label={`Move up: ${label}`} disabled={index === 0} onClick={() => move(index, -1)}>
                    <span aria-hidden="true">↑</span> Move up
                  </Button>
                  <Button
                    size="sm"
                    id={controlId(draft.key, 'down')}
                    aria-label={`Move down: ${label}`}
                    disabled={index === drafts.length - 1}
                    onClick={() => move(index, 1)}
                  >
                    <span aria-hidden="true">↓</span> Move down
                  </Button>
                  <Button size="sm" variant="quiet" aria-label={`Remove: ${label}`} onClick={() => remove(index)}>
                    Remove
                  </Button>
                </div>
              </div>
              <StepFields draft={draft} index={index} errors={errors} onChange={(field, value) => edit(index, field, value)} />
            </li>
          );
        })}
      </ol>

      <div className="flex flex-wrap items-end gap-3 rounded border border-dashed border-paper-400 p-3">
        <SelectField id={addId} label="Kind of step to add" value={addType} onChange={(event) => setAddType(event.target.value as StepType)} fieldClassName="w-60">
          {STEP_TYPE.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <Button id={addButtonId} onClick={add}>
          Add step
        </Button>
      </div>

      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" disabled={save.isPending || conflict !== null}>
          {save.isPending ? 'Saving…' : 'Save process history'}
        </Button>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
