import { TONER_CLASS } from '@toneledger/common/schemas/vocab';
import type { Recipe } from '@toneledger/common/schemas/catalogue';
import { strengthText } from '@toneledger/common/domain/toner-chemicals';
import { TableHead } from '@/components/ui/table-head';
import { IngredientHazards } from '@/components/safety/ingredient-hazards';
import { formatCount } from '@/lib/format';
import { NormalisedTable } from '@/features/reference/components/normalised-table';
import { RecipeCautions } from '@/features/reference/components/recipe-cautions';
import { formatQuantity } from '@/features/reference/components/recipe-format';
import { ScaleTool } from '@/features/reference/components/scale-tool';

/** One bath recipe as stored: cautions first, then what goes in, per litre, and scaled. */
export function RecipeView({ recipe }: { recipe: Recipe }) {
  return (
    <div className="flex max-w-5xl flex-col gap-6">
      <RecipeCautions cautions={recipe.cautions} />

      <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-1 text-sm">
        <dt className="font-semibold text-ink-700">Toner</dt>
        <dd>{recipe.tonerClass ? TONER_CLASS.labels[recipe.tonerClass] : 'Not stated'}</dd>
        <dt className="font-semibold text-ink-700">Final volume</dt>
        <dd className="num">{formatQuantity(recipe.volumeMl)} ml</dd>
        <dt className="font-semibold text-ink-700">Used in</dt>
        <dd className="num">
          {formatCount(recipe.stepCount)} process {recipe.stepCount === 1 ? 'step' : 'steps'}
        </dd>
      </dl>

      <section aria-labelledby="recipe-ingredients" className="flex flex-col gap-2">
        <h2 id="recipe-ingredients" className="text-lg">
          Ingredients for {formatQuantity(recipe.volumeMl)} ml
        </h2>
        <div className="overflow-x-auto rounded border border-paper-300 bg-white">
          <table className="w-full border-collapse text-left text-sm">
            <caption className="sr-only">Ingredients as stated</caption>
            <TableHead
              variant="roomy"
              columns={[
                'Chemical',
                { label: 'Amount', align: 'right' },
                'Unit',
                'Strength',
                { label: 'Density (g/ml)', align: 'right' },
              ]}
            />
            <tbody>
              {recipe.ingredients.map((ingredient, index) => (
                <tr key={`${index}-${ingredient.chemical}`} className="border-t border-paper-200">
                  <th scope="row" className="px-3 py-2 font-medium text-ink-900">{ingredient.chemical}</th>
                  <td className="num px-3 py-2 text-right">{formatQuantity(ingredient.amount)}</td>
                  <td className="px-3 py-2">{ingredient.unit}</td>
                  <td className="num px-3 py-2">{strengthText(ingredient)}</td>
                  <td className="num px-3 py-2 text-right">{formatQuantity(ingredient.densityGPerMl)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>

      <IngredientHazards ingredients={recipe.ingredients} />

      <section aria-labelledby="recipe-per-litre" className="flex flex-col gap-2">
        <h2 id="recipe-per-litre" className="text-lg">
          Per litre of working bath
        </h2>
        <NormalisedTable rows={recipe.normalised} caption="Ingredients per litre of working bath" />
      </section>

      <section aria-labelledby="recipe-mixing" className="flex flex-col gap-2">
        <h2 id="recipe-mixing" className="text-lg">
          Mixing notes
        </h2>
        {recipe.mixingNotes ? (
          <p className="max-w-3xl text-sm whitespace-pre-wrap">{recipe.mixingNotes}</p>
        ) : (
          <p className="text-sm text-ink-600">None recorded.</p>
        )}
      </section>

      <ScaleTool key={recipe.version} recipe={recipe} />
    </div>
  );
}
