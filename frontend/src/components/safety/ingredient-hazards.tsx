import {
  HAZARD_STATEMENTS, PICTOGRAMS, RECALLED, ingredientHazard, isHazardous, recipePictograms, type PictogramCode,
} from '@toneledger/common/domain/toner-chemicals';

interface IngredientLike {
  chemical: string;
  strengthPercent?: number | null;
}

/** "GHS05 Corrosion, GHS07 Exclamation mark". */
export function pictogramNames(codes: PictogramCode[]): string {
  return codes.map((c) => `${c} ${PICTOGRAMS[c]}`).join(', ');
}

/** The mark a list shows beside a recipe whose ingredients carry hazard statements. */
export function HazardMark({ ingredients }: { ingredients: IngredientLike[] }) {
  if (!isHazardous(ingredients)) return <span className="text-ink-700">None listed</span>;
  const pictograms = recipePictograms(ingredients);
  return (
    <span className="inline-flex items-center gap-1 font-medium text-danger-700" data-hazardous="true">
      <span aria-hidden="true">⚠</span> Hazardous{pictograms.length ? <span className="font-normal text-ink-800">: {pictogramNames(pictograms)}</span> : null}
    </span>
  );
}

/**
 * Each ingredient with the hazard statements and pictograms an SDS gives for it (the table of toner
 * chemicals, recalled from memory and marked so), always deferring to the supplier's SDS.
 */
export function IngredientHazards({ ingredients, headingLevel = 2 }: { ingredients: IngredientLike[]; headingLevel?: 2 | 3 }) {
  const H = headingLevel === 2 ? 'h2' : 'h3';
  return (
    <section aria-label="Hazards of the ingredients" className="flex flex-col gap-2">
      <H className={headingLevel === 2 ? 'text-lg' : 'text-sm font-semibold'}>Hazards of the ingredients</H>
      <p className="text-xs text-ink-800">
        GHS hazard statements and pictograms as a safety data sheet gives them. {RECALLED}; classifications differ between suppliers
        and strengths. The supplier&apos;s SDS and local rules always take precedence.
      </p>
      <ul className="flex flex-col gap-1.5 text-sm">
        {ingredients.map((ingredient, index) => {
          const h = ingredientHazard(ingredient);
          const c = h.classification;
          return (
            <li key={`${index}-${ingredient.chemical}`} className="rounded border border-paper-300 bg-white px-3 py-1.5">
              <span className="font-medium text-ink-900">{ingredient.chemical}</span>
              {h.strengthBand ? <span className="text-ink-700"> ({h.strengthBand})</span> : null}
              {!h.entry ? (
                <span className="block text-ink-700">Not in the table of toner chemicals: read its safety data sheet.</span>
              ) : c.hazards.length === 0 ? (
                <span className="block text-ink-700">No hazard statement listed by most suppliers.{h.entry.caution ? ` ${h.entry.caution}` : ''}</span>
              ) : (
                <>
                  <span className="block">
                    {c.signalWord ? <strong className="text-danger-700">{c.signalWord}. </strong> : null}
                    {c.pictograms.length ? <span>Pictograms: {pictogramNames(c.pictograms)}. </span> : null}
                  </span>
                  <span className="block text-ink-800">
                    {c.hazards.map((code) => `${code} ${HAZARD_STATEMENTS[code]}`).join(' ')}
                  </span>
                  {h.entry.caution ? <span className="block text-sepia-800">{h.entry.caution}</span> : null}
                </>
              )}
            </li>
          );
        })}
      </ul>
    </section>
  );
}

/** Cautions that name a danger of this recipe rather than general good practice (codes from common/src/domain/recipes.ts). */
export function isSpecificCaution(code: string): boolean {
  return code.startsWith('chemical_') || code.startsWith('ferricyanide') || code === 'acetic_acid_concentrated';
}

/**
 * The cautions of the recipe chosen for a process step, shown where it is chosen: its pictograms, the
 * cautions that name its chemicals, and the precedence of the SDS and local rules.
 */
export function StepRecipeCautions({ recipe }: { recipe: { name: string; ingredients: IngredientLike[]; cautions: Array<{ code: string; text: string }> } }) {
  const specific = recipe.cautions.filter((c) => isSpecificCaution(c.code));
  const pictograms = recipePictograms(recipe.ingredients);
  if (specific.length === 0 && pictograms.length === 0) return null;
  return (
    <aside aria-label={`Cautions for ${recipe.name}`} className="rounded border border-danger-200 bg-danger-50 px-3 py-2 text-xs text-ink-900 sm:col-span-2 lg:col-span-4">
      <p className="font-semibold text-danger-700">
        <span aria-hidden="true">⚠</span> Cautions for {recipe.name}
        {pictograms.length ? <span className="font-normal text-ink-800"> · {pictogramNames(pictograms)}</span> : null}
      </p>
      <ul className="mt-1 list-disc pl-5">
        {specific.map((c) => (
          <li key={c.code} data-caution={c.code}>{c.text}</li>
        ))}
      </ul>
      <p className="mt-1 text-ink-800">The supplier&apos;s safety data sheet and local rules always take precedence.</p>
    </aside>
  );
}
