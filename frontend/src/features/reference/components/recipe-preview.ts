import { normaliseRecipe, recipeCautions, type Ingredient, type NormalisedIngredient } from '@toneledger/common/domain/recipes';
import type { INGREDIENT_UNIT } from '@toneledger/common/schemas/vocab';
import { readNumber } from '@/features/reference/components/recipe-format';

export type Unit = (typeof INGREDIENT_UNIT.codes)[number];

/** One ingredient row as the editor holds it: figures as typed. */
export interface IngredientRow {
  chemical: string;
  amount: string;
  unit: Unit;
  strengthPercent: string;
  densityGPerMl: string;
}

/** The recipe editor's values. */
export interface RecipeValues {
  name: string;
  tonerClass: string;
  volumeMl: string;
  ingredients: IngredientRow[];
  mixingNotes: string;
}

export interface LivePreview {
  normalised: NormalisedIngredient[] | null;
  /** Why there is no per-litre table yet, or why a row is left out. */
  messages: string[];
  cautions: ReturnType<typeof recipeCautions>;
}

/** Per-litre amounts and cautions of the recipe as typed, from the same functions the server uses. */
export function livePreview(draft: RecipeValues): LivePreview {
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
