import type { Enclosure, Location, Maker, Recipe } from '@toneledger/common/schemas/catalogue';

export function page<T>(data: T[], total = data.length, pageSize = 200) {
  return { data, pagination: { page: 1, pageSize, total } };
}

export function makeMaker(overrides: Partial<Maker> = {}): Maker {
  return { id: '11111111-1111-4111-8111-111111111111', name: 'Wren Halloway', lifeDates: '1931–2004', notes: null, printCount: 12, version: 1, ...overrides };
}

export function makeEnclosure(overrides: Partial<Enclosure> = {}): Enclosure {
  return {
    id: '22222222-2222-4222-8222-222222222222',
    name: 'Four-flap folder',
    material: 'Cotton rag paper',
    alkalineBuffered: false,
    patResult: 'passed',
    notes: null,
    printCount: 40,
    version: 3,
    ...overrides,
  };
}

export function makeLocation(overrides: Partial<Location> = {}): Location {
  return {
    id: '33333333-3333-4333-8333-333333333333',
    name: 'North store',
    kind: 'building',
    parentId: null,
    code: null,
    notes: null,
    path: ['North store'],
    pathLabel: 'North store',
    depth: 0,
    printCount: 0,
    version: 1,
    ...overrides,
  };
}

/** A single-bath iron-blue toner for 500 ml, as the server would return it. */
export function makeRecipe(overrides: Partial<Recipe> = {}): Recipe {
  return {
    id: '44444444-4444-4444-8444-444444444444',
    name: 'Iron blue, single bath',
    tonerClass: 'iron_blue',
    volumeMl: 500,
    ingredients: [
      { chemical: 'Ferric ammonium citrate', amount: 4, unit: 'g', strengthPercent: null, densityGPerMl: null },
      { chemical: 'Potassium ferricyanide', amount: 4, unit: 'g', strengthPercent: null, densityGPerMl: null },
      { chemical: 'Acetic acid', amount: 130, unit: 'g', strengthPercent: 28, densityGPerMl: null },
    ],
    mixingNotes: 'Dissolve each salt separately in water at room temperature.',
    normalised: [
      { chemical: 'Ferric ammonium citrate', givenAs: '4 g', gramsPerLitre: 8, mlPerLitre: null, pureGramsPerLitre: 8 },
      { chemical: 'Potassium ferricyanide', givenAs: '4 g', gramsPerLitre: 8, mlPerLitre: null, pureGramsPerLitre: 8 },
      { chemical: 'Acetic acid', givenAs: '130 g of 28 % solution', gramsPerLitre: 260, mlPerLitre: null, pureGramsPerLitre: 72.8 },
    ],
    cautions: [
      { code: 'gloves', text: 'Wear chemical-resistant gloves when weighing, mixing and using the bath.' },
      { code: 'ferricyanide_acid_heat', text: 'Contains a ferricyanide: never mix it with strong acids or heat it.' },
    ],
    stepCount: 5,
    version: 2,
    ...overrides,
  };
}
