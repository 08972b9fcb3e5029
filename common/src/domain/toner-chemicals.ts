/**
 * The chemicals toning recipes use, with the GHS hazard statements (H-codes and their text) and the
 * pictogram names a supplier's safety data sheet (SDS) gives for them.
 *
 * Every entry below is RECALLED FROM MEMORY of typical EU/GHS classifications (CLP Annex VI where a
 * harmonised entry exists) and has not been checked against a supplier's SDS here: each carries
 * `source: RECALLED` and screens say so. Classifications differ between suppliers, grades and
 * concentrations. The supplier's SDS, local regulations and qualified practice always take precedence;
 * this table exists so that a recipe never reaches a person without its usual cautions.
 *
 * An ingredient is matched by its name (the text a person typed); acetic acid is classified by
 * strength (CLP Annex VI specific concentration limits, from memory): ≥ 90 % corrosive (1A) and
 * flammable, 25–90 % corrosive (1B), 10–25 % irritant to skin and eyes, below 10 % not classified.
 */

/** Hazard statements used below, worded as the GHS (Rev. 9) and CLP give them (from memory). */
export const HAZARD_STATEMENTS = {
  H226: 'Flammable liquid and vapour.',
  H290: 'May be corrosive to metals.',
  H301: 'Toxic if swallowed.',
  H302: 'Harmful if swallowed.',
  H311: 'Toxic in contact with skin.',
  H312: 'Harmful in contact with skin.',
  H314: 'Causes severe skin burns and eye damage.',
  H315: 'Causes skin irritation.',
  H317: 'May cause an allergic skin reaction.',
  H318: 'Causes serious eye damage.',
  H319: 'Causes serious eye irritation.',
  H331: 'Toxic if inhaled.',
  H332: 'Harmful if inhaled.',
  H335: 'May cause respiratory irritation.',
  H351: 'Suspected of causing cancer.',
  H360FD: 'May damage fertility. May damage the unborn child.',
  H361d: 'Suspected of damaging the unborn child.',
  H373: 'May cause damage to organs through prolonged or repeated exposure.',
  H400: 'Very toxic to aquatic life.',
  H410: 'Very toxic to aquatic life with long lasting effects.',
  H411: 'Toxic to aquatic life with long lasting effects.',
  H412: 'Harmful to aquatic life with long lasting effects.',
  H413: 'May cause long lasting harmful effects to aquatic life.',
  EUH031: 'Contact with acids liberates toxic gas.',
  EUH032: 'Contact with acids liberates very toxic gas.',
} as const;
export type HazardCode = keyof typeof HAZARD_STATEMENTS;

/** The nine GHS pictograms by their code and name. */
export const PICTOGRAMS = {
  GHS01: 'Exploding bomb',
  GHS02: 'Flame',
  GHS03: 'Flame over circle',
  GHS04: 'Gas cylinder',
  GHS05: 'Corrosion',
  GHS06: 'Skull and crossbones',
  GHS07: 'Exclamation mark',
  GHS08: 'Health hazard',
  GHS09: 'Environment',
} as const;
export type PictogramCode = keyof typeof PICTOGRAMS;

export const RECALLED = "Recalled from memory — verify against the supplier's SDS";

export interface Classification {
  hazards: HazardCode[];
  pictograms: PictogramCode[];
  signalWord: 'Danger' | 'Warning' | null;
}

export interface ChemicalEntry extends Classification {
  key: string;
  name: string;
  /** Matches the chemical as people type it in a recipe. */
  match: RegExp;
  /** The trade's caution in plain words, beyond the H-statements. */
  caution: string | null;
  /** Classification by strength (% w/w), highest first; the first whose `atLeast` the strength reaches applies. */
  byStrength?: Array<Classification & { atLeast: number; label: string }>;
  source: typeof RECALLED;
}

const none: Classification = { hazards: [], pictograms: [], signalWord: null };

export const TONER_CHEMICALS: ChemicalEntry[] = [
  {
    key: 'sodium_sulfide', name: 'Sodium sulfide', match: /sodium sulphide|sodium sulfide/i,
    hazards: ['H302', 'H311', 'H314', 'H400', 'EUH031'], pictograms: ['GHS05', 'GHS06', 'GHS09'], signalWord: 'Danger',
    caution: 'Releases hydrogen sulfide, a toxic gas, with acids (and slowly in use): ventilate well and never let it meet acid or an acid stop bath.',
    source: RECALLED,
  },
  {
    key: 'polysulfide', name: 'Potassium or sodium polysulfide (liver of sulfur)', match: /polysulfide|polysulphide|liver of sulfur|liver of sulphur/i,
    hazards: ['H314', 'H400', 'EUH031'], pictograms: ['GHS05', 'GHS09'], signalWord: 'Danger',
    caution: 'Releases hydrogen sulfide, a toxic gas, with acids and when warmed: ventilate well and keep it away from acids and from film and paper stock.',
    source: RECALLED,
  },
  {
    key: 'selenium', name: 'Selenium compounds (sodium selenite, selenosulfate; selenium toner concentrate)', match: /selen/i,
    hazards: ['H301', 'H331', 'H373', 'H413'], pictograms: ['GHS06', 'GHS08'], signalWord: 'Danger',
    caution: 'Selenium compounds are toxic if swallowed or inhaled: never pour used toner down the drain; collect it for disposal as local rules require.',
    source: RECALLED,
  },
  {
    key: 'ferricyanide', name: 'Potassium ferricyanide (hexacyanoferrate(III))', match: /ferricyanide|hexacyanoferrate\s*\(?iii/i,
    hazards: ['EUH032'], pictograms: [], signalWord: null,
    caution: 'Not classified by most suppliers, but with strong acids or heat it can release hydrogen cyanide: never heat or boil it, and keep strong acids away.',
    source: RECALLED,
  },
  {
    key: 'ammonium_thiocyanate', name: 'Ammonium or potassium thiocyanate', match: /thiocyanate/i,
    hazards: ['H302', 'H312', 'H332', 'H412', 'EUH032'], pictograms: ['GHS07'], signalWord: 'Warning',
    caution: 'Releases a very toxic gas with acids: keep acids away from the thiocyanate and from the mixed toner.',
    source: RECALLED,
  },
  {
    key: 'gold_chloride', name: 'Gold(III) chloride (tetrachloroauric acid)', match: /gold.*chloride|chloroauric|auric chloride/i,
    hazards: ['H302', 'H314', 'H317'], pictograms: ['GHS05', 'GHS07'], signalWord: 'Danger',
    caution: 'Corrosive as a solid and in strong solution; it stains skin purple and may cause allergy. Wear gloves and eye protection.',
    source: RECALLED,
  },
  {
    key: 'acetic_acid', name: 'Acetic acid', match: /acetic/i,
    hazards: ['H226', 'H314'], pictograms: ['GHS02', 'GHS05'], signalWord: 'Danger',
    caution: 'Add acid to water, never water to acid. Glacial acetic acid is corrosive and flammable; its vapour irritates eyes and airways.',
    byStrength: [
      { atLeast: 90, label: 'glacial (90 % or more)', hazards: ['H226', 'H314'], pictograms: ['GHS02', 'GHS05'], signalWord: 'Danger' },
      { atLeast: 25, label: '25 % to under 90 %', hazards: ['H314'], pictograms: ['GHS05'], signalWord: 'Danger' },
      { atLeast: 10, label: '10 % to under 25 %', hazards: ['H315', 'H319'], pictograms: ['GHS07'], signalWord: 'Warning' },
      { atLeast: 0, label: 'under 10 %', ...none },
    ],
    source: RECALLED,
  },
  {
    key: 'hydrochloric_acid', name: 'Hydrochloric acid', match: /hydrochloric/i,
    hazards: ['H290', 'H314', 'H335'], pictograms: ['GHS05', 'GHS07'], signalWord: 'Danger',
    caution: 'A strong acid: never let it meet a ferricyanide, sulfide or thiocyanate bath.',
    source: RECALLED,
  },
  {
    key: 'thiourea', name: 'Thiourea (thiocarbamide)', match: /thiourea|thiocarbamide/i,
    hazards: ['H302', 'H351', 'H361d', 'H411'], pictograms: ['GHS07', 'GHS08', 'GHS09'], signalWord: 'Warning',
    caution: 'Suspected of causing cancer and of harming the unborn child: weigh it with a dust mask and gloves, and collect it for disposal.',
    source: RECALLED,
  },
  {
    key: 'sodium_hydroxide', name: 'Sodium hydroxide', match: /sodium hydroxide|caustic soda/i,
    hazards: ['H290', 'H314'], pictograms: ['GHS05'], signalWord: 'Danger',
    caution: 'Dissolving it heats the water strongly: add it slowly to cold water, with eye protection.',
    source: RECALLED,
  },
  {
    key: 'copper_sulfate', name: 'Copper(II) sulfate', match: /copper.*sulfate|copper.*sulphate|cupric sulfate/i,
    hazards: ['H302', 'H315', 'H319', 'H410'], pictograms: ['GHS07', 'GHS09'], signalWord: 'Warning',
    caution: 'Very toxic to aquatic life: collect used toner for disposal.',
    source: RECALLED,
  },
  {
    key: 'borax', name: 'Sodium tetraborate (borax)', match: /borax|tetraborate/i,
    hazards: ['H360FD'], pictograms: ['GHS08'], signalWord: 'Danger',
    caution: 'Classified as toxic to reproduction in the EU: avoid breathing the dust, and wash hands after use.',
    source: RECALLED,
  },
  {
    key: 'potassium_bromide', name: 'Potassium bromide', match: /potassium bromide/i,
    hazards: ['H319'], pictograms: ['GHS07'], signalWord: 'Warning', caution: null, source: RECALLED,
  },
  {
    key: 'sodium_carbonate', name: 'Sodium carbonate', match: /sodium carbonate|washing soda/i,
    hazards: ['H319'], pictograms: ['GHS07'], signalWord: 'Warning', caution: null, source: RECALLED,
  },
  {
    key: 'sodium_sulfite', name: 'Sodium sulfite', match: /sodium sulfite|sodium sulphite/i,
    ...none,
    caution: 'Not classified by most suppliers; with acids it gives off sulfur dioxide, which irritates the airways.',
    source: RECALLED,
  },
  {
    key: 'ferric_ammonium_citrate', name: 'Ferric ammonium citrate', match: /ferric ammonium citrate|ammonium iron\s*\(?iii\)? citrate/i,
    ...none, caution: 'Not classified by most suppliers.', source: RECALLED,
  },
  {
    key: 'potassium_citrate', name: 'Potassium citrate', match: /potassium citrate/i,
    ...none, caution: 'Not classified by most suppliers.', source: RECALLED,
  },
  {
    key: 'sodium_thiosulfate', name: 'Sodium thiosulfate (hypo)', match: /thiosulfate|thiosulphate|\bhypo\b/i,
    ...none, caution: 'Not classified by most suppliers; with acids it gives off sulfur dioxide.', source: RECALLED,
  },
];

export interface IngredientHazard {
  chemical: string;
  entry: ChemicalEntry | null;
  classification: Classification;
  /** The strength band applied, for a chemical classified by strength. */
  strengthBand: string | null;
}

/** A strength written in the name ("acetic acid, 28 %"), when the strength field is empty. */
function strengthInName(chemical: string): number | null {
  const m = /(\d+(?:[.,]\d+)?)\s*%/.exec(chemical);
  return m ? Number(m[1].replace(',', '.')) : null;
}

/** The entry and classification that apply to one ingredient; `entry` null when the table does not know it. */
export function ingredientHazard(ingredient: { chemical: string; strengthPercent?: number | null }): IngredientHazard {
  const entry = TONER_CHEMICALS.find((e) => e.match.test(ingredient.chemical)) ?? null;
  if (!entry) return { chemical: ingredient.chemical, entry: null, classification: none, strengthBand: null };
  if (!entry.byStrength) return { chemical: ingredient.chemical, entry, classification: entry, strengthBand: null };
  const strength = ingredient.strengthPercent ?? strengthInName(ingredient.chemical) ?? 100;
  const band = entry.byStrength.find((b) => strength >= b.atLeast) ?? entry.byStrength[entry.byStrength.length - 1];
  return { chemical: ingredient.chemical, entry, classification: band, strengthBand: band.label };
}

/** Whether any ingredient carries a GHS hazard statement (or an EUH statement about gases with acids). */
export function isHazardous(ingredients: Array<{ chemical: string; strengthPercent?: number | null }>): boolean {
  return ingredients.some((i) => ingredientHazard(i).classification.hazards.length > 0);
}

/** The pictograms of a whole recipe, each once, in GHS order. */
export function recipePictograms(ingredients: Array<{ chemical: string; strengthPercent?: number | null }>): PictogramCode[] {
  const all = new Set(ingredients.flatMap((i) => ingredientHazard(i).classification.pictograms));
  return (Object.keys(PICTOGRAMS) as PictogramCode[]).filter((p) => all.has(p));
}

/** "28 % solution", "solution, strength as supplied" or "pure": what a strength column shows. */
export function strengthText(ingredient: { chemical: string; strengthPercent?: number | null }): string {
  const s = ingredient.strengthPercent ?? strengthInName(ingredient.chemical);
  if (s != null && s < 100) return `${new Intl.NumberFormat('en-GB', { maximumFractionDigits: 2 }).format(s)} % solution`;
  if (/solution|concentrate/i.test(ingredient.chemical)) return 'solution, strength as supplied';
  return s === 100 ? '100 %' : 'pure';
}
