import { useId, useRef } from 'react';
import {
  normaliseRecipe,
  recipeCautions,
  type Ingredient,
  type NormalisedIngredient,
} from '@toneledger/common/domain/recipes';
import { recipeInputSchema, recipeSchema, type Recipe } from '@toneledger/common/schemas/catalogue';
import { INGREDIENT_UNIT, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { TextAreaField } from '@/components/ui/text-area-field';
import { useSaveRecipe } from '@/features/reference/api/save-recipe';
import { FormActions, FormMessages } from '@/features/reference/components/form-messages';
import { NormalisedTable } from '@/features/reference/components/normalised-table';
import { RecipeCautions } from '@/features/reference/components/recipe-cautions';
import { readNumber } from '@/features/reference/components/recipe-format';
import { useRecordForm } from '@/features/reference/components/use-record-form';

type Unit = (typeof INGREDIENT_UNIT.codes)[number];

export interface IngredientRow {
  /** Identifies the row while it is edited and moved; never sent. */
  key: string;
  chemical: string;
  amount: string;
  unit: Unit;
  strengthPercent: string;
  densityGPerMl: string;
}

export interface RecipeDraft extends Record<string, unknown> {
  name: string;
  tonerClass: string;
  volumeMl: string;
  ingredients: IngredientRow[];
  mixingNotes: string;
}

const FIELD_LABELS: Record<string, string> = {
  name: 'Name',
  tonerClass: 'Toner class',
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
  return FIELD_LABELS[path] ?? path;
}

const text = (value: number | null | undefined) => (value === null || value === undefined ? '' : String(value));

function toDraft(recipe: Recipe | null): RecipeDraft {
  return {
    name: recipe?.name ?? '',
    tonerClass: recipe?.tonerClass ?? '',
    volumeMl: text(recipe?.volumeMl),
    ingredients: recipe
      ? recipe.ingredients.map((i, index) => ({
          key: `saved-${index}`,
          chemical: i.chemical,
          amount: text(i.amount),
          unit: i.unit,
          strengthPercent: text(i.strengthPercent),
          densityGPerMl: text(i.densityGPerMl),
        }))
      : [{ key: 'new-0', chemical: '', amount: '', unit: 'g', strengthPercent: '', densityGPerMl: '' }],
    mixingNotes: recipe?.mixingNotes ?? '',
  };
}

function toBody(draft: RecipeDraft) {
  return {
    name: draft.name,
    tonerClass: draft.tonerClass || null,
    volumeMl: draft.volumeMl.trim(),
    ingredients: draft.ingredients.map(({ chemical, amount, unit, strengthPercent, densityGPerMl }) => ({
      chemical,
      amount: amount.trim(),
      unit,
      strengthPercent: strengthPercent.trim(),
      densityGPerMl: densityGPerMl.trim(),
    })),
    mixingNotes: draft.mixingNotes,
  };
}

function describe(field: string, value: unknown): string {
  if (field === 'ingredients' && Array.isArray(value)) {
    const rows = value as Array<{ chemical: string; amount: string; unit: string; strengthPercent: string }>;
    return rows.map((r) => `${r.chemical || '?'} ${r.amount} ${r.unit}${r.strengthPercent ? ` (${r.strengthPercent} %)` : ''}`).join('; ');
  }
  if (field === 'tonerClass') return value ? (TONER_CLASS.labels[value as keyof typeof TONER_CLASS.labels] ?? String(value)) : 'Not stated';
  return value === '' || value == null ? '(empty)' : String(value);
}

export interface LivePreview {
  normalised: NormalisedIngredient[] | null;
  /** Why there is no per-litre table yet, or why a row is left out. */
  messages: string[];
  cautions: ReturnType<typeof recipeCautions>;
}

/** Per-litre amounts and cautions of the recipe as typed, from the same functions the server uses. */
export function livePreview(draft: RecipeDraft): LivePreview {
  const messages: string[] = [];
  const named: Ingredient[] = [];
  const complete: Ingredient[] = [];
  draft.ingredients.forEach((row, index) => {
    const chemical = row.chemical.trim();
    if (!chemical) {
      if (row.amount.trim()) messages.push(`Ingredient ${index + 1} has no chemical name yet.`);
      return;
    }
    const strength = readNumber(row.strengthPercent);
    const density = readNumber(row.densityGPerMl);
    const amount = readNumber(row.amount);
    const ingredient: Ingredient = { chemical, amount: amount ?? 0, unit: row.unit, strengthPercent: strength, densityGPerMl: density };
    named.push(ingredient);
    if (amount === null || amount <= 0) messages.push(`${chemical} is left out until it has an amount.`);
    else complete.push(ingredient);
  });
  const volume = readNumber(draft.volumeMl);
  const name = draft.name.trim() || 'New recipe';
  let normalised: NormalisedIngredient[] | null = null;
  if (volume === null || volume <= 0) {
    messages.unshift('Enter the final volume to see the amounts per litre.');
  } else if (complete.length > 0) {
    try {
      normalised = normaliseRecipe({ name, volumeMl: volume, ingredients: complete });
    } catch (error) {
      messages.unshift(error instanceof Error ? error.message : String(error));
    }
  }
  // Cautions depend on the chemicals named, not on whether their amounts are complete yet.
  const cautions = recipeCautions({
    name,
    volumeMl: volume && volume > 0 ? volume : 1000,
    ingredients: named.map((i) => ({
      ...i,
      strengthPercent: i.strengthPercent != null && i.strengthPercent > 0 && i.strengthPercent <= 100 ? i.strengthPercent : null,
    })),
  });
  return { normalised, messages, cautions };
}

export interface RecipeEditorProps {
  recipe: Recipe | null;
  onSaved: (recipe: Recipe, created: boolean) => void;
  onCancel: () => void;
}

/** Create or edit a bath recipe, with its per-litre amounts and cautions shown live. */
export function RecipeEditor({ recipe, onSaved, onCancel }: RecipeEditorProps) {
  const save = useSaveRecipe();
  const form = useRecordForm({ record: recipe, toDraft, toBody, schema: recipeInputSchema, recordSchema: recipeSchema, save, onSaved });
  const { draft, errors } = form;
  const nextKey = useRef(1);
  const ingredientsHeading = useId();
  const preview = livePreview(draft);

  function setRow(index: number, patch: Partial<IngredientRow>) {
    form.set(
      'ingredients',
      draft.ingredients.map((row, i) => (i === index ? { ...row, ...patch } : row)),
    );
  }

  function addRow() {
    const key = `new-${nextKey.current++}`;
    form.set('ingredients', [...draft.ingredients, { key, chemical: '', amount: '', unit: 'g', strengthPercent: '', densityGPerMl: '' }]);
    // Focus the new row's chemical once it exists.
    requestAnimationFrame(() => document.getElementById(`${key}-chemical`)?.focus());
  }

  function removeRow(index: number) {
    form.set(
      'ingredients',
      draft.ingredients.filter((_, i) => i !== index),
    );
  }

  function moveRow(index: number, by: -1 | 1) {
    const target = index + by;
    if (target < 0 || target >= draft.ingredients.length) return;
    const rows = [...draft.ingredients];
    const [row] = rows.splice(index, 1);
    if (!row) return;
    rows.splice(target, 0, row);
    form.set('ingredients', rows);
    requestAnimationFrame(() => document.getElementById(`${row.key}-${by < 0 ? 'up' : 'down'}`)?.focus());
  }

  const rowError = (index: number, field: string) => errors[`ingredients.${index}.${field}`];

  return (
    <form onSubmit={form.submit} noValidate className="flex max-w-5xl flex-col gap-5">
      <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)]">
        <TextField label="Name" value={draft.name} onChange={(e) => form.set('name', e.target.value)} error={errors.name} maxLength={200} required />
        <SelectField label="Toner class" value={draft.tonerClass} onChange={(e) => form.set('tonerClass', e.target.value)} error={errors.tonerClass}>
          <option value="">Not stated</option>
          {TONER_CLASS.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Final volume (ml)"
          hint="Made up to this volume with water"
          inputMode="decimal"
          value={draft.volumeMl}
          onChange={(e) => form.set('volumeMl', e.target.value)}
          error={errors.volumeMl}
          required
        />
      </div>

      <section aria-labelledby={ingredientsHeading} className="flex flex-col gap-2">
        <h2 id={ingredientsHeading} className="text-lg">
          Ingredients
        </h2>
        <p className="text-sm text-ink-700">
          Strength is % w/w for a solution (28 for 28 % acetic acid); leave it empty for a pure substance. A volume needs its density to be
          counted as a mass.
        </p>
        {errors.ingredients ? <p className="text-sm font-medium text-danger-700">{errors.ingredients}</p> : null}
        <ol className="flex flex-col gap-2">
          {draft.ingredients.map((row, index) => (
            <li
              key={row.key}
              role="group"
              aria-label={`Ingredient ${index + 1}`}
              className="grid items-start gap-2 rounded border border-paper-300 bg-white p-2.5 sm:grid-cols-[2rem_minmax(10rem,3fr)_minmax(5rem,1fr)_5.5rem_minmax(5rem,1fr)_minmax(5rem,1fr)_auto]"
            >
              <span className="num pt-7 text-sm font-semibold text-ink-700" aria-hidden="true">
                {index + 1}.
              </span>
              <TextField
                id={`${row.key}-chemical`}
                label="Chemical"
                value={row.chemical}
                onChange={(e) => setRow(index, { chemical: e.target.value })}
                error={rowError(index, 'chemical')}
                maxLength={200}
              />
              <TextField
                label="Amount"
                inputMode="decimal"
                value={row.amount}
                onChange={(e) => setRow(index, { amount: e.target.value })}
                error={rowError(index, 'amount')}
              />
              <SelectField label="Unit" value={row.unit} onChange={(e) => setRow(index, { unit: e.target.value as Unit })} error={rowError(index, 'unit')}>
                {INGREDIENT_UNIT.options.map((o) => (
                  <option key={o.value} value={o.value}>
                    {o.label}
                  </option>
                ))}
              </SelectField>
              <TextField
                label="Strength (%)"
                inputMode="decimal"
                placeholder="pure"
                value={row.strengthPercent}
                onChange={(e) => setRow(index, { strengthPercent: e.target.value })}
                error={rowError(index, 'strengthPercent')}
              />
              <TextField
                label="Density (g/ml)"
                inputMode="decimal"
                value={row.densityGPerMl}
                onChange={(e) => setRow(index, { densityGPerMl: e.target.value })}
                error={rowError(index, 'densityGPerMl')}
              />
              <div className="flex gap-1 pt-5">
                <Button
                  id={`${row.key}-up`}
                  size="sm"
                  variant="quiet"
                  onClick={() => moveRow(index, -1)}
                  disabled={index === 0}
                  aria-label={`Move ingredient ${index + 1} up`}
                >
                  <span aria-hidden="true">↑</span>
                </Button>
                <Button
                  id={`${row.key}-down`}
                  size="sm"
                  variant="quiet"
                  onClick={() => moveRow(index, 1)}
                  disabled={index === draft.ingredients.length - 1}
                  aria-label={`Move ingredient ${index + 1} down`}
                >
                  <span aria-hidden="true">↓</span>
                </Button>
                <Button size="sm" variant="quiet" onClick={() => removeRow(index)} aria-label={`Remove ingredient ${index + 1}`}>
                  Remove
                </Button>
              </div>
            </li>
          ))}
        </ol>
        <div>
          <Button size="sm" onClick={addRow} disabled={draft.ingredients.length >= 40}>
            Add ingredient
          </Button>
        </div>
      </section>

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

      <TextAreaField
        label="Mixing notes"
        hint="Order of mixing, temperature, how long it keeps"
        rows={4}
        value={draft.mixingNotes}
        onChange={(e) => form.set('mixingNotes', e.target.value)}
        error={errors.mixingNotes}
        maxLength={5000}
      />

      <FormMessages
        errors={errors}
        formError={form.formError}
        stale={form.stale}
        notice={form.notice}
        labelFor={recipeFieldLabel}
        describe={describe}
        onReapply={form.reapply}
        onDiscard={form.discardMine}
      />
      <FormActions saving={form.saving} onCancel={onCancel} />
    </form>
  );
}
