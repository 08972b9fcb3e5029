/**
 * Bath recipes: ingredients with amounts for a stated final volume, normalised to a litre,
 * scaled to any volume, compared, and shown with the usual chemical-safety cautions.
 *
 * Decisions:
 *  - `strengthPercent` is % w/w of a solution (28 for 28 % acetic acid). null/undefined means a
 *    pure substance, i.e. 100 %. Glacial acetic acid may be entered either way: as a pure
 *    substance, or with the strength on its label (commonly ≥ 99.7 %, from memory); the 0.3 %
 *    difference is below the accuracy of darkroom weighing.
 *  - A volume becomes a mass only through `densityGPerMl` (of the solution as measured); without
 *    it the g/L figures are null and a note says why. A mass with a density also gets ml/L.
 *  - Invalid numbers (negative or non-finite amounts, strength outside (0, 100], density ≤ 0,
 *    volume ≤ 0) throw a RangeError naming the ingredient: a recipe with them cannot be mixed.
 */

import { ingredientHazard } from './toner-chemicals';

export type MassUnit = 'g' | 'mg' | 'kg';
export type VolumeUnit = 'ml' | 'l';

export interface Ingredient {
  chemical: string;
  amount: number;
  unit: MassUnit | VolumeUnit;
  /** % w/w for a solution, e.g. 28 for 28 % acetic acid; null/undefined = pure substance. */
  strengthPercent?: number | null;
  /** g/ml; needed only to turn a volume into a mass. */
  densityGPerMl?: number | null;
}

export interface Recipe {
  name: string;
  /** Stated final volume of the working bath, ml. */
  volumeMl: number;
  ingredients: Ingredient[];
}

export interface NormalisedIngredient {
  chemical: string;
  /** The amount as entered, e.g. "130 g of 28 % solution". */
  givenAs: string;
  /** Mass of what was weighed or measured, per litre of working bath; null for a volume without density. */
  gramsPerLitre: number | null;
  /** Volume of what was measured, per litre; null for a mass without density. */
  mlPerLitre: number | null;
  /** Active substance per litre: mass × strength / 100; null when a volume has no density. */
  pureGramsPerLitre: number | null;
  note?: string;
}

export interface Caution {
  code: string;
  text: string;
}

const GRAMS: Record<MassUnit, number> = { mg: 0.001, g: 1, kg: 1000 };
const MILLILITRES: Record<VolumeUnit, number> = { ml: 1, l: 1000 };

function isMass(unit: Ingredient['unit']): unit is MassUnit {
  return unit in GRAMS;
}

function checkVolume(volumeMl: number, what: string): void {
  if (!Number.isFinite(volumeMl) || volumeMl <= 0) {
    throw new RangeError(`${what} must be a volume greater than 0 ml (got ${volumeMl})`);
  }
}

function checkIngredient(i: Ingredient): void {
  if (!(i.unit in GRAMS) && !(i.unit in MILLILITRES)) {
    throw new RangeError(`${i.chemical}: unknown unit "${i.unit}" (use g, mg, kg, ml or l)`);
  }
  if (!Number.isFinite(i.amount) || i.amount < 0) {
    throw new RangeError(`${i.chemical}: amount must be a number of 0 or more (got ${i.amount})`);
  }
  const s = i.strengthPercent;
  if (s != null && (!Number.isFinite(s) || s <= 0 || s > 100)) {
    throw new RangeError(`${i.chemical}: strength must be more than 0 and at most 100 % (got ${s})`);
  }
  const d = i.densityGPerMl;
  if (d != null && (!Number.isFinite(d) || d <= 0)) {
    throw new RangeError(`${i.chemical}: density must be more than 0 g/ml (got ${d})`);
  }
}

/** "130 g of 28 % solution", "4 g", "10 ml (density 1.049 g/ml)". */
function describeAmount(i: Ingredient): string {
  let s = `${i.amount} ${i.unit}`;
  if (i.strengthPercent != null) s += ` of ${i.strengthPercent} % solution`;
  if (i.densityGPerMl != null && !isMass(i.unit)) s += ` (density ${i.densityGPerMl} g/ml)`;
  return s;
}

/** Every ingredient per litre of working bath. */
export function normaliseRecipe(r: Recipe): NormalisedIngredient[] {
  checkVolume(r.volumeMl, `Recipe "${r.name}": the final volume`);
  const perLitre = 1000 / r.volumeMl;
  return r.ingredients.map((i) => {
    checkIngredient(i);
    const fraction = (i.strengthPercent ?? 100) / 100;
    const density = i.densityGPerMl ?? null;
    let grams: number | null;
    let ml: number | null;
    let note: string | undefined;
    if (isMass(i.unit)) {
      grams = i.amount * GRAMS[i.unit];
      ml = density ? grams / density : null;
    } else {
      ml = i.amount * MILLILITRES[i.unit];
      grams = density ? ml * density : null;
      if (grams === null) note = 'Given as a volume without a density, so it cannot be converted to a mass.';
    }
    const out: NormalisedIngredient = {
      chemical: i.chemical,
      givenAs: describeAmount(i),
      gramsPerLitre: grams === null ? null : grams * perLitre,
      mlPerLitre: ml === null ? null : ml * perLitre,
      pureGramsPerLitre: grams === null ? null : grams * fraction * perLitre,
    };
    if (note) out.note = note;
    return out;
  });
}

/** The same recipe for another final volume: every amount scaled, units kept. */
export function scaleRecipe(r: Recipe, targetVolumeMl: number): Recipe {
  checkVolume(targetVolumeMl, 'The target volume');
  checkVolume(r.volumeMl, `Recipe "${r.name}": the final volume`);
  const factor = targetVolumeMl / r.volumeMl;
  return {
    ...r,
    volumeMl: targetVolumeMl,
    ingredients: r.ingredients.map((i) => {
      checkIngredient(i);
      return { ...i, amount: i.amount * factor };
    }),
  };
}

/**
 * How far apart two ingredients are in active substance per litre:
 * |a − b| / max(a, b), so 0 = same, 0.1 = the smaller is 10 % below the larger; symmetric.
 * Throws a RangeError when either has no pure mass (a volume given without a density).
 */
export function compareIngredients(a: NormalisedIngredient, b: NormalisedIngredient): { relativeDifference: number } {
  for (const x of [a, b]) {
    if (x.pureGramsPerLitre === null) {
      throw new RangeError(`${x.chemical} (${x.givenAs}) has no mass per litre to compare: give its density`);
    }
  }
  const pa = a.pureGramsPerLitre as number;
  const pb = b.pureGramsPerLitre as number;
  const larger = Math.max(Math.abs(pa), Math.abs(pb));
  return { relativeDifference: larger === 0 ? 0 : Math.abs(pa - pb) / larger };
}

/** Families whose cautions are written above; the table adds the others. */
const COVERED_ABOVE = new Set(['ferricyanide', 'acetic_acid', 'hydrochloric_acid']);
const FERRICYANIDE = /ferricyanide/i;
const ACETIC = /acetic/i;
const STRONG_ACID = /hydrochloric|sulfuric|sulphuric|nitric/i;
const ANY_ACID = /\bacid\b|acetic|hydrochloric|sulfuric|sulphuric|nitric|oxalic|citric|tartaric|boric/i;

/**
 * Cautions shown beside a recipe. All texts below are common practice in darkroom chemistry
 * safety; the product defers to safety data sheets, local regulations and the institution.
 */
export function recipeCautions(r: Recipe): Caution[] {
  const names = r.ingredients.map((i) => i.chemical);
  const cautions: Caution[] = [
    { code: 'gloves', text: 'Wear chemical-resistant gloves when weighing, mixing and using the bath.' },
    { code: 'eye_protection', text: 'Wear eye protection (safety glasses or goggles) while mixing and pouring.' },
    { code: 'ventilation', text: 'Mix and use the bath in a well-ventilated place.' },
    {
      code: 'safety_data_sheet',
      text:
        "Read the safety data sheet for each chemical before use, and follow local regulations and your institution's " +
        'health-and-safety practice for handling, storage and disposal.',
    },
  ];

  const ferricyanide = names.some((n) => FERRICYANIDE.test(n));
  const strongAcid = names.some((n) => STRONG_ACID.test(n));
  if (ferricyanide) {
    cautions.push({
      code: 'ferricyanide_acid_heat',
      text:
        'Contains a ferricyanide: never mix it with strong acids or heat it, and never boil the bath, ' +
        'as this can release toxic hydrogen cyanide gas. Mix at room temperature.',
    });
  }
  if (ferricyanide && strongAcid) {
    cautions.push({
      code: 'ferricyanide_with_strong_acid',
      text:
        'This recipe combines a ferricyanide with a strong acid. Do not mix it unless a qualified person has checked the ' +
        'recipe and the safety data sheets: the combination can release toxic hydrogen cyanide gas.',
    });
  }

  const concentratedAcetic = r.ingredients.some(
    (i) =>
      ACETIC.test(i.chemical) &&
      (/glacial/i.test(i.chemical) || i.strengthPercent == null || i.strengthPercent > 80),
  );
  if (concentratedAcetic) {
    cautions.push({
      code: 'acetic_acid_concentrated',
      text:
        'Glacial or concentrated acetic acid (over 80 %) is corrosive and flammable, and its vapour irritates the eyes ' +
        'and airways. Handle it with gloves and eye protection in good ventilation, and add it slowly to water.',
    });
  }

  if (names.some((n) => ANY_ACID.test(n))) {
    cautions.push({ code: 'acid_to_water', text: 'Always add acid to water, never water to acid.' });
  }

  // The families the table of toner chemicals knows beyond those above (sulfides, selenium,
  // thiocyanates, gold chloride, borax…): each once, with its hazard statements.
  const seen = new Set<string>();
  for (const i of r.ingredients) {
    const h = ingredientHazard(i);
    if (!h.entry || COVERED_ABOVE.has(h.entry.key) || seen.has(h.entry.key) || !h.entry.caution || h.classification.hazards.length === 0) continue;
    seen.add(h.entry.key);
    const codes = h.classification.hazards.join(', ');
    cautions.push({ code: `chemical_${h.entry.key}`, text: `${h.entry.name} (${codes}): ${h.entry.caution}` });
  }
  return cautions;
}
