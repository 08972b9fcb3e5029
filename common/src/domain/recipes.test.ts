import { describe, expect, it } from 'vitest';
import { compareIngredients, normaliseRecipe, recipeCautions, scaleRecipe, type Recipe } from './recipes';

// Single-bath iron-blue toner made up to 500 ml (common practice in darkroom toning; no
// published source): 4 g ferric ammonium citrate, 4 g potassium ferricyanide and acetic acid,
// given as 130 g of 28 % solution or as 35 g glacial acetic acid.
const withDilute: Recipe = {
  name: 'Iron blue, single bath (28 % acetic)',
  volumeMl: 500,
  ingredients: [
    { chemical: 'Ferric ammonium citrate', amount: 4, unit: 'g' },
    { chemical: 'Potassium ferricyanide', amount: 4, unit: 'g' },
    { chemical: 'Acetic acid', amount: 130, unit: 'g', strengthPercent: 28 },
  ],
};
const withGlacial: Recipe = {
  ...withDilute,
  name: 'Iron blue, single bath (glacial acetic)',
  ingredients: [...withDilute.ingredients.slice(0, 2), { chemical: 'Glacial acetic acid', amount: 35, unit: 'g' }],
};

describe('normaliseRecipe: single-bath iron-blue toner (common practice, no published source)', () => {
  it('each salt comes to 8 g/L (4 g in 500 ml)', () => {
    const [citrate, ferricyanide] = normaliseRecipe(withDilute);
    expect(citrate).toEqual({
      chemical: 'Ferric ammonium citrate', givenAs: '4 g', gramsPerLitre: 8, mlPerLitre: null, pureGramsPerLitre: 8,
    });
    expect(ferricyanide.gramsPerLitre).toBe(8);
    expect(ferricyanide.pureGramsPerLitre).toBe(8);
  });

  it('130 g of 28 % acid is 260 g/L weighed and 72.8 g/L pure acid (130 × 0.28 = 36.4 g per 500 ml)', () => {
    const acid = normaliseRecipe(withDilute)[2];
    expect(acid.givenAs).toBe('130 g of 28 % solution');
    expect(acid.gramsPerLitre).toBe(260);
    expect(acid.pureGramsPerLitre).toBeCloseTo(72.8, 10);
  });

  it('35 g glacial, entered as a pure substance, is 70 g/L pure acid', () => {
    const acid = normaliseRecipe(withGlacial)[2];
    expect(acid.givenAs).toBe('35 g');
    expect(acid.pureGramsPerLitre).toBe(70);
  });

  it('the two forms of the acid agree within 5 % (72.8 vs 70 g/L: 3.8 %)', () => {
    const d = compareIngredients(normaliseRecipe(withDilute)[2], normaliseRecipe(withGlacial)[2]);
    expect(d.relativeDifference).toBeCloseTo(2.8 / 72.8, 10);
    expect(d.relativeDifference).toBeLessThan(0.05);
  });

  it('glacial given at its labelled strength of 99.7 % (from memory) still agrees within 5 %', () => {
    const labelled: Recipe = { ...withGlacial, ingredients: [{ chemical: 'Glacial acetic acid', amount: 35, unit: 'g', strengthPercent: 99.7 }] };
    const acid = normaliseRecipe(labelled)[0];
    expect(acid.pureGramsPerLitre).toBeCloseTo(69.79, 10);
    expect(compareIngredients(normaliseRecipe(withDilute)[2], acid).relativeDifference).toBeLessThan(0.05);
  });

  it('a ten-fold mismatch is reported as such, whichever order', () => {
    const weak: Recipe = { ...withDilute, ingredients: [{ chemical: 'Acetic acid', amount: 13, unit: 'g', strengthPercent: 28 }] };
    const a = normaliseRecipe(withDilute)[2];
    const b = normaliseRecipe(weak)[0];
    expect(compareIngredients(a, b).relativeDifference).toBeCloseTo(0.9, 10);
    expect(compareIngredients(b, a).relativeDifference).toBeCloseTo(0.9, 10);
  });
});

describe('normaliseRecipe: units and volumes', () => {
  it('10 ml glacial acetic acid at density 1.049 g/ml (from memory, about 20–25 °C) is 10.49 g', () => {
    const r: Recipe = { name: 'stop', volumeMl: 1000, ingredients: [{ chemical: 'Glacial acetic acid', amount: 10, unit: 'ml', densityGPerMl: 1.049 }] };
    const [acid] = normaliseRecipe(r);
    expect(acid.mlPerLitre).toBe(10);
    expect(acid.gramsPerLitre).toBeCloseTo(10.49, 10);
    expect(acid.pureGramsPerLitre).toBeCloseTo(10.49, 10);
    expect(acid.givenAs).toBe('10 ml (density 1.049 g/ml)');
    expect(acid.note).toBeUndefined();
  });

  it('a volume without density has no mass and says why', () => {
    const r: Recipe = { name: 'stop', volumeMl: 500, ingredients: [{ chemical: 'Acetic acid', amount: 0.02, unit: 'l', strengthPercent: 28 }] };
    const [acid] = normaliseRecipe(r);
    expect(acid.mlPerLitre).toBe(40);
    expect(acid.gramsPerLitre).toBeNull();
    expect(acid.pureGramsPerLitre).toBeNull();
    expect(acid.note).toMatch(/without a density/);
    expect(() => compareIngredients(acid, acid)).toThrow(RangeError);
  });

  it('mg and kg convert to grams (SI prefixes)', () => {
    const r: Recipe = {
      name: 'units', volumeMl: 250,
      ingredients: [
        { chemical: 'Gold chloride', amount: 250, unit: 'mg' },
        { chemical: 'Sodium thiosulfate', amount: 0.05, unit: 'kg' },
      ],
    };
    const [gold, hypo] = normaliseRecipe(r);
    expect(gold.gramsPerLitre).toBeCloseTo(1, 12);
    expect(hypo.gramsPerLitre).toBeCloseTo(200, 12);
  });

  it('a mass with a density also gets ml per litre', () => {
    const r: Recipe = { name: 'x', volumeMl: 1000, ingredients: [{ chemical: 'Glacial acetic acid', amount: 10.49, unit: 'g', densityGPerMl: 1.049 }] };
    expect(normaliseRecipe(r)[0].mlPerLitre).toBeCloseTo(10, 10);
  });

  it('refuses a recipe volume of 0 and impossible amounts, strengths and densities', () => {
    expect(() => normaliseRecipe({ ...withDilute, volumeMl: 0 })).toThrow(RangeError);
    const bad = (i: Recipe['ingredients'][number]) => () => normaliseRecipe({ name: 'x', volumeMl: 100, ingredients: [i] });
    expect(bad({ chemical: 'x', amount: -1, unit: 'g' })).toThrow(/amount/);
    expect(bad({ chemical: 'x', amount: Number.NaN, unit: 'g' })).toThrow(/amount/);
    expect(bad({ chemical: 'x', amount: 1, unit: 'g', strengthPercent: 0 })).toThrow(/strength/);
    expect(bad({ chemical: 'x', amount: 1, unit: 'g', strengthPercent: 101 })).toThrow(/strength/);
    expect(bad({ chemical: 'x', amount: 1, unit: 'ml', densityGPerMl: 0 })).toThrow(/density/);
  });
});

describe('scaleRecipe', () => {
  it('500 ml → 2 L multiplies every amount by 4, units kept', () => {
    const big = scaleRecipe(withDilute, 2000);
    expect(big.volumeMl).toBe(2000);
    expect(big.ingredients.map((i) => [i.amount, i.unit])).toEqual([[16, 'g'], [16, 'g'], [520, 'g']]);
    expect(big.ingredients[2].strengthPercent).toBe(28);
    // Per-litre figures do not change with scaling.
    expect(normaliseRecipe(big)).toEqual(normaliseRecipe(withDilute).map((n, k) => ({ ...n, givenAs: ['16 g', '16 g', '520 g of 28 % solution'][k] })));
    // The original is left as it was.
    expect(withDilute.ingredients[0].amount).toBe(4);
  });

  it('scales down too', () => {
    expect(scaleRecipe(withDilute, 250).ingredients.map((i) => i.amount)).toEqual([2, 2, 65]);
  });

  it('rejects a target volume ≤ 0 or not a number with a RangeError', () => {
    expect(() => scaleRecipe(withDilute, 0)).toThrow(RangeError);
    expect(() => scaleRecipe(withDilute, -500)).toThrow(RangeError);
    expect(() => scaleRecipe(withDilute, Number.NaN)).toThrow(RangeError);
  });
});

describe('recipeCautions (texts are common practice in darkroom chemical safety)', () => {
  const codes = (r: Recipe) => recipeCautions(r).map((c) => c.code);
  const general = ['gloves', 'eye_protection', 'ventilation', 'safety_data_sheet'];

  it('always gives the general cautions, deferring to safety data sheets, regulations and the institution', () => {
    const plain: Recipe = { name: 'wash aid', volumeMl: 1000, ingredients: [{ chemical: 'Sodium sulfite', amount: 20, unit: 'g' }] };
    expect(codes(plain)).toEqual(general);
    const sds = recipeCautions(plain).find((c) => c.code === 'safety_data_sheet')!.text;
    expect(sds).toMatch(/safety data sheet/);
    expect(sds).toMatch(/local regulations/);
    expect(sds).toMatch(/institution's health-and-safety practice/);
  });

  it('iron-blue toner with 28 % acetic: ferricyanide caution and acid-to-water, not the concentrated-acid one', () => {
    expect(codes(withDilute)).toEqual([...general, 'ferricyanide_acid_heat', 'acid_to_water']);
    const text = recipeCautions(withDilute).find((c) => c.code === 'ferricyanide_acid_heat')!.text;
    expect(text).toMatch(/strong acids/);
    expect(text).toMatch(/heat/);
    expect(text).toMatch(/hydrogen cyanide/);
  });

  it('glacial acetic acid (named, unqualified, or over 80 %) adds the corrosive caution', () => {
    expect(codes(withGlacial)).toContain('acetic_acid_concentrated');
    const strong: Recipe = { name: 's', volumeMl: 100, ingredients: [{ chemical: 'Acetic acid', amount: 5, unit: 'g', strengthPercent: 90 }] };
    expect(codes(strong)).toEqual([...general, 'acetic_acid_concentrated', 'acid_to_water']);
    const eighty: Recipe = { name: 's', volumeMl: 100, ingredients: [{ chemical: 'ACETIC ACID', amount: 5, unit: 'g', strengthPercent: 80 }] };
    expect(codes(eighty)).not.toContain('acetic_acid_concentrated');
    expect(recipeCautions(strong).find((c) => c.code === 'acetic_acid_concentrated')!.text).toMatch(/corrosive/);
  });

  it('a ferricyanide with a strong acid gets the combination caution (case-insensitive names)', () => {
    const r: Recipe = {
      name: 'x', volumeMl: 1000,
      ingredients: [
        { chemical: 'POTASSIUM FERRICYANIDE', amount: 1, unit: 'g' },
        { chemical: 'Sulphuric acid', amount: 1, unit: 'ml', strengthPercent: 10 },
      ],
    };
    expect(codes(r)).toEqual([...general, 'ferricyanide_acid_heat', 'ferricyanide_with_strong_acid', 'acid_to_water']);
  });

  it('any acid, even a strong one named without the word "acid", gets acid-to-water', () => {
    const r: Recipe = { name: 'x', volumeMl: 1000, ingredients: [{ chemical: 'Hydrochloric', amount: 1, unit: 'ml' }] };
    expect(codes(r)).toContain('acid_to_water');
    expect(recipeCautions(r).find((c) => c.code === 'acid_to_water')!.text).toBe('Always add acid to water, never water to acid.');
  });

  it('adds the cautions of the table of toner chemicals: sulfides, selenium, thiocyanate and gold chloride, each with its H-statements', () => {
    const sepia: Recipe = { name: 'redeveloper', volumeMl: 1000, ingredients: [{ chemical: 'sodium sulfide nonahydrate', amount: 20, unit: 'g' }] };
    const sulfide = recipeCautions(sepia).find((c) => c.code === 'chemical_sodium_sulfide')!;
    expect(sulfide.text).toMatch(/hydrogen sulfide/);
    expect(sulfide.text).toMatch(/H314/);
    const selenium: Recipe = { name: 'selenium', volumeMl: 1000, ingredients: [{ chemical: 'selenium toner concentrate', amount: 50, unit: 'ml' }] };
    expect(recipeCautions(selenium).find((c) => c.code === 'chemical_selenium')!.text).toMatch(/disposal/);
    const gold: Recipe = {
      name: 'gold', volumeMl: 1000,
      ingredients: [{ chemical: 'gold(III) chloride, 1 % solution', amount: 10, unit: 'ml' }, { chemical: 'ammonium thiocyanate', amount: 10, unit: 'g' }],
    };
    // in the order of the ingredients
    expect(codes(gold)).toEqual([...general, 'chemical_gold_chloride', 'chemical_ammonium_thiocyanate']);
    expect(recipeCautions(gold).find((c) => c.code === 'chemical_ammonium_thiocyanate')!.text).toMatch(/EUH032.*acids/);
  });
});
