import { useEffect, useRef, useState } from 'react';
import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { printSchema, stepsReplaceSchema, type Print } from '@toneledger/common/schemas/catalogue';
import { isHazardous } from '@toneledger/common/domain/toner-chemicals';
import { STEP_TYPE, THIOSULFATE_METHOD, TONER_CLASS, TONING_EXTENT } from '@toneledger/common/schemas/vocab';
import { NumberInput, SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { useFieldId } from '@/components/form/form-context';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { StepRecipeCautions } from '@/components/safety/ingredient-hazards';
import { SelectField } from '@/components/ui/field';
import { useRecordEdit } from '@/lib/forms/use-record-edit';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useRecipes } from '@/lib/reference-api';
import { useReplaceSteps } from '@/features/catalogue/api/replace-steps';
import { ChemistryCaution } from '@/features/catalogue/components/chemistry-caution';
import {
  AGENT_LABELS,
  FIELDS_BY_KIND,
  describeStep,
  emptyStep,
  printToStepsValues,
  stepFieldFor,
  stepToBody,
  type StepType,
  type StepsValues,
} from '@/features/catalogue/utils/steps';

type Focus = { key: string; control: 'up' | 'down' | 'first' } | { key: null; control: 'add' } | null;

const ALKALINE = [
  { value: 'unknown', label: 'Unknown' },
  { value: 'yes', label: 'Yes' },
  { value: 'no', label: 'No' },
];

/** "Step 2: Time (m:ss or seconds)" in the error summary. */
function stepLabel(path: string, label: string | null): string | null {
  const m = /^steps\.(\d+)\./.exec(path);
  return m ? `Step ${Number(m[1]) + 1}: ${label ?? 'step'}` : null;
}

function StepFields({ index }: { index: number }) {
  const recipes = useRecipes();
  const type = useWatch<StepsValues, `steps.${number}.type`>({ name: `steps.${index}.type` });
  const recipeId = useWatch<StepsValues, `steps.${number}.recipeId`>({ name: `steps.${index}.recipeId` });
  const fields = FIELDS_BY_KIND[type];
  const chosen = fields.includes('recipeId') && recipeId ? recipes.data?.data.find((r) => r.id === recipeId) : undefined;
  const name = (field: string) => `steps.${index}.${field}`;
  return (
    <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
      {fields.includes('tonerClass') ? <SelectInput name={name('tonerClass')} label="Toner" empty="Choose…" options={TONER_CLASS.options} /> : null}
      {fields.includes('recipeId') ? (
        <SelectInput
          name={name('recipeId')}
          label="Recipe"
          hint="Bath recipes are kept under Bath recipes."
          empty="No recipe recorded"
          options={recipes.data?.data.map((r) => ({ value: r.id, label: isHazardous(r.ingredients) ? `${r.name} (⚠ hazardous)` : r.name }))}
        />
      ) : null}
      {chosen ? <StepRecipeCautions recipe={chosen} /> : null}
      {fields.includes('method') ? <SelectInput name={name('method')} label="Test method" empty="Choose…" options={THIOSULFATE_METHOD.options} /> : null}
      {fields.includes('value') ? <NumberInput name={name('value')} label="Measured value" /> : null}
      {fields.includes('unit') ? <TextInput name={name('unit')} label="Unit" hint="As reported, e.g. µg/cm²" /> : null}
      {fields.includes('agent') ? <TextInput name={name('agent')} label={AGENT_LABELS[type]} /> : null}
      {fields.includes('dilution') ? <TextInput name={name('dilution')} label="Dilution" hint="e.g. 1+9" /> : null}
      {fields.includes('concentration') ? <TextInput name={name('concentration')} label="Concentration" hint="e.g. 2 g/L" /> : null}
      {fields.includes('timeSeconds') ? <NumberInput name={name('timeSeconds')} label="Time (m:ss or seconds)" inputMode="numeric" /> : null}
      {fields.includes('temperatureC') ? <NumberInput name={name('temperatureC')} label="Temperature (°C)" /> : null}
      {fields.includes('extent') ? <SelectInput name={name('extent')} label="Extent" empty="Not recorded" options={TONING_EXTENT.options} /> : null}
      {fields.includes('alkaline') ? <SelectInput name={name('alkaline')} label="Alkaline" options={ALKALINE} /> : null}
      {fields.includes('notes') ? <TextAreaInput name={name('notes')} label="Notes" rows={2} fieldClassName="sm:col-span-2 lg:col-span-4" /> : null}
      {type === 'residual_thiosulfate_test' ? (
        <p className="text-xs text-ink-700 sm:col-span-2 lg:col-span-4">The result is recorded as measured. Toneledger does not judge it as a pass or a fail.</p>
      ) : null}
    </div>
  );
}

function StepList() {
  const { control, getValues, setValue, clearErrors } = useFormContext<StepsValues>();
  const { fields, append, remove, move } = useFieldArray({ control, name: 'steps' });
  const steps = useWatch({ control, name: 'steps' }) ?? [];
  const [addType, setAddType] = useState<StepType>('development');
  const [focus, setFocus] = useState<Focus>(null);
  const baseId = useFieldId('steps');
  const controlId = (key: string, control: 'up' | 'down' | 'first') => `${baseId}-${key}-${control === 'first' ? 'type' : control}`;
  const addButtonId = `${baseId}-add`;

  // After a step is added, moved or removed, focus goes where the person's attention is.
  useEffect(() => {
    if (!focus) return;
    document.getElementById(focus.key === null ? addButtonId : controlId(focus.key, focus.control))?.focus();
    setFocus(null);
  }, [focus, fields]); // eslint-disable-line react-hooks/exhaustive-deps

  function changeType(index: number, type: StepType) {
    // Fields of the old kind that the new kind does not record are cleared, so nothing hidden is kept.
    const old = getValues(`steps.${index}`);
    const next = emptyStep(type);
    for (const field of FIELDS_BY_KIND[type]) if (FIELDS_BY_KIND[old.type].includes(field)) (next[field] as string) = old[field];
    setValue(`steps.${index}`, next);
    clearErrors(`steps.${index}`);
  }

  function shift(index: number, delta: number) {
    const key = fields[index]?.id;
    if (!key) return;
    move(index, index + delta);
    const newIndex = index + delta;
    // Keep focus on the same button of the moved step, or on the other one when it reached an end.
    const atEdge = newIndex === 0 || newIndex === fields.length - 1;
    setFocus({ key, control: delta < 0 ? (atEdge ? 'down' : 'up') : atEdge ? 'up' : 'down' });
  }

  function drop(index: number) {
    const next = fields[index + 1] ?? fields[index - 1];
    remove(index);
    setFocus(next ? { key: next.id, control: 'first' } : { key: null, control: 'add' });
  }

  function add() {
    append(emptyStep(addType), { shouldFocus: false });
    setFocus({ key: '__new', control: 'first' });
  }

  // The id of a step just added is known only once it is rendered.
  useEffect(() => {
    if (focus?.key === '__new' && fields.length > 0) setFocus({ key: fields[fields.length - 1]!.id, control: 'first' });
  }, [focus, fields]);

  return (
    <>
      {fields.length === 0 ? <p className="text-sm text-ink-700">No steps yet. Add the first one below.</p> : null}
      <ol className="flex flex-col gap-3" aria-label="Steps in order">
        {fields.map((field, index) => {
          const type = steps[index]?.type ?? field.type;
          const label = `step ${index + 1} (${STEP_TYPE.labels[type]})`;
          return (
            <li key={field.id} className="rounded border border-paper-300 bg-white p-3" aria-label={`Step ${index + 1}: ${STEP_TYPE.labels[type]}`}>
              <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
                <div className="flex items-end gap-3">
                  <span className="num pb-2 font-serif text-lg font-semibold text-ink-900" aria-hidden="true">
                    {index + 1}.
                  </span>
                  <SelectInput
                    id={controlId(field.id, 'first')}
                    name={`steps.${index}.type`}
                    label="Step type"
                    options={STEP_TYPE.options}
                    fieldClassName="w-60"
                    onChangeValue={(value) => changeType(index, value as StepType)}
                  />
                </div>
                <div className="flex gap-1" role="group" aria-label={`Arrange ${label}`}>
                  <Button size="sm" id={controlId(field.id, 'up')} aria-label={`Move up: ${label}`} disabled={index === 0} onClick={() => shift(index, -1)}>
                    <span aria-hidden="true">↑</span> Move up
                  </Button>
                  <Button
                    size="sm"
                    id={controlId(field.id, 'down')}
                    aria-label={`Move down: ${label}`}
                    disabled={index === fields.length - 1}
                    onClick={() => shift(index, 1)}
                  >
                    <span aria-hidden="true">↓</span> Move down
                  </Button>
                  <Button size="sm" variant="quiet" aria-label={`Remove: ${label}`} onClick={() => drop(index)}>
                    Remove
                  </Button>
                </div>
              </div>
              <StepFields index={index} />
            </li>
          );
        })}
      </ol>
      <div className="flex flex-wrap items-end gap-3 rounded border border-dashed border-paper-400 p-3">
        <SelectField id={`${baseId}-add-type`} label="Kind of step to add" value={addType} onChange={(event) => setAddType(event.target.value as StepType)} fieldClassName="w-60">
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
    </>
  );
}

export interface StepsEditorProps {
  print: Print;
  onSaved: (print: Print) => void;
  onCancel: () => void;
}

/**
 * The ordered process history of one print. Steps are added, removed and moved with buttons
 * (keyboard and pointer alike); saving sends the whole list with the version it started from. If
 * the print was saved elsewhere meanwhile, the stale-edit review shows both lists.
 */
export function StepsEditor({ print, onSaved, onCancel }: StepsEditorProps) {
  const save = useReplaceSteps();
  const recipes = useRecipes();
  const recipeName = (id: string) => recipes.data?.data.find((r) => r.id === id)?.name;
  const baseVersion = useRef(print.version);
  const form = useSchemaForm({
    schema: stepsReplaceSchema,
    defaultValues: printToStepsValues(print),
    // The body: each step with the fields of its kind only, on the version the list started from.
    toBody: (values: StepsValues) => ({ version: baseVersion.current, steps: values.steps.map(stepToBody) }),
    fieldFor: stepFieldFor,
  });
  const edit = useRecordEdit(form, {
    record: print,
    recordSchema: printSchema,
    toValues: printToStepsValues,
    fields: [{ key: 'steps', label: 'Process history' }],
    comparable: (values) => ({ steps: values.steps.map(stepToBody) }),
    describe: (_key, values) => values.steps.map((step) => describeStep(step, recipeName)),
  });
  baseVersion.current = edit.base?.version ?? print.version;

  function onValid(body: z.output<typeof stepsReplaceSchema>) {
    save.mutate(
      { printId: print.id, body },
      {
        onSuccess: onSaved,
        onError: edit.failed,
      },
    );
  }

  return (
    <SchemaForm form={form} edit={edit} subject="this print" onValid={onValid} labelFor={stepLabel} aria-label="Process history" className="max-w-5xl gap-4">
      <ChemistryCaution />
      <StepList />
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" disabled={save.isPending || edit.conflict !== null}>
          {save.isPending ? 'Saving…' : 'Save process history'}
        </Button>
        <Button variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </SchemaForm>
  );
}
