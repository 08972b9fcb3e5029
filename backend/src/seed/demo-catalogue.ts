import { QueryTypes } from 'sequelize';
import { DEFAULT_ACCESSION_PATTERN } from '@toneledger/common/domain/accession';
import {
  enclosureInputSchema, locationInputSchema, makerInputSchema, paperInputSchema, printInputSchema, processStepInputSchema, recipeInputSchema,
  type PrintInput, type ProcessStepInput,
} from '@toneledger/common/schemas/catalogue';
import { db } from '../db';
import { BathRecipe, EnclosureType, Location, Maker, Paper, Print, ProcessStep } from '../models';
import { createReference, enclosures, locations, makers, papers, recipes } from '../services/reference.service';
import { createPrint, movePrint, replaceSteps } from '../services/print.service';
import { placedAtFor } from './demo-times';
import { putCatalogueSettings } from '../services/settings.service';
import { recordAudit } from '../services/audit.service';
import { DEMO_INSTITUTION } from './demo-accounts';
import { inPool } from './pool';

/**
 * The demo catalogue of the (invented) Calder Reach Photographic Trust: fictional printers,
 * papers from invented mills, bath recipes, a store with its cabinets and boxes, enclosure types,
 * and a few hundred prints made from the 1950s to the 2020s with their process histories.
 *
 * Everything goes through the services (so audit rows, stored warnings, toner classes and sort
 * keys are exactly what the app itself writes), and every input is checked with the request
 * schemas first. The collection comes from a seeded pseudo-random generator: one seed, one
 * collection, on every machine.
 */

export interface SeedActor {
  id: string | null;
  name: string | null;
}

export interface DemoCatalogueOptions {
  /** Seed of the pseudo-random generator (same seed → same collection). */
  seed?: number;
  /** How many prints (about; lots are filled whole). */
  prints?: number;
  /** Prints written at once (each through its own transactions). */
  concurrency?: number;
  /** Stops the seed between records (it then rejects with the signal's reason). */
  signal?: AbortSignal;
}

// ── Deterministic pseudo-random numbers ─────────────────────────────────────

/** mulberry32: small, fast, and the same sequence for the same seed everywhere. */
export function prng(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const int = (lo: number, hi: number) => lo + Math.floor(next() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)];
  const chance = (p: number) => next() < p;
  const weighted = <T>(pairs: readonly (readonly [T, number])[]): T => {
    const total = pairs.reduce((s, [, w]) => s + w, 0);
    let r = next() * total;
    for (const [v, w] of pairs) {
      r -= w;
      if (r < 0) return v;
    }
    return pairs[pairs.length - 1][0];
  };
  return { next, int, pick, chance, weighted };
}
type Rng = ReturnType<typeof prng>;

// ── Reference records ───────────────────────────────────────────────────────

type Toning =
  | 'none' | 'selenium' | 'selenium_light' | 'gold' | 'sepia' | 'sepia_partial' | 'polysulfide' | 'copper'
  | 'iron_blue' | 'iron_blue_partial' | 'iron_blue_borax' | 'selenium_gold_split' | 'sepia_blue_split' | 'selenium_split';

interface MakerSpec {
  name: string;
  lifeDates: string;
  notes: string;
  active: [number, number];
  /** Which toning this printer used, and how often. */
  practice: [Toning, number][];
  /** Share of prints on resin-coated paper once RC is on the market. */
  rc: number;
  /** Share of cyanotypes and printing-out prints in the output. */
  cyanotype?: number;
  printingOut?: number;
}

const MAKERS: MakerSpec[] = [
  {
    name: 'Edwina Carrow-Hesketh', lifeDates: '1921/1994', active: [1950, 1988], rc: 0,
    notes: 'Harbour and estuary work; printed her own exhibition prints on warm-tone fibre papers.',
    practice: [['none', 3], ['selenium', 4], ['sepia', 2], ['sepia_partial', 1]],
  },
  {
    name: 'Tobias Mereweather', lifeDates: '1918/1987', active: [1950, 1979], rc: 0, printingOut: 0.3,
    notes: 'Studio portraitist; kept printing-out paper for proofs and gold-toned them.',
    practice: [['none', 2], ['gold', 3], ['sepia', 3], ['polysulfide', 1]],
  },
  {
    name: 'Ilse Vantongeren', lifeDates: '1930/2011', active: [1955, 2005], rc: 0.1,
    notes: 'Known for split-toned landscapes; her notebooks give times and dilutions for many prints.',
    practice: [['selenium_split', 3], ['selenium_gold_split', 2], ['selenium', 2], ['iron_blue_partial', 1]],
  },
  {
    name: 'Raymond Achterberg-Lowe', lifeDates: '1926/2003', active: [1952, 1998], rc: 0.25,
    notes: 'Press and industrial work; most prints untoned, some selenium-toned for exhibition.',
    practice: [['none', 6], ['selenium_light', 2], ['selenium', 1]],
  },
  {
    name: 'Morwenna Traskey', lifeDates: '1942/..', active: [1966, 2023], rc: 0.2, cyanotype: 0.2,
    notes: 'Coastal series in iron blue; also hand-coated cyanotypes from the 1990s.',
    practice: [['iron_blue', 4], ['iron_blue_borax', 2], ['iron_blue_partial', 2], ['sepia_blue_split', 1], ['none', 1]],
  },
  {
    name: 'Declan Ushworth', lifeDates: '1935/1999', active: [1958, 1996], rc: 0.15,
    notes: 'Mill towns and quarries; copper and sepia toners for a series on brick kilns.',
    practice: [['copper', 3], ['sepia', 2], ['none', 2], ['polysulfide', 1]],
  },
  {
    name: 'Paulette Grisedale', lifeDates: '1949/..', active: [1972, 2022], rc: 0.45,
    notes: 'Teaching printer; many demonstration prints of toners side by side.',
    practice: [['selenium', 2], ['sepia', 2], ['iron_blue', 2], ['copper', 1], ['gold', 1], ['polysulfide', 1], ['none', 1]],
  },
  {
    name: 'Anselm Korvath', lifeDates: '1928?/1990', active: [1953, 1986], rc: 0.05,
    notes: 'Emigrated to the coast in 1953; life dates from a parish register, birth year uncertain.',
    practice: [['gold', 2], ['selenium', 2], ['none', 2]],
  },
  {
    name: 'Wren Tallisker', lifeDates: '1957/..', active: [1980, 2024], rc: 0.3, cyanotype: 0.1,
    notes: 'Botanical studies; iron-blue toned silver prints and cyanotypes of the same plants.',
    practice: [['iron_blue', 3], ['iron_blue_partial', 2], ['selenium', 1], ['none', 1]],
  },
  {
    name: 'Oona Faircloth', lifeDates: '1961/..', active: [1985, 2024], rc: 0.35,
    notes: 'Portraits of fishing families; selenium for permanence, sometimes gold.',
    practice: [['selenium', 4], ['selenium_gold_split', 2], ['gold', 1], ['none', 1]],
  },
  {
    name: 'Casimir Ledwidge-Ray', lifeDates: '1939/2016', active: [1962, 2012], rc: 0.3,
    notes: 'Night townscapes; polysulfide and sepia for warm tones.',
    practice: [['polysulfide', 3], ['sepia_partial', 2], ['sepia', 1], ['none', 2]],
  },
  {
    name: 'Saoirse Pennethorne', lifeDates: '1972/..', active: [1996, 2024], rc: 0.25, cyanotype: 0.15,
    notes: 'Works across iron-based and silver processes; prints made for the Trust\'s 2019 commission.',
    practice: [['iron_blue', 2], ['iron_blue_borax', 2], ['copper', 1], ['selenium', 1], ['none', 1]],
  },
  {
    name: 'Halvard Ember', lifeDates: '1984/..', active: [2008, 2024], rc: 0.4,
    notes: 'Large prints of salt marshes; selenium and gold toned.',
    practice: [['selenium', 3], ['gold', 1], ['selenium_gold_split', 1], ['none', 1]],
  },
];

interface PaperSpec {
  key: string;
  manufacturer: string;
  product: string;
  base: 'fibre' | 'rc' | 'other';
  surface: string;
  baseTint: string;
  weight: string;
  opticalBrighteners: 'yes' | 'no' | 'unknown';
  madeDates: string;
  made: [number, number];
  warm?: boolean;
  notes?: string;
}

const PAPERS: PaperSpec[] = [
  { key: 'marram-glossy', manufacturer: 'Harrowgate Photographic Co.', product: 'Marram Bromide', base: 'fibre', surface: 'glossy', baseTint: 'white', weight: 'double weight', opticalBrighteners: 'no', madeDates: '1946/1972', made: [1946, 1972] },
  { key: 'marram-semimatt', manufacturer: 'Harrowgate Photographic Co.', product: 'Marram Bromide', base: 'fibre', surface: 'semi-matt', baseTint: 'white', weight: 'single weight', opticalBrighteners: 'no', madeDates: '1946/1969', made: [1946, 1969] },
  { key: 'pellucid', manufacturer: 'Vellmar Emulsionswerk', product: 'Pellucid Chlorobromide', base: 'fibre', surface: 'lustre', baseTint: 'warm white', weight: 'double weight', opticalBrighteners: 'no', madeDates: '1955/1986', made: [1955, 1986], warm: true },
  { key: 'studio-velvet', manufacturer: 'Corrimont Papeteries', product: 'Studio Velvet', base: 'fibre', surface: 'velvet stipple', baseTint: 'ivory', weight: 'double weight', opticalBrighteners: 'no', madeDates: '1948/1968', made: [1948, 1968], warm: true, notes: 'Textured portrait paper; the packet calls the tint "old ivory".' },
  { key: 'fellside', manufacturer: 'Aldersey Sensitising Co.', product: 'Fellside Warmtone', base: 'fibre', surface: 'matt', baseTint: 'cream', weight: 'double weight', opticalBrighteners: 'no', madeDates: '1962/1991', made: [1962, 1991], warm: true },
  { key: 'tidewater-pearl', manufacturer: 'Northgate & Fell', product: 'Tidewater RC', base: 'rc', surface: 'pearl', baseTint: 'white', weight: 'medium weight', opticalBrighteners: 'yes', madeDates: '1974/2009', made: [1974, 2009] },
  { key: 'tidewater-glossy', manufacturer: 'Northgate & Fell', product: 'Tidewater RC', base: 'rc', surface: 'glossy', baseTint: 'white', weight: 'medium weight', opticalBrighteners: 'yes', madeDates: '1974/2009', made: [1974, 2009] },
  { key: 'vellmar-satin', manufacturer: 'Vellmar Emulsionswerk', product: 'Variable Contrast RC', base: 'rc', surface: 'satin', baseTint: 'white', weight: 'medium weight', opticalBrighteners: 'yes', madeDates: '1979/2003', made: [1979, 2003] },
  { key: 'graded-neutral', manufacturer: 'Saltmarsh & Penrose', product: 'Graded Neutral FB', base: 'fibre', surface: 'glossy', baseTint: 'white', weight: 'double weight', opticalBrighteners: 'unknown', madeDates: '1985/..', made: [1985, 2024] },
  { key: 'heron', manufacturer: 'Quenby Paper Mills', product: 'Heron Cold Tone FB', base: 'fibre', surface: 'glossy', baseTint: 'bright white', weight: '300 g/m²', opticalBrighteners: 'yes', madeDates: '1994/2018', made: [1994, 2018] },
  { key: 'kilnworth', manufacturer: 'Ashmoor Fine Papers', product: 'Kilnworth Warmtone FB', base: 'fibre', surface: 'matt', baseTint: 'natural', weight: '310 g/m²', opticalBrighteners: 'no', madeDates: '2005/..', made: [2005, 2024], warm: true },
  { key: 'cotton-rag', manufacturer: 'Ashmoor Fine Papers', product: 'Kilnworth Cotton Rag (uncoated, for hand coating)', base: 'other', surface: 'matt', baseTint: 'natural', weight: '300 g/m²', opticalBrighteners: 'no', madeDates: '1988/..', made: [1988, 2024], notes: 'Sold uncoated; the printer coats it for cyanotype.' },
];

const SDS =
  "Follow the safety data sheet of each chemical, local regulations and the Trust's health-and-safety practice; " +
  'wear gloves and eye protection and mix in good ventilation.';

interface RecipeSpec {
  key: string;
  name: string;
  tonerClass: PrintToner | null;
  volumeMl: number;
  ingredients: { chemical: string; amount: number; unit: 'g' | 'mg' | 'ml' | 'l' | 'kg'; strengthPercent?: number; densityGPerMl?: number }[];
  mixingNotes: string;
}
type PrintToner = 'selenium' | 'gold' | 'sulfide' | 'polysulfide' | 'iron_blue' | 'copper' | 'vanadium' | 'other';

const RECIPES: RecipeSpec[] = [
  {
    key: 'iron_blue', name: 'Iron-blue single-bath toner', tonerClass: 'iron_blue', volumeMl: 500,
    ingredients: [
      { chemical: 'ferric ammonium citrate (green)', amount: 4, unit: 'g' },
      { chemical: 'potassium ferricyanide', amount: 4, unit: 'g' },
      { chemical: 'acetic acid, 28 %', amount: 130, unit: 'g', strengthPercent: 28 },
    ],
    mixingNotes:
      'Dissolve the ferric ammonium citrate and the ferricyanide separately in about 150 ml of water each, at room ' +
      'temperature; combine them, add the acetic acid slowly, and make up to 500 ml with water. Mix just before use and ' +
      'discard after the session. Never heat the bath, and keep ferricyanide away from strong acids. ' + SDS,
  },
  {
    key: 'selenium', name: 'Selenium toner 1+19 with sulfite', tonerClass: 'selenium', volumeMl: 1000,
    ingredients: [
      { chemical: 'selenium toner concentrate (sodium selenosulfate solution)', amount: 50, unit: 'ml' },
      { chemical: 'sodium sulfite, anhydrous', amount: 20, unit: 'g' },
    ],
    mixingNotes:
      'Dissolve the sulfite in 900 ml of water, add the concentrate and make up to 1 litre (1+19). Diluted further ' +
      '(1+39) for archival toning with little colour change. Selenium compounds are toxic: do not pour used toner ' +
      'down the drain; collect it for disposal. ' + SDS,
  },
  {
    key: 'gold', name: 'Gold thiocyanate toner', tonerClass: 'gold', volumeMl: 1000,
    ingredients: [
      { chemical: 'gold(III) chloride, 1 % solution', amount: 10, unit: 'ml', strengthPercent: 1 },
      { chemical: 'ammonium thiocyanate', amount: 10, unit: 'g' },
    ],
    mixingNotes:
      'Dissolve the thiocyanate in 800 ml of water; add the gold chloride solution slowly while stirring, and make up to ' +
      '1 litre. Let it stand for an hour before use. ' + SDS,
  },
  {
    key: 'sepia_bleach', name: 'Sepia bleach (ferricyanide–bromide), stock', tonerClass: 'sulfide', volumeMl: 1000,
    ingredients: [
      { chemical: 'potassium ferricyanide', amount: 50, unit: 'g' },
      { chemical: 'potassium bromide', amount: 50, unit: 'g' },
    ],
    mixingNotes:
      'First bath of the two-bath sulfide (sepia) process. Stock solution; use 1+9. Mix at room temperature and never ' +
      'heat; keep away from acids. ' + SDS,
  },
  {
    key: 'sepia_redev', name: 'Sepia redeveloper (sodium sulfide)', tonerClass: 'sulfide', volumeMl: 1000,
    ingredients: [{ chemical: 'sodium sulfide nonahydrate', amount: 20, unit: 'g' }],
    mixingNotes:
      'Second bath of the two-bath sulfide process. It releases hydrogen sulfide, which smells and fogs sensitised ' +
      'materials: use it away from film and paper stock, with good ventilation, and never let it meet acid. ' + SDS,
  },
  {
    key: 'polysulfide', name: 'Polysulfide brown toner', tonerClass: 'polysulfide', volumeMl: 1000,
    ingredients: [
      { chemical: 'potassium polysulfide', amount: 7.5, unit: 'g' },
      { chemical: 'sodium carbonate, anhydrous', amount: 2.5, unit: 'g' },
    ],
    mixingNotes:
      'Used warm (about 38 °C) for a brown tone, or cold for a longer, more even tone. Releases hydrogen sulfide: ' +
      'ventilate, and keep away from acids and from film and paper stock. ' + SDS,
  },
  {
    key: 'copper', name: 'Copper citrate toner', tonerClass: 'copper', volumeMl: 1000,
    ingredients: [
      { chemical: 'copper(II) sulfate pentahydrate', amount: 7, unit: 'g' },
      { chemical: 'potassium citrate monohydrate', amount: 28, unit: 'g' },
      { chemical: 'potassium ferricyanide', amount: 6, unit: 'g' },
    ],
    mixingNotes:
      'Dissolve the citrate first, then the copper sulfate, then the ferricyanide, each in turn, at room temperature; ' +
      'make up to 1 litre. Never heat. ' + SDS,
  },
  {
    key: 'borax', name: 'Borax after-bath, 0.5 %', tonerClass: null, volumeMl: 1000,
    ingredients: [{ chemical: 'sodium tetraborate decahydrate (borax)', amount: 5, unit: 'g' }],
    mixingNotes:
      'Alkaline. Shifts iron blue toward grey or lilac; used briefly and on purpose. Keep iron-blue and cyanotype ' +
      'prints away from it otherwise. ' + SDS,
  },
  {
    key: 'hca', name: 'Sulfite clearing bath, 2 %', tonerClass: null, volumeMl: 1000,
    ingredients: [{ chemical: 'sodium sulfite, anhydrous', amount: 20, unit: 'g' }],
    mixingNotes: 'Hypo clearing bath for fibre prints before the final wash. ' + SDS,
  },
];

interface LocationSpec {
  key: string;
  name: string;
  kind: 'building' | 'room' | 'cabinet' | 'shelf' | 'drawer' | 'box' | 'other';
  parent?: string;
  code?: string;
  notes?: string;
}

const LOCATIONS: LocationSpec[] = [
  { key: 'house', name: 'Reach House', kind: 'building', code: 'RH', notes: 'The Trust\'s building on the quay.' },
  { key: 'store1', name: 'Print Store 1', kind: 'room', parent: 'house', code: 'RH-PS1', notes: 'Cool store, kept at about 16 °C and 40 % RH.' },
  { key: 'store2', name: 'Print Store 2', kind: 'room', parent: 'house', code: 'RH-PS2', notes: 'General store for mounted and framed prints.' },
  { key: 'studio', name: 'Conservation Studio', kind: 'room', parent: 'house', code: 'RH-CS' },
  { key: 'gallery', name: 'Gallery One', kind: 'room', parent: 'house', code: 'RH-G1', notes: 'Display at 50 lux.' },
  { key: 'study', name: 'Study Room', kind: 'room', parent: 'house', code: 'RH-SR' },
  { key: 'dispatch', name: 'Loans Dispatch', kind: 'room', parent: 'house', code: 'RH-LD', notes: 'Holding place for prints out on loan.' },
  { key: 'chestA', name: 'Plan chest A', kind: 'cabinet', parent: 'store1', code: 'PS1-A' },
  { key: 'chestB', name: 'Plan chest B', kind: 'cabinet', parent: 'store1', code: 'PS1-B' },
  { key: 'shelvesC', name: 'Box shelving C', kind: 'shelf', parent: 'store1', code: 'PS1-C' },
  { key: 'cabD', name: 'Cabinet D', kind: 'cabinet', parent: 'store2', code: 'PS2-D' },
  { key: 'holding', name: 'Holding cabinet', kind: 'cabinet', parent: 'studio', code: 'CS-H' },
  ...[1, 2, 3, 4].map((n) => ({ key: `A${n}`, name: `Drawer A${n}`, kind: 'drawer' as const, parent: 'chestA', code: `PS1-A${n}` })),
  ...[1, 2, 3, 4].map((n) => ({ key: `B${n}`, name: `Drawer B${n}`, kind: 'drawer' as const, parent: 'chestB', code: `PS1-B${n}` })),
  ...[1, 2, 3, 4].map((n) => ({ key: `C${n}`, name: `Box C${n}`, kind: 'box' as const, parent: 'shelvesC', code: `PS1-C${n}` })),
  ...[1, 2, 3].map((n) => ({ key: `D${n}`, name: `Drawer D${n}`, kind: 'drawer' as const, parent: 'cabD', code: `PS2-D${n}` })),
];
const STORE_PLACES = ['A1', 'A2', 'A3', 'A4', 'B1', 'B2', 'B3', 'B4', 'C1', 'C2', 'C3', 'C4', 'D1', 'D2', 'D3'];

interface EnclosureSpec {
  key: string;
  name: string;
  material: string;
  alkalineBuffered: boolean | null;
  patResult: 'passed' | 'failed' | 'not_tested';
  notes?: string;
}

const ENCLOSURES: EnclosureSpec[] = [
  { key: 'cotton', name: 'Unbuffered cotton four-flap folder', material: '100 % cotton board, unbuffered', alkalineBuffered: false, patResult: 'passed' },
  { key: 'buffered', name: 'Buffered four-flap folder', material: 'Lignin-free board with a calcium carbonate reserve', alkalineBuffered: true, patResult: 'passed' },
  { key: 'polyester', name: 'Polyester sleeve', material: 'Uncoated polyester film', alkalineBuffered: false, patResult: 'passed' },
  { key: 'mat', name: 'Buffered window mat in solander box', material: 'Buffered museum board', alkalineBuffered: true, patResult: 'passed', notes: 'Standard housing for exhibition prints since 1998.' },
  { key: 'glassine', name: 'Glassine envelope (legacy)', material: 'Glassine', alkalineBuffered: null, patResult: 'not_tested', notes: 'As received from donors; to be replaced.' },
  { key: 'kraft', name: 'Kraft paper envelope (legacy)', material: 'Brown kraft paper', alkalineBuffered: false, patResult: 'failed', notes: 'Failed the Photographic Activity Test in the 2016 survey; replace on handling.' },
];

// ── Words for titles, inscriptions and provenance (all invented) ────────────

const PLACES = [
  'Calder Reach', 'Tollevar Quay', 'Skelloch Head', 'Morrow Strand', 'Fennick Cross', 'Wrayburn Mill', 'Ennerdown',
  'Vossick Marsh', 'Hallamere', 'Quillan Sound', 'Brackenholme', 'Saltings Lane', 'Pellow Point', 'Upper Ardwyn',
];
const SUBJECTS = [
  'Harbour wall', 'Net lofts', 'Salt pans', 'Ferry slipway', 'Chapel roof', 'Beet harvest', 'Weir', 'Lime kiln',
  'Estuary mud', 'Kelp gatherers', 'Signal box', 'Tide mill', 'Shingle ridge', 'Reed beds', 'Quarry face', 'Boat shed',
  'Market cross', 'Orchard in frost', 'Viaduct', 'Allotments', 'Harbour lights', 'Sea holly', 'Fern fronds', 'Brick kilns',
  'Mooring posts', 'Washing lines', 'Fish market', 'Lighthouse keeper\'s garden', 'Bracken', 'Harbour at night',
];
const TIMES = ['at dusk', 'in winter', 'after rain', 'at low tide', 'early morning', 'in fog', 'in August', 'under snow'];
const SITTERS = ['a net mender', 'the ferryman', 'two sisters', 'a kiln worker', 'the harbour master', 'a girl with a bicycle', 'the choir'];
const DONORS = [
  'the Lanyon-Birch family', 'Rosalind Tiverton', 'the Achterberg-Lowe estate', 'Gideon and Mair Pascoe', 'the Wetherden Friends',
  'Harriet Obuya-Lind', 'the Carrow-Hesketh estate', 'Piers Anstruther-Vell', 'the photographer',
];
const FUNDS = ['Wetherden Friends\' Fund', 'Quayside Acquisitions Fund', 'Fennick Bequest'];
const DEVELOPERS = [
  'Metol–hydroquinone paper developer, 1+2', 'Metol–hydroquinone paper developer, 1+3', 'Phenidone–hydroquinone paper developer, 1+9',
  'Amidol developer', 'Warm-tone glycin developer',
];

// ── The plan of one print ───────────────────────────────────────────────────

interface PlannedPrint {
  input: PrintInput;
  steps: ProcessStepInput[];
  /** Where it goes after cataloguing (a movement), with the reason. */
  move?: { to: string; reason: string };
}

interface Ids {
  makers: Map<string, string>;
  papers: Map<string, string>;
  recipes: Map<string, string>;
  locations: Map<string, string>;
  enclosures: Map<string, string>;
}

const MONTHS = ['01', '02', '03', '04', '05', '06', '07', '08', '09', '10', '11', '12'];

/** An EDTF date made for a print of (about) year y, made no later than `latest`. */
function dateMade(r: Rng, y: number, latest: number): string | null {
  const kind = r.weighted([
    ['year', 30], ['approxMonth', 14], ['day', 10], ['decade', 9], ['uncertain', 10], ['interval', 10], ['month', 6], ['approx', 6], ['none', 5],
  ] as const);
  const mm = r.pick(MONTHS);
  switch (kind) {
    case 'year': return `${y}`;
    case 'approxMonth': return `${y}-${mm}~`;
    case 'day': return `${y}-${mm}-${String(r.int(1, 28)).padStart(2, '0')}`;
    // Only a decade that is over: 202X would reach into the future.
    case 'decade': return y < 2020 ? `${String(y).slice(0, 3)}X` : `${y}`;
    case 'uncertain': return `${y}?`;
    case 'interval': {
      const a = y - r.int(1, 3);
      return `${a}/${Math.min(latest, a + r.int(2, 6))}`;
    }
    case 'month': return `${y}-${mm}`;
    case 'approx': return `${y}~`;
    default: return null;
  }
}

const IMAGE_SIZES: [number, number][] = [[127, 178], [152, 203], [190, 240], [203, 254], [240, 305], [279, 356], [356, 432], [406, 508]];

function toningSteps(toning: Toning, r: Rng, ids: Ids, warm: boolean): ProcessStepInput[] {
  const recipe = (k: string) => ids.recipes.get(k)!;
  const temp = () => r.pick([18, 20, 20, 20, 21, 22]);
  // A split effect is partial toning with a note saying so (the extent vocabulary has no 'split').
  type Extent = 'full' | 'partial' | 'split';
  const extentOf = (e: Extent) => (e === 'split' ? 'partial' : e);
  const selenium = (extent: Extent, dilution: string, t: number): ProcessStepInput => ({
    type: 'toning', tonerClass: 'selenium', recipeId: recipe('selenium'), agent: 'Selenium toner with sulfite', dilution, timeSeconds: t, temperatureC: temp(), extent: extentOf(extent),
    ...(extent === 'split' ? { notes: warm ? 'Split effect. Pulled when the shadows went purple-brown and the highlights stayed warm.' : 'Split effect. Pulled at the first shift in the shadows.' } : {}),
  });
  const gold = (extent: Extent, t: number): ProcessStepInput => ({
    type: 'toning', tonerClass: 'gold', recipeId: recipe('gold'), agent: 'Gold thiocyanate toner', dilution: 'as mixed', timeSeconds: t, temperatureC: temp(), extent: extentOf(extent),
    ...(extent === 'split' ? { notes: 'Split effect.' } : {}),
  });
  const ironBlue = (extent: Extent, t: number): ProcessStepInput => ({
    type: 'toning', tonerClass: 'iron_blue', recipeId: recipe('iron_blue'), agent: 'Iron-blue single-bath toner', dilution: r.pick(['as mixed', '1+1', '1+2']),
    timeSeconds: t, temperatureC: 20, extent: extentOf(extent),
    ...(extent === 'partial' ? { notes: 'Pulled early: blue in the shadows, highlights left neutral.' } : extent === 'split' ? { notes: 'Split effect.' } : {}),
  });
  const sepia = (extent: 'full' | 'partial'): ProcessStepInput[] => [
    {
      type: 'toning', tonerClass: 'sulfide', recipeId: recipe('sepia_bleach'), agent: 'Ferricyanide–bromide bleach', dilution: '1+9',
      timeSeconds: extent === 'full' ? r.int(60, 180) : r.int(15, 50), temperatureC: temp(), extent,
      notes: extent === 'full' ? 'Bleached until the image was a faint yellow.' : 'Bleached back from the highlights only.',
    },
    { type: 'washing', agent: 'Running water', timeSeconds: r.int(120, 300), temperatureC: temp() },
    { type: 'toning', tonerClass: 'sulfide', recipeId: recipe('sepia_redev'), agent: 'Sodium sulfide redeveloper', dilution: 'as mixed', timeSeconds: r.int(40, 90), temperatureC: temp(), extent },
  ];
  const wash = (s: number): ProcessStepInput => ({ type: 'washing', agent: 'Running water', timeSeconds: s, temperatureC: temp() });
  switch (toning) {
    case 'none': return [];
    case 'selenium': return [selenium('full', r.pick(['1+9', '1+19', '1+19']), r.int(180, 600))];
    case 'selenium_light': return [selenium('partial', '1+39', r.int(120, 360))];
    case 'selenium_split': return [selenium('split', r.pick(['1+9', '1+14']), r.int(90, 300))];
    case 'gold': return [gold('full', r.int(300, 900))];
    case 'selenium_gold_split': return [selenium('split', '1+19', r.int(120, 240)), wash(r.int(300, 600)), gold('split', r.int(300, 720))];
    case 'sepia': return sepia('full');
    case 'sepia_partial': return sepia('partial');
    case 'polysulfide': return [{ type: 'toning', tonerClass: 'polysulfide', recipeId: recipe('polysulfide'), agent: 'Polysulfide brown toner', dilution: 'as mixed', timeSeconds: r.int(180, 900), temperatureC: r.pick([20, 24, 38]), extent: 'full' }];
    case 'copper': return [{ type: 'toning', tonerClass: 'copper', recipeId: recipe('copper'), agent: 'Copper citrate toner', dilution: 'as mixed', timeSeconds: r.int(120, 600), temperatureC: temp(), extent: r.pick(['full', 'full', 'partial'] as const) }];
    case 'iron_blue': return [ironBlue('full', r.int(60, 300))];
    case 'iron_blue_partial': return [ironBlue('partial', r.int(20, 60))];
    case 'iron_blue_borax': return [
      ironBlue('full', r.int(90, 300)),
      wash(r.int(60, 180)),
      { type: 'after_bath', agent: 'Dilute borax bath', recipeId: recipe('borax'), concentration: '0.5 %', timeSeconds: r.int(10, 45), temperatureC: 20, alkaline: true, notes: 'To shift the blue toward slate grey.' },
    ];
    case 'sepia_blue_split': return [...sepia('partial'), wash(r.int(300, 600)), ironBlue('split', r.int(30, 120))];
  }
}

function planSilverPrint(r: Rng, ids: Ids, toning: Toning, fibre: boolean, warm: boolean, printOut: boolean): ProcessStepInput[] {
  const temp = () => r.pick([18, 20, 20, 20, 21, 22]);
  const blue = toning.startsWith('iron_blue') || toning === 'sepia_blue_split';
  const steps: ProcessStepInput[] = [];
  if (printOut) {
    // Printing-out paper: washed free of silver salts, gold-toned, then fixed.
    steps.push({ type: 'washing', agent: 'Running water (free silver removed)', timeSeconds: r.int(180, 420), temperatureC: temp() });
    steps.push(...toningSteps(toning, r, ids, warm));
    steps.push({ type: 'fixing', agent: 'Plain sodium thiosulfate fixer, 10 %', concentration: '10 %', timeSeconds: r.int(300, 600), temperatureC: temp() });
  } else {
    steps.push({ type: 'development', agent: warm ? r.pick(['Warm-tone glycin developer', DEVELOPERS[1]]) : r.pick(DEVELOPERS), timeSeconds: r.int(90, 240), temperatureC: temp() });
    steps.push({ type: 'stop', agent: 'Acetic acid stop bath, 2 %', concentration: '2 %', timeSeconds: r.int(10, 30), temperatureC: temp() });
    if (r.chance(0.4)) {
      steps.push({ type: 'fixing', agent: 'Sodium thiosulfate fixer, first bath', timeSeconds: r.int(120, 300), temperatureC: temp() });
      steps.push({ type: 'fixing', agent: 'Sodium thiosulfate fixer, fresh second bath', timeSeconds: r.int(120, 300), temperatureC: temp() });
    } else {
      steps.push({ type: 'fixing', agent: 'Ammonium thiosulfate rapid fixer, 1+4', dilution: '1+4', timeSeconds: fibre ? r.int(60, 180) : r.int(45, 90), temperatureC: temp() });
    }
  }
  if (fibre) {
    steps.push({ type: 'washing', agent: 'Running water', timeSeconds: r.int(300, 600), temperatureC: temp() });
    if (r.chance(0.8)) steps.push({ type: 'hypo_clearing', agent: 'Sulfite clearing bath', recipeId: ids.recipes.get('hca')!, concentration: '2 %', timeSeconds: r.int(180, 600), temperatureC: temp() });
  } else {
    steps.push({ type: 'washing', agent: 'Running water', timeSeconds: r.int(90, 180), temperatureC: temp() });
  }
  if (!printOut) steps.push(...toningSteps(toning, r, ids, warm));
  if (blue && !toning.endsWith('borax') && r.chance(0.35)) {
    steps.push({ type: 'after_bath', agent: 'Acetic acid clearing rinse, 1 %', concentration: '1 %', timeSeconds: r.int(30, 90), temperatureC: 20, alkaline: false, notes: 'Clears yellow from the highlights.' });
  }
  // Iron blue is washed briefly (long washes lighten it); other prints get a long final wash.
  steps.push({
    type: 'final_wash', agent: r.pick(['Running water', 'Archival print washer', 'Tray, water changed every 5 minutes']),
    timeSeconds: blue ? r.int(300, 900) : fibre ? r.int(1800, 3600) : r.int(240, 600), temperatureC: temp(),
  });
  if (r.chance(fibre ? 0.3 : 0.1)) {
    const method = r.weighted([['iso18917_methylene_blue', 5], ['iso18917_silver_sulfide', 2], ['iso18917_iodine_amylose', 1], ['spot_test', 2]] as const);
    steps.push(
      method === 'spot_test'
        ? { type: 'residual_thiosulfate_test', method, agent: 'Silver nitrate spot test', notes: r.pick(['Faint stain, lighter than the reference patch.', 'No visible stain.', 'Slight yellowing; rewashed and retested clear.']) }
        : { type: 'residual_thiosulfate_test', method, value: Math.round(r.next() * 280 + 20) / 1000, unit: 'g/m²' },
    );
  }
  return steps;
}

function planCyanotype(r: Rng): { steps: ProcessStepInput[]; toned: boolean } {
  const steps: ProcessStepInput[] = [
    { type: 'washing', agent: 'Running water, slightly acidified with citric acid', timeSeconds: r.int(300, 900), temperatureC: 18 },
    { type: 'after_bath', agent: 'Hydrogen peroxide, 3 %, a few drops per litre', timeSeconds: r.int(10, 40), temperatureC: 18, alkaline: false, notes: 'To bring up the blue at once.' },
  ];
  const toned = r.chance(0.3);
  if (toned) {
    steps.push({ type: 'after_bath', agent: 'Dilute washing soda (sodium carbonate) bleach', concentration: '1 %', timeSeconds: r.int(20, 90), temperatureC: 20, alkaline: true, notes: 'Partly bleached before tannin toning.' });
    steps.push({ type: 'toning', tonerClass: 'other', agent: 'Tannic acid (black tea) bath', timeSeconds: r.int(600, 3600), temperatureC: 30, extent: r.pick(['full', 'partial'] as const) });
  }
  steps.push({ type: 'final_wash', agent: 'Running water', timeSeconds: r.int(300, 600), temperatureC: 18 });
  return { steps, toned };
}

function inscriptionFor(r: Rng, maker: MakerSpec, year: number, toning: Toning): string | null {
  const initials = maker.name.split(/[\s-]+/).map((w) => w[0]).join('.');
  const bits: string[] = [];
  if (r.chance(0.6)) bits.push(`Signed in pencil on verso: "${initials}."`);
  if (r.chance(0.4)) bits.push(`Dated in pencil on verso: "${year}"`);
  if (r.chance(0.2)) bits.push('Printer\'s blind stamp, lower right of the mount');
  if (r.chance(0.2)) bits.push(`Negative number in ink on verso: "N${r.int(10, 999)}"`);
  if (toning.startsWith('iron_blue') && r.chance(0.5)) bits.push(`Toning noted in pencil on verso: "Fe blue ${r.int(1, 4)} min"`);
  if (toning === 'selenium_split' && r.chance(0.5)) bits.push('Noted on verso: "Se split, warm"');
  return bits.length ? `${bits.join('. ')}.` : null;
}

interface Lot {
  year: number;
  number: number;
  maker: MakerSpec;
  size: number;
  provenance: string;
  credit: string;
  how: 'gift' | 'purchase' | 'bequest';
  donor: string;
}

const RS = (code: string) => `http://rightsstatements.org/vocab/${code}/1.0/`;

/**
 * The rights statement of a lot's prints (invented, and drawn without the random sequence, so the rest
 * of the demo is unchanged): a living photographer's own gift under CC BY-NC 4.0, other work of living
 * photographers and of estates in copyright (InC), a maker whose heirs were never traced InC-RUU, early
 * purchases whose rights were never settled UND; the latest lots are not assessed yet (none).
 */
function rightsFor(lot: Lot): string | null {
  const living = lot.maker.lifeDates.endsWith('/..');
  if (lot.year >= 2022) return null;
  if (living && lot.how === 'gift' && lot.donor === 'the photographer') return 'http://creativecommons.org/licenses/by-nc/4.0/';
  if (lot.maker.lifeDates.includes('?')) return RS('InC-RUU');
  if (!living && lot.how === 'purchase' && lot.year < 1990) return RS('UND');
  return RS('InC');
}

function planLots(r: Rng, target: number): Lot[] {
  const lots: Lot[] = [];
  const perYear = new Map<number, number>();
  let total = 0;
  while (total < target) {
    const maker = r.pick(MAKERS);
    const year = Math.min(2024, r.int(Math.max(1976, maker.active[0] + 3), Math.max(1977, Math.min(2024, maker.active[1] + 12))));
    const number = (perYear.get(year) ?? 0) + 1;
    perYear.set(year, number);
    const size = Math.min(target - total, r.weighted([[r.int(1, 3), 3], [r.int(4, 10), 4], [r.int(11, 24), 2]] as const));
    const donor = maker.lifeDates.endsWith('/..') ? r.pick(DONORS.filter((d) => !d.endsWith('estate'))) : r.pick(DONORS);
    const how = r.weighted([['gift', 5], ['purchase', 3], ['bequest', 1]] as const);
    const provenance =
      how === 'gift' ? `The photographer's studio; ${donor === 'the photographer' ? 'given by the photographer' : `${donor}, by whom given`} to the Trust, ${year}.`
        : how === 'purchase' ? `The photographer; purchased from ${maker.name} by the Trust, ${year}.`
          : `The photographer; ${donor}; bequeathed to the Trust, ${year}.`;
    const credit =
      how === 'gift' ? `${DEMO_INSTITUTION}. Gift of ${donor}, ${year}`
        : how === 'purchase' ? `${DEMO_INSTITUTION}. Purchased with the support of the ${r.pick(FUNDS)}, ${year}`
          : `${DEMO_INSTITUTION}. Bequest of ${donor}, ${year}`;
    lots.push({ year, number, maker, size, provenance, credit, how, donor });
    total += size;
  }
  return lots;
}

function titleFor(r: Rng): string {
  const form = r.weighted([['subjectPlace', 5], ['subjectTime', 3], ['untitled', 2], ['series', 1], ['portrait', 2]] as const);
  switch (form) {
    case 'subjectPlace': return `${r.pick(SUBJECTS)}, ${r.pick(PLACES)}`;
    case 'subjectTime': return `${r.pick(SUBJECTS)} ${r.pick(TIMES)}`;
    case 'untitled': return `Untitled (${r.pick(SUBJECTS).toLowerCase()})`;
    case 'series': return `${r.pick(PLACES)} series, no. ${r.int(1, 40)}`;
    default: return `Portrait of ${r.pick(SITTERS)}, ${r.pick(PLACES)}`;
  }
}

function planPrints(r: Rng, ids: Ids, target: number): PlannedPrint[] {
  const out: PlannedPrint[] = [];
  const enc = (k: string) => ids.enclosures.get(k)!;
  for (const lot of planLots(r, target)) {
    const m = lot.maker;
    for (let item = 1; item <= lot.size; item++) {
      const latest = Math.min(lot.year, m.active[1]);
      const year = r.int(m.active[0], Math.max(m.active[0], latest));
      const cyanotype = year >= 1985 && r.chance(m.cyanotype ?? 0);
      const printOut = !cyanotype && r.chance(m.printingOut ?? 0);
      // Printing-out paper is gold-toned; everything else follows the printer's practice.
      let toning: Toning = printOut ? 'gold' : r.weighted(m.practice);
      let steps: ProcessStepInput[];
      let paperKey: string;
      let support: PrintInput['support'];
      let process: PrintInput['process'];
      if (cyanotype) {
        process = 'cyanotype';
        paperKey = 'cotton-rag';
        support = 'other';
        toning = 'none';
        steps = planCyanotype(r).steps;
      } else {
        process = printOut ? 'gelatin_silver_printing_out' : 'gelatin_silver_developing_out';
        const rc = !printOut && year >= 1976 && r.chance(m.rc);
        const fits = PAPERS.filter((p) => p.base === (rc ? 'rc' : 'fibre') && p.made[0] <= year && year <= p.made[1] + 2);
        const warmFits = fits.filter((p) => p.warm);
        const wantsWarm = toning.includes('sepia') || toning.includes('selenium_split') || toning === 'polysulfide';
        const paper = wantsWarm && warmFits.length ? r.pick(warmFits) : fits.length ? r.pick(fits) : r.pick(PAPERS.filter((p) => p.base === 'fibre'));
        paperKey = paper.key;
        support = paper.base === 'rc' ? 'resin_coated' : 'fibre_baryta';
        steps = planSilverPrint(r, ids, toning, paper.base === 'fibre', Boolean(paper.warm), printOut);
      }
      const blue = cyanotype || toning.startsWith('iron_blue') || toning === 'sepia_blue_split';
      // Most blue prints are housed correctly; a share are not, so the warnings have something to show.
      const enclosure = blue
        ? r.weighted([['cotton', 5], ['polyester', 3], ['buffered', 2], ['mat', 1], ['glassine', 1]] as const)
        : r.weighted([['buffered', 6], ['cotton', 3], ['polyester', 2], ['mat', 2], ['glassine', 1], ['kraft', 1]] as const);
      const drawn = r.weighted([['in_store', 84], ['on_display', 5], ['on_loan', 4], ['in_treatment', 4], ['deaccessioned', 2]] as const);
      // On display and on loan come from the demo's exhibitions and loans (demo-loans.ts), never set by hand here;
      // the draw stays so the rest of the demo is drawn as before.
      const status = drawn === 'on_display' || drawn === 'on_loan' ? 'in_store' : drawn;
      let [w, h] = r.pick(IMAGE_SIZES.filter(([a]) => (support === 'resin_coated' ? a <= 279 : true)));
      if (r.chance(0.45)) [w, h] = [h, w];
      const margin = r.pick([0, 6, 12, 20, 25, 38]);
      const mounted = !cyanotype && r.chance(0.3);
      // The light category now comes from process and toner (light settings); these draws stay so the rest of
      // the demo is drawn as before.
      if (cyanotype) r.pick(['medium', 'high'] as const);
      else if (blue) r.pick(['medium', 'high', 'high'] as const);
      else if (!(toning === 'copper' || printOut)) r.chance(0.1);
      const date = dateMade(r, year, lot.year);
      const staffNotes = r.chance(0.15)
        ? r.pick([
          `Matched to the negative register, volume ${r.int(1, 9)}.`,
          'Check the tone at the next inspection: edges look lighter than in the 2015 photograph.',
          'The donor asked that the print not be lent abroad.',
          'Housed with the printer\'s work notes (kept in the study room file).',
          'Duplicate print of the same negative in the Trust\'s study collection.',
        ])
        : null;
      const input = printInputSchema.parse({
        accessionNumber: `${lot.year}.${lot.number}.${item}`,
        title: titleFor(r),
        makerId: ids.makers.get(m.name),
        dateMade: date,
        imageWidthMm: w, imageHeightMm: h,
        sheetWidthMm: w + margin * 2, sheetHeightMm: h + margin * 2 + (margin ? r.int(0, 12) : 0),
        ...(mounted ? { mountWidthMm: w + margin * 2 + r.int(60, 120), mountHeightMm: h + margin * 2 + r.int(80, 160) } : {}),
        process, support, paperId: ids.papers.get(paperKey),
        inscriptions: inscriptionFor(r, m, year, toning),
        provenance: lot.provenance,
        creditLine: lot.credit,
        rights: rightsFor(lot),
        status,
        enclosureId: enc(enclosure),
        staffNotes,
        ...(r.chance(0.3) ? { valuationAmount: r.int(3, 240) * 50, valuationCurrency: 'GBP' } : {}),
        locationId: status === 'deaccessioned' ? null : ids.locations.get(r.pick(STORE_PLACES)),
      });
      const move =
        drawn === 'on_display' || drawn === 'on_loan' ? undefined
          : status === 'in_treatment' ? { to: 'holding', reason: 'To the conservation studio for treatment' }
            : status === 'in_store' && r.chance(0.08) ? { to: r.pick(STORE_PLACES), reason: 'Rehoused during the store survey' }
              : undefined;
      out.push({ input, steps: steps.map((s) => processStepInputSchema.parse(s)), move });
    }
  }
  return out;
}

/**
 * Nearly half of the plainly iron-blue-toned prints get a borax after-bath too (the printers who
 * liked a slate-grey blue), so the research screens have a group with and a group without an
 * alkaline after-bath large enough to compare. A generator of its own, keyed by accession number,
 * decides: the draws of the plan above stay as they were, so the rest of the demo is unchanged.
 */
function withBoraxAfterBaths(planned: PlannedPrint[], ids: Ids): PlannedPrint[] {
  for (const p of planned) {
    const toning = p.steps.findIndex((s) => s.type === 'toning' && s.tonerClass === 'iron_blue');
    if (toning < 0 || p.steps.some((s) => s.type === 'after_bath') || p.steps.filter((s) => s.type === 'toning').length > 1) continue;
    const r = prng(hashOf(`borax:${p.input.accessionNumber}`));
    if (!r.chance(0.45)) continue;
    p.steps.splice(
      toning + 1, 0,
      processStepInputSchema.parse({ type: 'washing', agent: 'Running water', timeSeconds: r.int(60, 180), temperatureC: 20 }),
      processStepInputSchema.parse({
        type: 'after_bath', agent: 'Dilute borax bath', recipeId: ids.recipes.get('borax')!, concentration: '0.5 %', timeSeconds: r.int(10, 45), temperatureC: 20, alkaline: true,
        notes: r.pick(['To shift the blue toward slate grey.', 'A quick dip to cool the blue.', 'Borax until the blue went grey-violet.']),
      }),
    );
  }
  return planned;
}

/** A 32-bit FNV-1a hash of a text, to seed a generator. */
function hashOf(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) h = Math.imul(h ^ text.charCodeAt(i), 0x01000193);
  return h >>> 0;
}

// ── Writing it through the services ────────────────────────────────────────

/**
 * The id of a record an earlier, interrupted seed wrote already, or of the one made now: a seed
 * run again after a stop carries on where it stopped instead of writing anything twice.
 */
async function existingOr(find: () => Promise<{ id: string } | null>, create: () => Promise<{ id: string }>, signal?: AbortSignal): Promise<string> {
  signal?.throwIfAborted();
  return (await find())?.id ?? (await create()).id;
}

/** Marks a demo print deaccessioned (the day, if any, comes with its deaccession record in demo-procedures.ts). */
async function markDeaccessioned(id: string, actor: SeedActor & { role: 'registrar' }, requestId: string): Promise<void> {
  await db().transaction(async (t) => {
    const [row] = await db().query<{ status: string }>('SELECT status FROM prints WHERE id = $1 FOR UPDATE', { bind: [id], type: QueryTypes.SELECT, transaction: t });
    if (row.status === 'deaccessioned') return;
    await db().query("UPDATE prints SET status = 'deaccessioned', version = version + 1 WHERE id = $1", { bind: [id], transaction: t });
    await recordAudit({ actor, action: 'print.updated', entityType: 'print', entityId: id, before: { status: row.status }, after: { status: 'deaccessioned' }, requestId }, t);
  });
}

/** Builds the invented collection through the real services. Returns how many prints it wrote. */
export async function seedDemoCatalogue(actor: SeedActor, log: (m: string) => void, options: DemoCatalogueOptions = {}): Promise<{ prints: number }> {
  const started = Date.now();
  const r = prng(options.seed ?? 1968);
  const who = { ...actor, role: 'registrar' as const };
  const requestId = 'seed';

  options.signal?.throwIfAborted();
  const settingsRows = await db().query<{ n: number }>("SELECT count(*)::int AS n FROM settings WHERE key = 'catalogue'", { type: QueryTypes.SELECT });
  if (settingsRows[0].n === 0) {
    await putCatalogueSettings({ accessionPattern: DEFAULT_ACCESSION_PATTERN, institutionName: DEMO_INSTITUTION }, actor, requestId);
  }

  const ids: Ids = { makers: new Map(), papers: new Map(), recipes: new Map(), locations: new Map(), enclosures: new Map() };
  const signal = options.signal;
  for (const m of MAKERS) {
    ids.makers.set(m.name, await existingOr(
      () => Maker.findOne({ where: { name: m.name }, attributes: ['id'] }),
      () => createReference(makers, makerInputSchema.parse({ name: m.name, lifeDates: m.lifeDates, notes: m.notes }), actor, requestId),
      signal,
    ));
  }
  for (const p of PAPERS) {
    const { key: _k, made: _m, warm: _w, ...fields } = p;
    ids.papers.set(p.key, await existingOr(
      () => Paper.findOne({ where: { manufacturer: fields.manufacturer, product: fields.product, surface: fields.surface }, attributes: ['id'] }),
      () => createReference(papers, paperInputSchema.parse(fields), actor, requestId),
      signal,
    ));
  }
  for (const rec of RECIPES) {
    const { key: _k, ...fields } = rec;
    ids.recipes.set(rec.key, await existingOr(
      () => BathRecipe.findOne({ where: { name: fields.name }, attributes: ['id'] }),
      () => createReference(recipes, recipeInputSchema.parse(fields), actor, requestId),
      signal,
    ));
  }
  for (const l of LOCATIONS) {
    const parentId = l.parent ? ids.locations.get(l.parent)! : null;
    ids.locations.set(l.key, await existingOr(
      () => Location.findOne({ where: { name: l.name, parentId }, attributes: ['id'] }),
      () => createReference(locations, locationInputSchema.parse({ name: l.name, kind: l.kind, parentId, code: l.code, notes: l.notes }), actor, requestId),
      signal,
    ));
  }
  for (const e of ENCLOSURES) {
    const { key: _k, ...fields } = e;
    ids.enclosures.set(e.key, await existingOr(
      () => EnclosureType.findOne({ where: { name: fields.name }, attributes: ['id'] }),
      () => createReference(enclosures, enclosureInputSchema.parse(fields), actor, requestId),
      signal,
    ));
  }
  log(`Demo catalogue: ${MAKERS.length} makers, ${PAPERS.length} papers, ${RECIPES.length} recipes, ${LOCATIONS.length} places, ${ENCLOSURES.length} enclosure types.`);

  const planned = withBoraxAfterBaths(planPrints(r, ids, options.prints ?? 300), ids);
  let done = 0;
  await inPool(planned, options.concurrency ?? 4, async (p) => {
    // A print an interrupted seed wrote is completed (its steps, its move), not written again.
    const earlier = await Print.findOne({ where: { accessionNumber: p.input.accessionNumber }, attributes: ['id', 'version', 'locationId'] });
    signal?.throwIfAborted();
    // A deaccessioned print is catalogued first and marked deaccessioned once its history is written
    // (the record of a deaccessioned print is read-only).
    const gone = p.input.status === 'deaccessioned';
    const placedAt = placedAtFor(p.input.accessionNumber, prng(hashOf(`placed:${p.input.accessionNumber}`)).int);
    const created = earlier
      ? { id: earlier.id, version: earlier.version, locationId: earlier.locationId, hasSteps: (await ProcessStep.count({ where: { printId: earlier.id } })) > 0 }
      : await createPrint(gone ? { ...p.input, status: 'in_store' } : p.input, who, requestId, { placedAt }).then((c) => ({ id: c.id, version: c.version, locationId: c.location?.id ?? null, hasSteps: false }));
    let version = created.version;
    if (p.steps.length && !created.hasSteps) {
      signal?.throwIfAborted();
      version = (await replaceSteps(created.id, { version, steps: p.steps }, who, requestId)).version;
    }
    if (gone) await markDeaccessioned(created.id, who, requestId);
    if (p.move && ids.locations.get(p.move.to) !== created.locationId) {
      signal?.throwIfAborted();
      await movePrint(created.id, { toLocationId: ids.locations.get(p.move.to)!, reason: p.move.reason, version }, who, requestId);
    }
    done += 1;
    if (done % 100 === 0) log(`Demo catalogue: ${done} of ${planned.length} prints…`);
  }, signal);
  log(`Demo catalogue: ${planned.length} prints in ${((Date.now() - started) / 1000).toFixed(1)} s.`);
  return { prints: planned.length };
}
