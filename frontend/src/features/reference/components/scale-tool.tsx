import { useId, useState } from 'react';
import { scaleRecipe, type Recipe as RecipeToMix } from '@toneledger/common/domain/recipes';
import { TextField } from '@/components/ui/field';
import { TableHead } from '@/components/ui/table-head';
import { formatFactor, formatQuantity, readNumber } from '@/features/reference/components/recipe-format';

/** "Scale to" a volume: every ingredient for the new volume, recomputed as you type. */
export function ScaleTool({ recipe }: { recipe: RecipeToMix }) {
  const headingId = useId();
  const [target, setTarget] = useState(String(recipe.volumeMl));
  const volume = readNumber(target);
  let scaled: RecipeToMix | null = null;
  let problem: string | null = null;
  if (volume === null || volume <= 0) {
    problem = 'Enter a volume greater than 0 ml.';
  } else {
    try {
      scaled = scaleRecipe(recipe, volume);
    } catch (error) {
      problem = error instanceof Error ? error.message : String(error);
    }
  }
  const factor = scaled ? scaled.volumeMl / recipe.volumeMl : null;

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3">
      <h2 id={headingId} className="text-lg">
        Scale to another volume
      </h2>
      <div className="flex flex-wrap items-end gap-4">
        <TextField
          label="Scale to (ml)"
          inputMode="decimal"
          value={target}
          onChange={(event) => setTarget(event.target.value)}
          error={problem ?? undefined}
          fieldClassName="w-40"
        />
        <p aria-live="polite" className="pb-2 text-sm text-ink-700">
          {scaled && factor !== null ? (
            <>
              <span className="num text-base font-semibold text-ink-900">{formatFactor(factor)}</span> the stated{' '}
              <span className="num">{formatQuantity(recipe.volumeMl)}</span> ml
            </>
          ) : null}
        </p>
      </div>
      {scaled ? (
        <div className="overflow-x-auto rounded border border-paper-300 bg-white">
          <table className="w-full border-collapse text-left text-sm">
            <caption className="sr-only">Ingredients for {formatQuantity(scaled.volumeMl)} ml</caption>
            <TableHead
              variant="roomy"
              columns={[
                'Chemical',
                { label: `For ${formatQuantity(scaled.volumeMl)} ml`, align: 'right' },
                { label: `As stated (${formatQuantity(recipe.volumeMl)} ml)`, align: 'right' },
                'Strength',
              ]}
            />
            <tbody>
              {scaled.ingredients.map((ingredient, index) => {
                const original = recipe.ingredients[index];
                return (
                  <tr key={`${index}-${ingredient.chemical}`} className="border-t border-paper-200">
                    <th scope="row" className="px-3 py-2 font-medium text-ink-900">{ingredient.chemical}</th>
                    <td className="num px-3 py-2 text-right font-semibold">
                      {formatQuantity(ingredient.amount)} {ingredient.unit}
                    </td>
                    <td className="num px-3 py-2 text-right text-ink-700">
                      {original ? `${formatQuantity(original.amount)} ${original.unit}` : ''}
                    </td>
                    <td className="num px-3 py-2 text-ink-700">{ingredient.strengthPercent != null ? `${ingredient.strengthPercent} %` : ''}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      ) : null}
    </section>
  );
}
