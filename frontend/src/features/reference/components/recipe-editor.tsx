import { useFieldArray, useWatch, useFormContext } from 'react-hook-form';
import { recipeInputSchema, recipeSchema, type Recipe } from '@toneledger/common/schemas/catalogue';
import { INGREDIENT_UNIT, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { NumberInput, SelectInput, TextAreaInput, TextInput, useFieldError } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { fieldList } from '@/lib/forms/stale-edit';
import { useSaveRecipe } from '@/features/reference/api/save-recipe';
import { FormActions } from '@/features/reference/components/form-actions';
import { NormalisedTable } from '@/features/reference/components/normalised-table';
import { RecipeCautions } from '@/features/reference/components/recipe-cautions';
import { livePreview, type IngredientRow, type RecipeValues } from '@/features/reference/components/recipe-preview';
import { useRecordForm } from '@/features/reference/components/use-record-form';

const LABELS: Record<keyof RecipeValues, string> = {
  name: 'Name',
  tonerClass: 'Toner',
  volumeMl: 'Final volume (ml)',
  ingredients: 'Ingredients',
  mixingNotes: 'Mixing notes',
};
const INGREDIENT_LABELS: Record<string, string> = {
  chemical: 'chemical',
  amount: 'amount',
  unit: 'unit',
  strengthPercent: 'strength',
  densityGPerMl: 'density',
};

export function recipeFieldLabel(path: string): string {
  const m = /^ingredients\.(\d+)(?:\.(\w+))?$/.exec(path);
  if (m) return `Ingredient ${Number(m[1]) + 1}${m[2] ? `, ${INGREDIENT_LABELS[m[2]] ?? m[2]}` : ''}`;
  return LABELS[path as keyof RecipeValues] ?? path;
}

const text = (value: number | null | undefined) => (value === null || value === undefined ? '' : String(value));
const emptyRow = (): IngredientRow => ({ chemical: '', amount: '', unit: 'g', strengthPercent: '', densityGPerMl: '' });

function toValues(recipe: Recipe | null): RecipeValues {
  return {
    name: recipe?.name ?? '',
    tonerClass: recipe?.tonerClass ?? '',
    volumeMl: text(recipe?.volumeMl),
    ingredients: recipe
      ? recipe.ingredients.map((i) => ({
          chemical: i.chemical,
          amount: text(i.amount),
          unit: i.unit,
          strengthPercent: text(i.strengthPercent),
          densityGPerMl: text(i.densityGPerMl),
        }))
      : [emptyRow()],
    mixingNotes: recipe?.mixingNotes ?? '',
  };
}

/** The body: "not stated" is no toner class. Figures stay as typed; the schema reads them. */
function toBody(values: RecipeValues) {
  return { ...values, tonerClass: values.tonerClass || null };
}

function describe(key: string, values: RecipeValues): string {
  if (key === 'ingredients') {
    return values.ingredients.map((r) => `${r.chemical || '?'} ${r.amount} ${r.unit}${r.strengthPercent ? ` (${r.strengthPercent} %)` : ''}`).join('; ');
  }
  if (key === 'tonerClass') return values.tonerClass ? (TONER_CLASS.labels[values.tonerClass as keyof typeof TONER_CLASS.labels] ?? values.tonerClass) : 'Not stated';
  return values[key as 'name' | 'volumeMl' | 'mixingNotes'] ?? '';
}

/** Per-litre amounts and cautions of the recipe as typed. */
function Preview() {
  const values = useWatch<RecipeValues>() as RecipeValues;
  const preview = livePreview({ ...values, ingredients: values.ingredients ?? [] });
  return (
    <>
      <RecipeCautions cautions={preview.cautions} live />
      <section aria-labelledby="recipe-preview" className="flex flex-col gap-2">
        <h2 id="recipe-preview" className="text-lg">
          Per litre of working bath (preview)
        </h2>
        {preview.messages.length > 0 ? (
          <ul className="list-disc pl-5 text-sm text-ink-700">
            {preview.messages.map((message) => (
              <li key={message}>{message}</li>
            ))}
          </ul>
        ) : null}
        {preview.normalised ? <NormalisedTable rows={preview.normalised} caption="Preview: ingredients per litre of working bath" /> : null}
      </section>
    </>
  );
}

function Ingredients() {
  const { control } = useFormContext<RecipeValues>();
  const { fields, append, remove, move } = useFieldArray({ control, name: 'ingredients' });
  const listError = useFieldError('ingredients');

  function moveRow(index: number, by: -1 | 1) {
    const target = index + by;
    if (target < 0 || target >= fields.length) return;
    const key = fields[index]!.id;
    move(index, target);
    requestAnimationFrame(() => document.getElementById(`${key}-${by < 0 ? 'up' : 'down'}`)?.focus());
  }

  function addRow() {
    append(emptyRow(), { shouldFocus: false });
    // Focus the new row's chemical once it exists.
    requestAnimationFrame(() => document.querySelector<HTMLElement>(`[name="ingredients.${fields.length}.chemical"]`)?.focus());
  }

  return (
    <section aria-labelledby="recipe-ingredients" className="flex flex-col gap-2">
      <h2 id="recipe-ingredients" className="text-lg">
        Ingredients
      </h2>
      <p className="text-sm text-ink-700">
        Strength is % w/w for a solution (28 for 28 % acetic acid); leave it empty for a pure substance. A volume needs its density to be counted as
        a mass.
      </p>
      {listError ? <p className="text-sm font-medium text-danger-700">{listError}</p> : null}
      <ol className="flex flex-col gap-2">
        {fields.map((row, index) => (
          <li
            key={row.id}
            role="group"
            aria-label={`Ingredient ${index + 1}`}
            className="grid items-start gap-2 rounded border border-paper-300 bg-white p-2.5 sm:grid-cols-[2rem_minmax(10rem,3fr)_minmax(5rem,1fr)_5.5rem_minmax(5rem,1fr)_minmax(5rem,1fr)_auto]"
          >
            <span className="num pt-7 text-sm font-semibold text-ink-700" aria-hidden="true">
              {index + 1}.
            </span>
            <TextInput name={`ingredients.${index}.chemical`} label="Chemical" />
            <NumberInput name={`ingredients.${index}.amount`} label="Amount" />
            <SelectInput name={`ingredients.${index}.unit`} label="Unit" options={INGREDIENT_UNIT.options} />
            <NumberInput name={`ingredients.${index}.strengthPercent`} label="Strength (%)" placeholder="pure" />
            <NumberInput name={`ingredients.${index}.densityGPerMl`} label="Density (g/ml)" />
            <div className="flex gap-1 pt-5">
              <Button id={`${row.id}-up`} size="sm" variant="quiet" onClick={() => moveRow(index, -1)} disabled={index === 0} aria-label={`Move ingredient ${index + 1} up`}>
                <span aria-hidden="true">↑</span>
              </Button>
              <Button
                id={`${row.id}-down`}
                size="sm"
                variant="quiet"
                onClick={() => moveRow(index, 1)}
                disabled={index === fields.length - 1}
                aria-label={`Move ingredient ${index + 1} down`}
              >
                <span aria-hidden="true">↓</span>
              </Button>
              <Button size="sm" variant="quiet" onClick={() => remove(index)} aria-label={`Remove ingredient ${index + 1}`}>
                Remove
              </Button>
            </div>
          </li>
        ))}
      </ol>
      <div>
        <Button size="sm" onClick={addRow} disabled={fields.length >= 40}>
          Add ingredient
        </Button>
      </div>
    </section>
  );
}

export interface RecipeEditorProps {
  recipe: Recipe | null;
  onSaved: (recipe: Recipe, created: boolean) => void;
  onCancel: () => void;
}

/** Create or edit a bath recipe, with its per-litre amounts and cautions shown live. */
export function RecipeEditor({ recipe, onSaved, onCancel }: RecipeEditorProps) {
  const save = useSaveRecipe();
  const { form, edit, onValid, saving } = useRecordForm({
    record: recipe,
    schema: recipeInputSchema,
    recordSchema: recipeSchema,
    toValues,
    toBody,
    describe,
    fields: fieldList(LABELS),
    save,
    onSaved,
  });

  return (
    <SchemaForm form={form} edit={edit} onValid={onValid} labelFor={recipeFieldLabel} className="max-w-5xl gap-5">
      <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)]">
        <TextInput name="name" label={LABELS.name} required />
        <SelectInput name="tonerClass" label={LABELS.tonerClass} empty="Not stated" options={TONER_CLASS.options} />
        <NumberInput name="volumeMl" label={LABELS.volumeMl} hint="Made up to this volume with water" required />
      </div>
      <Ingredients />
      <Preview />
      <TextAreaInput name="mixingNotes" label={LABELS.mixingNotes} hint="Order of mixing, temperature, how long it keeps" rows={4} />
      <FormActions saving={saving} onCancel={onCancel} />
    </SchemaForm>
  );
}
