import { describe, expect, it } from 'vitest';
import {
  HAZARD_STATEMENTS, PICTOGRAMS, RECALLED, TONER_CHEMICALS, ingredientHazard, isHazardous, recipePictograms, strengthText,
  type Classification, type HazardCode, type PictogramCode,
} from './toner-chemicals';

/**
 * The pictograms and signal word that GHS assigns to a set of hazard statements (UN GHS, chapter 1.4,
 * allocation and precedence of pictograms, recalled from memory — verify): the skull and crossbones
 * replaces the exclamation mark; corrosion replaces the exclamation mark for skin and eye irritation;
 * H412, H413 and EUH statements carry no pictogram. An independent restatement of the rules, so a
 * table entry whose pictograms do not follow from its statements fails here.
 */
const PICTOGRAM_OF: Partial<Record<HazardCode, PictogramCode>> = {
  H226: 'GHS02', H290: 'GHS05', H314: 'GHS05', H318: 'GHS05',
  H301: 'GHS06', H311: 'GHS06', H331: 'GHS06',
  H302: 'GHS07', H312: 'GHS07', H332: 'GHS07', H315: 'GHS07', H317: 'GHS07', H319: 'GHS07', H335: 'GHS07',
  H351: 'GHS08', H360FD: 'GHS08', H361d: 'GHS08', H373: 'GHS08',
  H400: 'GHS09', H410: 'GHS09', H411: 'GHS09',
};
const DANGER: HazardCode[] = ['H314', 'H318', 'H301', 'H311', 'H331', 'H360FD'];
const IRRITATION: HazardCode[] = ['H315', 'H319'];

function expected(c: Classification): { pictograms: PictogramCode[]; signalWord: Classification['signalWord'] } {
  const set = new Set<PictogramCode>();
  for (const h of c.hazards) {
    const p = PICTOGRAM_OF[h];
    if (p) set.add(p);
  }
  if (set.has('GHS06')) set.delete('GHS07');
  if (set.has('GHS05') && c.hazards.filter((h) => PICTOGRAM_OF[h] === 'GHS07').every((h) => IRRITATION.includes(h))) set.delete('GHS07');
  const pictograms = (Object.keys(PICTOGRAMS) as PictogramCode[]).filter((p) => set.has(p));
  const signalWord = c.hazards.some((h) => DANGER.includes(h)) ? 'Danger' : pictograms.length > 0 ? 'Warning' : null;
  return { pictograms, signalWord };
}

describe('the table of toner chemicals', () => {
  it('every entry is marked as recalled from memory, with a text for each statement', () => {
    for (const e of TONER_CHEMICALS) {
      expect(e.source).toBe(RECALLED);
      for (const h of [...e.hazards, ...(e.byStrength ?? []).flatMap((b) => b.hazards)]) expect(HAZARD_STATEMENTS[h]).toMatch(/\.$/);
    }
  });

  it.each(TONER_CHEMICALS.flatMap((e) => [[e.key, e as Classification] as const, ...(e.byStrength ?? []).map((b) => [`${e.key} ${b.label}`, b as Classification] as const)]))(
    '%s: pictograms and signal word follow from the statements (GHS allocation rules)',
    (_key, c) => {
      expect({ pictograms: c.pictograms, signalWord: c.signalWord }).toEqual(expected(c));
    },
  );

  it('covers the families toners use: sulfides, selenium, ferricyanide, thiocyanate, gold chloride, acetic acid', () => {
    expect(ingredientHazard({ chemical: 'sodium sulfide nonahydrate' }).classification.hazards).toContain('EUH031');
    expect(ingredientHazard({ chemical: 'potassium polysulfide' }).entry?.caution).toMatch(/hydrogen sulfide/);
    expect(ingredientHazard({ chemical: 'sodium selenite' }).classification.hazards).toEqual(expect.arrayContaining(['H301', 'H331']));
    expect(ingredientHazard({ chemical: 'potassium ferricyanide' }).entry?.caution).toMatch(/hydrogen cyanide/);
    expect(ingredientHazard({ chemical: 'ammonium thiocyanate' }).classification.hazards).toContain('EUH032');
    expect(ingredientHazard({ chemical: 'gold(III) chloride, 1 % solution' }).classification.hazards).toContain('H314');
  });

  // Every ingredient of the demo recipes (backend/src/seed/demo-catalogue.ts, RECIPES) is in the table.
  it.each([
    'ferric ammonium citrate (green)', 'potassium ferricyanide', 'acetic acid, 28 %',
    'selenium toner concentrate (sodium selenosulfate solution)', 'sodium sulfite, anhydrous', 'gold(III) chloride, 1 % solution',
    'ammonium thiocyanate', 'potassium bromide', 'sodium sulfide nonahydrate', 'potassium polysulfide', 'sodium carbonate, anhydrous',
    'copper(II) sulfate pentahydrate', 'potassium citrate monohydrate', 'sodium tetraborate decahydrate (borax)',
  ])('the demo ingredient "%s" has an entry', (chemical) => {
    expect(ingredientHazard({ chemical }).entry).not.toBeNull();
  });
});

describe('acetic acid by strength (CLP Annex VI concentration limits, recalled from memory)', () => {
  it.each([
    [{ chemical: 'acetic acid, glacial' }, ['H226', 'H314'], 'glacial (90 % or more)'],
    [{ chemical: 'acetic acid', strengthPercent: 99.7 }, ['H226', 'H314'], 'glacial (90 % or more)'],
    [{ chemical: 'acetic acid, 28 %' }, ['H314'], '25 % to under 90 %'],
    [{ chemical: 'acetic acid', strengthPercent: 28 }, ['H314'], '25 % to under 90 %'],
    [{ chemical: 'acetic acid', strengthPercent: 25 }, ['H314'], '25 % to under 90 %'],
    [{ chemical: 'acetic acid', strengthPercent: 24.9 }, ['H315', 'H319'], '10 % to under 25 %'],
    [{ chemical: 'acetic acid', strengthPercent: 5 }, [], 'under 10 %'],
  ])('%o', (ingredient, hazards, band) => {
    const h = ingredientHazard(ingredient);
    expect(h.classification.hazards).toEqual(hazards);
    expect(h.strengthBand).toBe(band);
  });
});

describe('recipe marks and strengths', () => {
  it('marks a recipe hazardous when any ingredient carries a statement', () => {
    expect(isHazardous([{ chemical: 'sodium tetraborate decahydrate (borax)' }])).toBe(true);
    expect(isHazardous([{ chemical: 'potassium citrate monohydrate' }, { chemical: 'sodium sulfite, anhydrous' }])).toBe(false);
    expect(isHazardous([{ chemical: 'acetic acid', strengthPercent: 2 }])).toBe(false);
    expect(isHazardous([{ chemical: 'a chemical nobody listed' }])).toBe(false);
  });

  it('lists a recipe’s pictograms once each, in GHS order', () => {
    expect(recipePictograms([{ chemical: 'potassium ferricyanide' }, { chemical: 'acetic acid, 28 %' }, { chemical: 'ferric ammonium citrate' }])).toEqual(['GHS05']);
    expect(recipePictograms([{ chemical: 'gold(III) chloride, 1 % solution' }, { chemical: 'ammonium thiocyanate' }])).toEqual(['GHS05', 'GHS07']);
  });

  it('shows a solution’s strength, never "pure" for a solution', () => {
    expect(strengthText({ chemical: 'gold(III) chloride, 1 % solution' })).toBe('1 % solution');
    expect(strengthText({ chemical: 'gold(III) chloride solution', strengthPercent: 1 })).toBe('1 % solution');
    expect(strengthText({ chemical: 'acetic acid', strengthPercent: 28 })).toBe('28 % solution');
    expect(strengthText({ chemical: 'selenium toner concentrate (sodium selenosulfate solution)' })).toBe('solution, strength as supplied');
    expect(strengthText({ chemical: 'potassium bromide' })).toBe('pure');
    expect(strengthText({ chemical: 'acetic acid', strengthPercent: 100 })).toBe('100 %');
  });
});
