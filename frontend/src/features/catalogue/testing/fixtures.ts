import { recipeCautions } from '@toneledger/common/domain/recipes';
import { blankValues } from '@toneledger/common/fields/field';
import { PRINT_FIELDS } from '@toneledger/common/fields/print';
import type { Enclosure, Print, PrintListItem, ProcessStep, Recipe } from '@toneledger/common/schemas/catalogue';
import { json } from '@/test/fetch-mock';

export const PRINT_ID = '11111111-2222-4333-8444-555555555555';
export const MAKER_ID = '21111111-2222-4333-8444-555555555555';
export const PAPER_ID = '31111111-2222-4333-8444-555555555555';
export const BUFFERED_ID = '41111111-2222-4333-8444-555555555555';
export const UNBUFFERED_ID = '42111111-2222-4333-8444-555555555555';
export const LOCATION_ID = '51111111-2222-4333-8444-555555555555';
export const RECIPE_ID = '61111111-2222-4333-8444-555555555555';
export const SULFIDE_RECIPE_ID = '62111111-2222-4333-8444-555555555555';

export function makeStep(overrides: Partial<ProcessStep> = {}): ProcessStep {
  return {
    id: '71111111-2222-4333-8444-555555555555', position: 1, type: 'development', agent: 'Developer D-1', tonerClass: null, recipe: null,
    dilution: '1+2', timeSeconds: 120, temperatureC: 20, extent: null, concentration: null, alkaline: null, method: null, value: null,
    unit: null, notes: null, ...overrides,
  };
}

/** A whole print; `blankValues` gives every public field that may be empty its null, so a new field needs no change here. */
export function makePrint(overrides: Partial<Print> = {}): Print {
  return {
    ...blankValues(PRINT_FIELDS),
    id: PRINT_ID,
    accessionNumber: '1987.14.3',
    title: 'Harbour wall, low tide',
    maker: { id: MAKER_ID, name: 'Wenna Trask' },
    dateMade: '1968-04~',
    dateDisplay: 'about April 1968',
    dateEarliest: '1968-04-01',
    dateLatest: '1968-04-30',
    imageWidthMm: 240, imageHeightMm: 180, sheetWidthMm: 254, sheetHeightMm: 203, mountWidthMm: null, mountHeightMm: null,
    process: 'gelatin_silver_developing_out',
    support: 'fibre_baryta',
    paper: { id: PAPER_ID, label: 'Harbourline Velvet Fibre' },
    inscriptions: null, provenance: 'Gift of the maker, 1987', creditLine: null,
    status: 'in_store',
    borrowed: false,
    enclosure: { id: UNBUFFERED_ID, name: 'Plain sleeve', alkalineBuffered: false, patResult: 'passed' },
    lightResponsivity: 'medium',
    tonerClasses: [],
    warnings: [],
    steps: [makeStep()],
    location: { id: LOCATION_ID, pathLabel: 'Store A › Cabinet 2' },
    staffNotes: null, valuationAmount: null, valuationCurrency: null,
    version: 3,
    createdAt: '2024-01-01T10:00:00.000Z',
    updatedAt: '2024-06-01T10:00:00.000Z',
    ...overrides,
  };
}

export function makeListItem(overrides: Partial<PrintListItem> = {}): PrintListItem {
  return {
    id: PRINT_ID, accessionNumber: '1987.14.3', title: 'Harbour wall, low tide', makerName: 'Wenna Trask', dateMade: '1968-04~',
    dateDisplay: 'about April 1968', process: 'gelatin_silver_developing_out', support: 'fibre_baryta', status: 'in_store',
    tonerClasses: ['iron_blue'], paperLabel: null, enclosureName: 'Buffered folder', warningCodes: ['prussian_blue_in_buffered_enclosure'],
    updatedAt: '2024-06-01T10:00:00.000Z', locationLabel: 'Store A › Cabinet 2', ...overrides,
  };
}

export const enclosures: Enclosure[] = [
  { id: UNBUFFERED_ID, name: 'Plain sleeve', material: 'Polyester', alkalineBuffered: false, patResult: 'passed', notes: null, printCount: 1, version: 1 },
  { id: BUFFERED_ID, name: 'Buffered folder', material: 'Buffered board', alkalineBuffered: true, patResult: 'passed', notes: null, printCount: 0, version: 1 },
];

export const recipes: Recipe[] = [
  {
    id: RECIPE_ID, name: 'Iron blue toner A', tonerClass: 'iron_blue', volumeMl: 1000, ingredients: [{ chemical: 'Ferric ammonium citrate', amount: 4, unit: 'g' }],
    mixingNotes: null, normalised: [], cautions: [], stepCount: 0, version: 1,
  },
  {
    id: SULFIDE_RECIPE_ID, name: 'Sepia redeveloper', tonerClass: 'sulfide', volumeMl: 1000, ingredients: [{ chemical: 'sodium sulfide nonahydrate', amount: 20, unit: 'g' }],
    mixingNotes: null, normalised: [],
    cautions: recipeCautions({ name: 'Sepia redeveloper', volumeMl: 1000, ingredients: [{ chemical: 'sodium sulfide nonahydrate', amount: 20, unit: 'g' }] }),
    stepCount: 0, version: 1,
  },
];

const page = (data: unknown[]) => () => json({ data, pagination: { page: 1, pageSize: 1000, total: data.length } });

/** Handlers for the reference lists the pickers load. */
export function referenceHandlers() {
  return {
    'GET /api/makers': page([{ id: MAKER_ID, name: 'Wenna Trask', lifeDates: null, notes: null, printCount: 1, version: 1 }]),
    'GET /api/papers': page([]),
    'GET /api/enclosures': page(enclosures),
    'GET /api/locations': page([
      { id: LOCATION_ID, name: 'Cabinet 2', kind: 'cabinet', parentId: null, code: null, notes: null, path: ['Store A', 'Cabinet 2'], pathLabel: 'Store A › Cabinet 2', depth: 1, printCount: 1, version: 1 },
    ]),
    'GET /api/recipes': page(recipes),
    'GET /api/settings/catalogue': () => json({ data: { accessionPattern: 'YYYY.N.N', institutionName: 'Trust' } }),
  };
}
