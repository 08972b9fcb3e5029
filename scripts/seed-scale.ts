/**
 * npm run seed:scale -- --prints 200000 [--seed 1]
 *
 * Fills a separate database, toneledger_scale, on the development PostgreSQL cluster with an
 * invented catalogue of N prints and their process histories, measurement histories (three spots,
 * about ten sessions each) and signed condition reports, for measuring the list API and the research
 * queries at scale. It never touches the demo database (toneledger). Reference records are written from JS
 * in one statement per table; prints and steps are generated in PostgreSQL with set-based
 * INSERT … SELECT over generate_series, with pseudo-random choices from a hash of the row number
 * (the same seed gives the same catalogue).
 *
 * Every derived column is consistent with what the app computes: dates come from a pool parsed
 * by the app's EDTF parser, toner classes and warnings from step templates run through the app's
 * own rules, and a sample of rows is re-checked against those functions at the end.
 */
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { Sequelize } from 'sequelize';
import { startPostgres, type LocalPostgres } from './postgres';
import { migrateUp } from '../backend/src/migrate';
import { accessionSortKey, deriveDate, tonerClassesOf, warningsOf, type StepFacts } from '../backend/src/services/print-derive';
import { prng } from '../backend/src/seed/demo-catalogue';
import { categorySql } from '../backend/src/services/light-category-sql';
import { seedScaleHistories, summariseScaleRates } from './seed-scale-histories';
import { DEFAULT_LIGHT_SETTINGS, categoryByRules } from '@toneledger/common/domain/light-rules';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const DATABASE = 'toneledger_scale';
const log = (m: string) => console.log(`[seed:scale] ${m}`);

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  const raw = i >= 0 ? process.argv[i + 1] : process.argv.find((a) => a.startsWith(`--${name}=`))?.split('=')[1];
  if (raw === undefined) return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1) throw new Error(`--${name} must be a whole number of at least 1 (got ${raw})`);
  return n;
}

const PRINTS = arg('prints', 200_000);
const SEED = arg('seed', 1);
const BATCH = 50_000;

// ── Invented vocabularies ───────────────────────────────────────────────────

const FIRST = [
  'Agnes', 'Bram', 'Cressida', 'Dorian', 'Elspeth', 'Fitz', 'Gudrun', 'Hollis', 'Isolde', 'Jory', 'Kestrel', 'Linnea', 'Magnus', 'Nerys',
  'Orrin', 'Perpetua', 'Quill', 'Rosamund', 'Silas', 'Tamsin', 'Ulric', 'Verity', 'Wystan', 'Xanthe', 'Yannick', 'Zillah', 'Ansel', 'Briony',
  'Caspian', 'Delphine', 'Emrys', 'Fenella', 'Gawain', 'Hesper', 'Ivo', 'Jessamy', 'Kit', 'Lorcan', 'Marigold', 'Niamh', 'Oswin', 'Peregrine',
  'Rhosyn', 'Sable', 'Tobin', 'Una', 'Vance', 'Winifred', 'Yestin', 'Zephyrine',
];
const LAST = [
  'Abernethy-Cole', 'Bramhall', 'Carrowby', 'Dunmarrow', 'Ellerdine', 'Fothersby', 'Gillock', 'Harrowgate', 'Inchbald', 'Jarrowfield',
  'Kettleby', 'Lanyon', 'Marrick', 'Nethercott', 'Oakridge', 'Pendarves', 'Quarrington', 'Rathmoor', 'Skelwith', 'Tregarthen', 'Ulverholm',
  'Vellacott', 'Wetherden', 'Yarrowby', 'Zennor-Hale', 'Ashcombe', 'Blackwater', 'Culloden-Reyes', 'Danbury-Oke', 'Edgecott', 'Fennimore',
  'Gorringe', 'Hallowes', 'Ivybridge-Shaw', 'Jellicoe-Marr', 'Kilbride', 'Ludgrove', 'Merriot', 'Nancarrow', 'Ormesby', 'Penwithick',
  'Rosewarne', 'Stannard', 'Trewin', 'Underhay', 'Vosper', 'Wheal', 'Yelland', 'Zoller-Price', 'Treloar-Binns',
];
const MILLS = [
  'Harrowgate Photographic Co.', 'Vellmar Emulsionswerk', 'Corrimont Papeteries', 'Aldersey Sensitising Co.', 'Northgate & Fell',
  'Saltmarsh & Penrose', 'Quenby Paper Mills', 'Ashmoor Fine Papers', 'Brightwell Dry Plate Co.', 'Kessock Photochemical',
  'Lindqvarn Fotopapier', 'Morrowfield Mills', 'Orland Emulsions', 'Pellowe & Daughters', 'Ravensworth Sensitised Papers',
  'Stennack Photographic', 'Tolgarrick Paper Co.', 'Umbrell Industries', 'Wendron Photographic', 'Yarcombe Emulsions',
];
const PRODUCTS_FIBRE = ['Bromide', 'Chlorobromide Warmtone', 'Neutral FB', 'Cold Tone FB', 'Studio Portrait', 'Exhibition FB', 'Velvet Bromide'];
const PRODUCTS_RC = ['Graded RC', 'Variable Contrast RC', 'Press RC'];
const SURFACES = ['glossy', 'lustre', 'semi-matt', 'matt', 'pearl', 'velvet stipple', 'satin', 'silk'];
const TINTS = ['white', 'warm white', 'cream', 'ivory', 'bright white', 'natural'];
const PLACES = [
  'Calder Reach', 'Tollevar Quay', 'Skelloch Head', 'Morrow Strand', 'Fennick Cross', 'Wrayburn Mill', 'Ennerdown', 'Vossick Marsh', 'Hallamere',
  'Quillan Sound', 'Brackenholme', 'Saltings Lane', 'Pellow Point', 'Upper Ardwyn', 'Carnbrea Moss', 'Lowenna Sands', 'Drummock', 'Selworth Fen',
];
const SUBJECTS = [
  'Harbour wall', 'Net lofts', 'Salt pans', 'Ferry slipway', 'Chapel roof', 'Beet harvest', 'Weir', 'Lime kiln', 'Estuary mud', 'Kelp gatherers',
  'Signal box', 'Tide mill', 'Shingle ridge', 'Reed beds', 'Quarry face', 'Boat shed', 'Market cross', 'Orchard in frost', 'Viaduct', 'Allotments',
  'Harbour lights', 'Sea holly', 'Fern fronds', 'Brick kilns', 'Mooring posts', 'Washing lines', 'Fish market', 'Bracken', 'Harbour at night',
  'Winter wheat', 'Pier head', 'Slate tips', 'Pilchard cellars', 'Chapel choir', 'Sand dunes', 'Lifeboat house', 'Cattle market', 'Old quay', 'Mill race', 'Gorse',
];
const TIMES = ['at dusk', 'in winter', 'after rain', 'at low tide', 'early morning', 'in fog', 'in August', 'under snow'];
const SITTERS = ['a net mender', 'the ferryman', 'two sisters', 'a kiln worker', 'the harbour master', 'a girl with a bicycle', 'the choir', 'a lock keeper'];
const DONORS = [
  'the Lanyon-Birch family', 'Rosalind Tiverton', 'Gideon and Mair Pascoe', 'the Wetherden Friends', 'Harriet Obuya-Lind', 'Piers Anstruther-Vell',
  'the Carrow-Hesketh estate', 'Delia Fauconberg', 'the Nancarrow family', 'Ellis and Ruth Penhaligon',
];

// ── Step templates: the process histories, run through the app's rules in JS ─

interface TStep {
  type: string;
  agent?: string;
  tonerClass?: string;
  recipeKey?: string;
  dilution?: string;
  timeSeconds?: number;
  temperatureC?: number;
  extent?: string;
  concentration?: string;
  alkaline?: boolean;
  method?: string;
  hasValue?: boolean;
  unit?: string;
  notes?: string;
}

interface Profile {
  process: string;
  support: string;
  paperBase: 'fibre' | 'rc' | 'other';
  steps: TStep[];
  weight: number;
  blue: boolean;
}

const TONINGS: Record<string, { weight: number; steps: TStep[] }> = {
  none: { weight: 22, steps: [] },
  selenium: { weight: 20, steps: [{ type: 'toning', tonerClass: 'selenium', recipeKey: 'selenium', agent: 'Selenium toner with sulfite', dilution: '1+19', timeSeconds: 360, temperatureC: 20, extent: 'full' }] },
  selenium_light: { weight: 6, steps: [{ type: 'toning', tonerClass: 'selenium', recipeKey: 'selenium', agent: 'Selenium toner with sulfite', dilution: '1+39', timeSeconds: 240, temperatureC: 20, extent: 'partial' }] },
  gold: { weight: 6, steps: [{ type: 'toning', tonerClass: 'gold', recipeKey: 'gold', agent: 'Gold thiocyanate toner', dilution: 'as mixed', timeSeconds: 600, temperatureC: 20, extent: 'full' }] },
  sepia: {
    weight: 8,
    steps: [
      { type: 'toning', tonerClass: 'sulfide', recipeKey: 'sepia_bleach', agent: 'Ferricyanide–bromide bleach', dilution: '1+9', timeSeconds: 120, temperatureC: 20, extent: 'full' },
      { type: 'washing', agent: 'Running water', timeSeconds: 200, temperatureC: 20 },
      { type: 'toning', tonerClass: 'sulfide', recipeKey: 'sepia_redev', agent: 'Sodium sulfide redeveloper', dilution: 'as mixed', timeSeconds: 60, temperatureC: 20, extent: 'full' },
    ],
  },
  polysulfide: { weight: 4, steps: [{ type: 'toning', tonerClass: 'polysulfide', recipeKey: 'polysulfide', agent: 'Polysulfide brown toner', dilution: 'as mixed', timeSeconds: 480, temperatureC: 38, extent: 'full' }] },
  copper: { weight: 4, steps: [{ type: 'toning', tonerClass: 'copper', recipeKey: 'copper', agent: 'Copper citrate toner', dilution: 'as mixed', timeSeconds: 300, temperatureC: 20, extent: 'full' }] },
  vanadium: { weight: 2, steps: [{ type: 'toning', tonerClass: 'vanadium', recipeKey: 'vanadium', agent: 'Vanadium green toner', dilution: 'as mixed', timeSeconds: 240, temperatureC: 20, extent: 'full' }] },
  iron_blue: { weight: 10, steps: [{ type: 'toning', tonerClass: 'iron_blue', recipeKey: 'iron_blue', agent: 'Iron-blue single-bath toner', dilution: 'as mixed', timeSeconds: 180, temperatureC: 20, extent: 'full' }] },
  iron_blue_partial: { weight: 4, steps: [{ type: 'toning', tonerClass: 'iron_blue', recipeKey: 'iron_blue', agent: 'Iron-blue single-bath toner', dilution: '1+1', timeSeconds: 40, temperatureC: 20, extent: 'partial' }] },
  iron_blue_borax: {
    weight: 4,
    steps: [
      { type: 'toning', tonerClass: 'iron_blue', recipeKey: 'iron_blue', agent: 'Iron-blue single-bath toner', dilution: 'as mixed', timeSeconds: 200, temperatureC: 20, extent: 'full' },
      { type: 'after_bath', agent: 'Dilute borax bath', recipeKey: 'borax', concentration: '0.5 %', timeSeconds: 30, temperatureC: 20, alkaline: true },
    ],
  },
  selenium_gold_split: {
    weight: 4,
    steps: [
      { type: 'toning', tonerClass: 'selenium', recipeKey: 'selenium', agent: 'Selenium toner with sulfite', dilution: '1+19', timeSeconds: 180, temperatureC: 20, extent: 'partial', notes: 'Split effect.' },
      { type: 'washing', agent: 'Running water', timeSeconds: 450, temperatureC: 20 },
      { type: 'toning', tonerClass: 'gold', recipeKey: 'gold', agent: 'Gold thiocyanate toner', dilution: 'as mixed', timeSeconds: 480, temperatureC: 20, extent: 'partial', notes: 'Split effect.' },
    ],
  },
  sepia_blue_split: {
    weight: 2,
    steps: [
      { type: 'toning', tonerClass: 'sulfide', recipeKey: 'sepia_bleach', agent: 'Ferricyanide–bromide bleach', dilution: '1+9', timeSeconds: 30, temperatureC: 20, extent: 'partial' },
      { type: 'toning', tonerClass: 'sulfide', recipeKey: 'sepia_redev', agent: 'Sodium sulfide redeveloper', dilution: 'as mixed', timeSeconds: 60, temperatureC: 20, extent: 'partial' },
      { type: 'toning', tonerClass: 'iron_blue', recipeKey: 'iron_blue', agent: 'Iron-blue single-bath toner', dilution: '1+1', timeSeconds: 60, temperatureC: 20, extent: 'partial', notes: 'Split effect.' },
    ],
  },
};

function buildProfiles(): Profile[] {
  const out: Profile[] = [];
  const dev: TStep = { type: 'development', agent: 'Metol–hydroquinone paper developer, 1+2', timeSeconds: 120, temperatureC: 20 };
  const stop: TStep = { type: 'stop', agent: 'Acetic acid stop bath, 2 %', concentration: '2 %', timeSeconds: 20, temperatureC: 20 };
  const fix: TStep = { type: 'fixing', agent: 'Ammonium thiosulfate rapid fixer, 1+4', dilution: '1+4', timeSeconds: 90, temperatureC: 20 };
  const wash: TStep = { type: 'washing', agent: 'Running water', timeSeconds: 400, temperatureC: 20 };
  const hca: TStep = { type: 'hypo_clearing', agent: 'Sulfite clearing bath', recipeKey: 'hca', concentration: '2 %', timeSeconds: 300, temperatureC: 20 };
  const test: TStep = { type: 'residual_thiosulfate_test', method: 'iso18917_methylene_blue', hasValue: true, unit: 'g/m²' };
  for (const [name, toning] of Object.entries(TONINGS)) {
    const blue = name.includes('iron_blue') || name === 'sepia_blue_split';
    const finalWash: TStep = { type: 'final_wash', agent: 'Running water', timeSeconds: blue ? 600 : 2400, temperatureC: 20 };
    for (const [support, paperBase, sw] of [['fibre_baryta', 'fibre', 0.75], ['resin_coated', 'rc', 0.25]] as const) {
      for (const [detail, dw] of [['brief', 0.15], ['standard', 0.6], ['full', 0.25]] as const) {
        let steps: TStep[];
        if (detail === 'brief') steps = [dev, fix, ...toning.steps, finalWash];
        else steps = [dev, stop, fix, wash, ...(paperBase === 'fibre' ? [hca] : []), ...toning.steps, finalWash, ...(detail === 'full' ? [test] : [])];
        // At most 9 steps: drop the optional ones first.
        for (const optional of [test, hca, stop, wash]) if (steps.length > 9) steps = steps.filter((s) => s !== optional);
        out.push({ process: 'gelatin_silver_developing_out', support, paperBase, steps, weight: toning.weight * sw * dw * 0.95, blue });
      }
    }
  }
  const peroxide: TStep = { type: 'after_bath', agent: 'Hydrogen peroxide, 3 %, a few drops per litre', timeSeconds: 20, temperatureC: 18, alkaline: false };
  out.push({ process: 'cyanotype', support: 'other', paperBase: 'other', blue: true, weight: 100 * 0.025, steps: [
    { type: 'washing', agent: 'Running water, slightly acidified', timeSeconds: 600, temperatureC: 18 }, peroxide,
    { type: 'final_wash', agent: 'Running water', timeSeconds: 450, temperatureC: 18 },
  ] });
  out.push({ process: 'cyanotype', support: 'other', paperBase: 'other', blue: true, weight: 100 * 0.01, steps: [
    { type: 'washing', agent: 'Running water, slightly acidified', timeSeconds: 600, temperatureC: 18 }, peroxide,
    { type: 'after_bath', agent: 'Dilute washing soda (sodium carbonate) bleach', concentration: '1 %', timeSeconds: 45, temperatureC: 20, alkaline: true },
    { type: 'toning', tonerClass: 'other', agent: 'Tannic acid (black tea) bath', timeSeconds: 1800, temperatureC: 30, extent: 'full' },
    { type: 'final_wash', agent: 'Running water', timeSeconds: 450, temperatureC: 18 },
  ] });
  out.push({ process: 'gelatin_silver_printing_out', support: 'fibre_baryta', paperBase: 'fibre', blue: false, weight: 100 * 0.015, steps: [
    { type: 'washing', agent: 'Running water (free silver removed)', timeSeconds: 300, temperatureC: 20 },
    ...TONINGS.gold.steps,
    { type: 'fixing', agent: 'Plain sodium thiosulfate fixer, 10 %', concentration: '10 %', timeSeconds: 480, temperatureC: 20 },
    wash, hca, { type: 'final_wash', agent: 'Running water', timeSeconds: 2400, temperatureC: 20 },
  ] });
  return out;
}

interface EnclosureRow { name: string; material: string; buffered: boolean | null; pat: 'passed' | 'failed' | 'not_tested'; weight: number }
const ENCLOSURES: EnclosureRow[] = [
  ['Unbuffered cotton four-flap folder', 'cotton board, unbuffered', false, 'passed', 14],
  ['Buffered four-flap folder', 'lignin-free board, carbonate reserve', true, 'passed', 18],
  ['Polyester sleeve', 'uncoated polyester film', false, 'passed', 10],
  ['Buffered window mat in solander box', 'buffered museum board', true, 'passed', 9],
  ['Unbuffered window mat in solander box', 'cotton museum board, unbuffered', false, 'passed', 6],
  ['Buffered interleaving tissue', 'buffered tissue', true, 'passed', 5],
  ['Unbuffered interleaving tissue', 'unbuffered tissue', false, 'passed', 4],
  ['Polypropylene sleeve', 'polypropylene film', false, 'passed', 4],
  ['Buffered print box', 'buffered board box', true, 'passed', 5],
  ['Unbuffered print box', 'unbuffered board box', false, 'passed', 4],
  ['Glassine envelope (legacy)', 'glassine', null, 'not_tested', 4],
  ['Kraft paper envelope (legacy)', 'brown kraft paper', false, 'failed', 2],
  ['Grey card folder (legacy)', 'grey card of unknown make', null, 'not_tested', 2],
  ['Donor\'s album page', 'black album paper', null, 'failed', 1],
  ['Buffered card wallet', 'buffered card', true, 'not_tested', 2],
  ['Unbuffered paper folder', 'unbuffered paper', false, 'not_tested', 2],
  ['Polyester sleeve with buffered card', 'polyester film and buffered card', true, 'passed', 3],
  ['Frame with buffered backing', 'buffered backing board', true, 'passed', 2],
  ['Frame with unbuffered backing', 'unbuffered backing board', false, 'passed', 2],
  ['Corrugated board box (legacy)', 'corrugated board', null, 'failed', 1],
].map(([name, material, buffered, pat, weight]) => ({ name, material, buffered, pat, weight }) as EnclosureRow);

const RECIPE_BASES: { key: string; name: string; tonerClass: string | null; volumeMl: number; ingredients: { chemical: string; amount: number; unit: string; strengthPercent?: number }[] }[] = [
  { key: 'iron_blue', name: 'Iron-blue single-bath toner', tonerClass: 'iron_blue', volumeMl: 500, ingredients: [
    { chemical: 'ferric ammonium citrate (green)', amount: 4, unit: 'g' }, { chemical: 'potassium ferricyanide', amount: 4, unit: 'g' },
    { chemical: 'acetic acid, 28 %', amount: 130, unit: 'g', strengthPercent: 28 }] },
  { key: 'selenium', name: 'Selenium toner with sulfite', tonerClass: 'selenium', volumeMl: 1000, ingredients: [
    { chemical: 'selenium toner concentrate (sodium selenosulfate solution)', amount: 50, unit: 'ml' }, { chemical: 'sodium sulfite, anhydrous', amount: 20, unit: 'g' }] },
  { key: 'gold', name: 'Gold thiocyanate toner', tonerClass: 'gold', volumeMl: 1000, ingredients: [
    { chemical: 'gold(III) chloride, 1 % solution', amount: 10, unit: 'ml', strengthPercent: 1 }, { chemical: 'ammonium thiocyanate', amount: 10, unit: 'g' }] },
  { key: 'sepia_bleach', name: 'Sepia bleach (ferricyanide–bromide)', tonerClass: 'sulfide', volumeMl: 1000, ingredients: [
    { chemical: 'potassium ferricyanide', amount: 50, unit: 'g' }, { chemical: 'potassium bromide', amount: 50, unit: 'g' }] },
  { key: 'sepia_redev', name: 'Sepia redeveloper (sodium sulfide)', tonerClass: 'sulfide', volumeMl: 1000, ingredients: [{ chemical: 'sodium sulfide nonahydrate', amount: 20, unit: 'g' }] },
  { key: 'polysulfide', name: 'Polysulfide brown toner', tonerClass: 'polysulfide', volumeMl: 1000, ingredients: [
    { chemical: 'potassium polysulfide', amount: 7.5, unit: 'g' }, { chemical: 'sodium carbonate, anhydrous', amount: 2.5, unit: 'g' }] },
  { key: 'copper', name: 'Copper citrate toner', tonerClass: 'copper', volumeMl: 1000, ingredients: [
    { chemical: 'copper(II) sulfate pentahydrate', amount: 7, unit: 'g' }, { chemical: 'potassium citrate monohydrate', amount: 28, unit: 'g' },
    { chemical: 'potassium ferricyanide', amount: 6, unit: 'g' }] },
  { key: 'vanadium', name: 'Vanadium green toner', tonerClass: 'vanadium', volumeMl: 1000, ingredients: [
    { chemical: 'vanadium(III) chloride', amount: 2, unit: 'g' }, { chemical: 'ferric ammonium citrate (green)', amount: 2, unit: 'g' },
    { chemical: 'potassium ferricyanide', amount: 1, unit: 'g' }, { chemical: 'oxalic acid', amount: 10, unit: 'g' }] },
  { key: 'borax', name: 'Borax after-bath', tonerClass: null, volumeMl: 1000, ingredients: [{ chemical: 'sodium tetraborate decahydrate (borax)', amount: 5, unit: 'g' }] },
  { key: 'hca', name: 'Sulfite clearing bath', tonerClass: null, volumeMl: 1000, ingredients: [{ chemical: 'sodium sulfite, anhydrous', amount: 20, unit: 'g' }] },
];
const RECIPE_VARIANTS = 3;
const SDS_NOTE = "Follow the safety data sheet of each chemical, local regulations and the institution's health-and-safety practice.";

// ── Date pool: every EDTF string a print can get, parsed by the app ─────────

const FIRST_YEAR = 1950;
const LAST_YEAR = 2024;
const DATE_SLOTS = 32;

function datePool() {
  const r = prng(SEED * 7919 + 11);
  const rows: { made: string | null; display: string | null; earliest: string | null; latest: string | null }[] = [];
  const forms = [
    ...Array(10).fill('year'), ...Array(5).fill('approxMonth'), ...Array(3).fill('day'), ...Array(3).fill('decade'), ...Array(3).fill('uncertain'),
    ...Array(3).fill('interval'), ...Array(2).fill('month'), ...Array(2).fill('approx'), 'none',
  ] as string[];
  for (let y = FIRST_YEAR; y <= LAST_YEAR; y++) {
    for (let slot = 0; slot < DATE_SLOTS; slot++) {
      const mm = String(r.int(1, 12)).padStart(2, '0');
      const form = forms[slot];
      const s =
        form === 'year' ? `${y}`
          : form === 'approxMonth' ? `${y}-${mm}~`
            : form === 'day' ? `${y}-${mm}-${String(r.int(1, 28)).padStart(2, '0')}`
              : form === 'decade' ? (y < 2020 ? `${String(y).slice(0, 3)}X` : `${y}`)
                : form === 'uncertain' ? `${y}?`
                  : form === 'interval' ? `${y - r.int(1, 3)}/${Math.min(LAST_YEAR, y + r.int(0, 4))}`
                    : form === 'month' ? `${y}-${mm}`
                      : form === 'approx' ? `${y}~`
                        : null;
      const d = deriveDate(s);
      rows.push({ made: d.dateMade, display: d.dateDisplay, earliest: d.dateEarliest, latest: d.dateLatest });
    }
  }
  return rows;
}

// ── Running it ──────────────────────────────────────────────────────────────

async function timed<T>(what: string, rows: () => Promise<number> | number, fn: () => Promise<T>): Promise<T> {
  const t0 = performance.now();
  const out = await fn();
  const s = (performance.now() - t0) / 1000;
  const n = await rows();
  log(`${what.padEnd(34)} ${String(n).padStart(9)} rows  ${s.toFixed(1).padStart(6)} s  ${n ? Math.round(n / Math.max(s, 0.001)).toLocaleString('en-GB').padStart(9) : ''}${n ? ' rows/s' : ''}`);
  return out;
}

async function reachable(port: number): Promise<boolean> {
  const c = new pg.Client({ host: '127.0.0.1', port, user: 'app', database: 'postgres', connectionTimeoutMillis: 1500 });
  try {
    await c.connect();
    await c.end();
    return true;
  } catch {
    return false;
  }
}

const port = Number(process.env.TONELEDGER_PG_PORT ?? 54329);
let cluster: LocalPostgres | null = null;
let code = 0;
const started = performance.now();
try {
  if (await reachable(port)) {
    log(`Using the PostgreSQL server already running on 127.0.0.1:${port} (left running at the end).`);
  } else {
    cluster = await startPostgres({
      baseDir: path.resolve(ROOT, process.env.TONELEDGER_DATA_DIR ?? '.data', 'pg'),
      port,
      database: 'postgres',
      log,
      fallbackKey: 'dev',
    });
    log(`Started the development PostgreSQL cluster on 127.0.0.1:${port} (stopped at the end).`);
  }
  const admin = new pg.Client({ host: '127.0.0.1', port, user: 'app', database: 'postgres' });
  await admin.connect();
  await admin.query(`DROP DATABASE IF EXISTS ${DATABASE} WITH (FORCE)`);
  await admin.query(`CREATE DATABASE ${DATABASE}`);
  await admin.end();
  const url = `postgres://app@127.0.0.1:${port}/${DATABASE}`;
  log(`Emptied ${DATABASE}; ${PRINTS.toLocaleString('en-GB')} prints, seed ${SEED}.`);

  await timed('migrate', () => 0, async () => {
    const sequelize = new Sequelize(url, { dialect: 'postgres', logging: false, define: { underscored: true } });
    await migrateUp(sequelize);
    await sequelize.close();
  });

  const c = new pg.Client({ connectionString: url });
  await c.connect();
  const count = async (table: string) => Number((await c.query(`SELECT count(*) AS n FROM ${table}`)).rows[0].n);
  await c.query(`SET synchronous_commit = off; SET work_mem = '64MB'; SET maintenance_work_mem = '256MB'`);
  // Uniform [0, 1) from a hash of (row key, salt): deterministic, parallel-safe, no state.
  await c.query(`CREATE FUNCTION pg_temp.rnd(k bigint, salt bigint) RETURNS float8 LANGUAGE sql IMMUTABLE PARALLEL SAFE
    AS $$ SELECT (hashint8extended(k, salt) & 9007199254740991)::float8 / 9007199254740992 $$`);
  const salt = (i: number) => SEED * 1000 + i;
  const r = prng(SEED);

  // ── Reference records ──
  const nMakers = 2000;
  await timed('makers', () => count('makers'), async () => {
    const names: string[] = [];
    const life: string[] = [];
    const ids: string[] = [];
    for (let i = 0; i < nMakers; i++) {
      names.push(`${FIRST[i % FIRST.length]} ${LAST[Math.floor(i / FIRST.length) % LAST.length]}`);
      const born = r.int(1880, 1995);
      const died = born + r.int(45, 98);
      life.push(died > 2024 ? `${born}/..` : r.chance(0.1) ? `${born}?/${died}` : `${born}/${died}`);
      ids.push(randomUUID());
    }
    await c.query('INSERT INTO makers (id, name, life_dates) SELECT * FROM unnest($1::uuid[], $2::text[], $3::text[])', [ids, names, life]);
    await c.query('CREATE TEMP TABLE mk AS SELECT (row_number() OVER (ORDER BY lower(name)) - 1)::int AS ix, id, name FROM makers');
  });

  let paperCounts: Record<string, number> = {};
  await timed('papers', () => count('papers'), async () => {
    const rows: { id: string; manufacturer: string; product: string; base: string; surface: string; tint: string; weight: string; ob: string; made: string; from: string; to: string | null }[] = [];
    for (const mill of MILLS) {
      const products = [...PRODUCTS_FIBRE.map((p) => [p, 'fibre'] as const), ...PRODUCTS_RC.map((p) => [p, 'rc'] as const)];
      for (const [product, base] of products) {
        const surface = SURFACES[(rows.length * 3) % SURFACES.length];
        const from = base === 'rc' ? r.int(1972, 2000) : r.int(1940, 2005);
        const to = from + r.int(10, 40);
        rows.push({
          id: randomUUID(), manufacturer: mill, product, base, surface, tint: r.pick(TINTS),
          weight: base === 'rc' ? 'medium weight' : r.pick(['single weight', 'double weight', '300 g/m²']),
          ob: base === 'rc' ? 'yes' : r.pick(['no', 'unknown', 'yes']),
          made: to > 2024 ? `${from}/..` : `${from}/${to}`, from: `${from}-01-01`, to: to > 2024 ? null : `${to}-12-31`,
        });
      }
    }
    // Uncoated papers for cyanotypes (base "other").
    for (const mill of MILLS.slice(0, 5)) {
      rows.push({ id: randomUUID(), manufacturer: mill, product: 'Cotton Rag, uncoated', base: 'other', surface: 'matt', tint: 'natural', weight: '300 g/m²', ob: 'no', made: '1985/..', from: '1985-01-01', to: null });
    }
    const col = <K extends keyof (typeof rows)[number]>(k: K) => rows.map((x) => x[k]);
    await c.query(
      `INSERT INTO papers (id, manufacturer, product, base, surface, base_tint, weight, optical_brighteners, made_dates, made_earliest, made_latest)
       SELECT * FROM unnest($1::uuid[], $2::text[], $3::text[], $4::text[], $5::text[], $6::text[], $7::text[], $8::text[], $9::text[], $10::date[], $11::date[])`,
      [col('id'), col('manufacturer'), col('product'), col('base'), col('surface'), col('tint'), col('weight'), col('ob'), col('made'), col('from'), col('to')],
    );
    await c.query(`CREATE TEMP TABLE pp AS SELECT (row_number() OVER (PARTITION BY base ORDER BY lower(manufacturer), lower(product)) - 1)::int AS k, base, id,
      manufacturer || ' ' || product || coalesce(', ' || surface, '') AS label FROM papers`);
    paperCounts = Object.fromEntries((await c.query('SELECT base, count(*)::int AS n FROM pp GROUP BY base')).rows.map((x) => [x.base, x.n]));
  });

  await timed('bath recipes', () => count('bath_recipes'), async () => {
    const rows = RECIPE_BASES.flatMap((b) =>
      Array.from({ length: RECIPE_VARIANTS }, (_, v) => ({
        id: randomUUID(), key: b.key, variant: v, name: `${b.name}, no. ${v + 1}`, tonerClass: b.tonerClass, volumeMl: b.volumeMl,
        ingredients: JSON.stringify(b.ingredients.map((i) => ({ ...i, amount: Math.round(i.amount * (0.8 + 0.2 * v) * 100) / 100 }))),
        notes: SDS_NOTE,
      })),
    );
    const col = <K extends keyof (typeof rows)[number]>(k: K) => rows.map((x) => x[k]);
    await c.query(
      `INSERT INTO bath_recipes (id, name, toner_class, volume_ml, ingredients, mixing_notes)
       SELECT * FROM unnest($1::uuid[], $2::text[], $3::text[], $4::numeric[], $5::jsonb[], $6::text[])`,
      [col('id'), col('name'), col('tonerClass'), col('volumeMl'), col('ingredients'), col('notes')],
    );
    await c.query('CREATE TEMP TABLE rc (key text, variant int, id uuid)');
    await c.query('INSERT INTO rc SELECT * FROM unnest($1::text[], $2::int[], $3::uuid[])', [col('key'), col('variant'), col('id')]);
  });

  let nLeaves = 0;
  await timed('locations', () => count('locations'), async () => {
    const rows: { id: string; parent: string | null; name: string; kind: string; code: string; path: string; leaf: boolean }[] = [];
    for (let b = 1; b <= 2; b++) {
      const building = { id: randomUUID(), parent: null, name: `Store building ${b}`, kind: 'building', code: `B${b}`, path: `Store building ${b}`, leaf: false };
      rows.push(building);
      for (let room = 1; room <= 6; room++) {
        const rm = { id: randomUUID(), parent: building.id, name: `Room ${room}`, kind: 'room', code: `B${b}-R${room}`, path: `${building.path} › Room ${room}`, leaf: false };
        rows.push(rm);
        for (let cab = 1; cab <= 12; cab++) {
          const cb = { id: randomUUID(), parent: rm.id, name: `Cabinet ${cab}`, kind: 'cabinet', code: `${rm.code}-C${cab}`, path: `${rm.path} › Cabinet ${cab}`, leaf: false };
          rows.push(cb);
          for (let d = 1; d <= 14; d++) {
            const name = d <= 10 ? `Drawer ${d}` : `Box ${d - 10}`;
            rows.push({ id: randomUUID(), parent: cb.id, name, kind: d <= 10 ? 'drawer' : 'box', code: `${cb.code}-${d}`, path: `${cb.path} › ${name}`, leaf: true });
          }
        }
      }
    }
    const col = <K extends keyof (typeof rows)[number]>(k: K) => rows.map((x) => x[k]);
    await c.query(
      `INSERT INTO locations (id, parent_id, name, kind, code, path_label) SELECT * FROM unnest($1::uuid[], $2::uuid[], $3::text[], $4::text[], $5::text[], $6::text[])`,
      [col('id'), col('parent'), col('name'), col('kind'), col('code'), col('path')],
    );
    const leaves = rows.filter((x) => x.leaf).map((x) => x.id);
    nLeaves = leaves.length;
    await c.query('CREATE TEMP TABLE lf AS SELECT (ord - 1)::int AS ix, id FROM unnest($1::uuid[]) WITH ORDINALITY AS u(id, ord)', [leaves]);
  });

  await timed('enclosure types', () => count('enclosure_types'), async () => {
    const ids = ENCLOSURES.map(() => randomUUID());
    await c.query(
      `INSERT INTO enclosure_types (id, name, material, alkaline_buffered, pat_result) SELECT * FROM unnest($1::uuid[], $2::text[], $3::text[], $4::boolean[], $5::text[])`,
      [ids, ENCLOSURES.map((e) => e.name), ENCLOSURES.map((e) => e.material), ENCLOSURES.map((e) => e.buffered), ENCLOSURES.map((e) => e.pat)],
    );
    await c.query('CREATE TEMP TABLE en AS SELECT (ord - 1)::int AS ix, id FROM unnest($1::uuid[]) WITH ORDINALITY AS u(id, ord)', [ids]);
  });

  // ── Lookup tables for the set-based part ──
  const profiles = buildProfiles();
  await timed('profiles, warnings, date pool', () => 0, async () => {
    const pick = (weights: number[], slots: number) => {
      const total = weights.reduce((a, b) => a + b, 0);
      const out: number[] = [];
      let acc = 0;
      weights.forEach((w, i) => {
        acc += w;
        while (out.length < Math.round((acc / total) * slots)) out.push(i);
      });
      while (out.length < slots) out.push(weights.length - 1);
      return out;
    };
    await c.query('CREATE TEMP TABLE prof (ix int PRIMARY KEY, process text, support text, paper_base text, blue boolean, toner_classes text[])');
    await c.query('INSERT INTO prof SELECT a, b, c, d, e, f::text[] FROM unnest($1::int[], $2::text[], $3::text[], $4::text[], $5::boolean[], $6::text[]) AS u(a, b, c, d, e, f)', [
      profiles.map((_, i) => i), profiles.map((p) => p.process), profiles.map((p) => p.support), profiles.map((p) => p.paperBase), profiles.map((p) => p.blue),
      // unnest of a text[][] flattens, so each profile's classes travel as one literal.
      profiles.map((p) => `{${tonerClassesOf(facts(p.steps)).join(',')}}`),
    ]);
    await c.query('CREATE TEMP TABLE prof_pick (slot int PRIMARY KEY, profile int)');
    await c.query('INSERT INTO prof_pick SELECT ord - 1, p FROM unnest($1::int[]) WITH ORDINALITY AS u(p, ord)', [pick(profiles.map((p) => p.weight), 10000)]);
    await c.query('CREATE TEMP TABLE enc_pick (slot int PRIMARY KEY, enclosure int)');
    await c.query('INSERT INTO enc_pick SELECT ord - 1, e FROM unnest($1::int[]) WITH ORDINALITY AS u(e, ord)', [pick(ENCLOSURES.map((e) => e.weight), 1000)]);
    // Warnings per (profile, enclosure), computed by the app's own rules.
    const pw = profiles.flatMap((p, pi) =>
      ENCLOSURES.map((e, ei) => ({
        pi, ei, codes: `{${warningsOf(p.process, facts(p.steps), { name: e.name, alkalineBuffered: e.buffered, patResult: e.pat }).map((w) => w.code).join(',')}}`,
      })),
    );
    await c.query('CREATE TEMP TABLE prof_warn (profile int, enclosure int, codes text[], PRIMARY KEY (profile, enclosure))');
    await c.query('INSERT INTO prof_warn SELECT a, b, w::text[] FROM unnest($1::int[], $2::int[], $3::text[]) AS u(a, b, w)', [pw.map((x) => x.pi), pw.map((x) => x.ei), pw.map((x) => x.codes)]);
    const steps = profiles.flatMap((p, pi) => p.steps.map((s, i) => ({ pi, pos: i + 1, ...s })));
    const col = <K extends keyof TStep>(k: K) => steps.map((s) => (s[k] ?? null) as TStep[K] | null);
    await c.query(`CREATE TEMP TABLE tmpl (profile int, position int, type text, agent text, toner_class text, recipe_key text, dilution text, time_seconds int,
      temperature_c numeric, extent text, concentration text, alkaline boolean, method text, has_value boolean, unit text, notes text)`);
    await c.query(
      `INSERT INTO tmpl SELECT * FROM unnest($1::int[], $2::int[], $3::text[], $4::text[], $5::text[], $6::text[], $7::text[], $8::int[], $9::numeric[], $10::text[],
        $11::text[], $12::boolean[], $13::text[], $14::boolean[], $15::text[], $16::text[])`,
      [steps.map((s) => s.pi), steps.map((s) => s.pos), col('type'), col('agent'), col('tonerClass'), col('recipeKey'), col('dilution'), col('timeSeconds'),
        col('temperatureC'), col('extent'), col('concentration'), col('alkaline'), col('method'), col('hasValue'), col('unit'), col('notes')],
    );
    const pool = datePool();
    await c.query('CREATE TEMP TABLE dpool (ix int PRIMARY KEY, made text, display text, earliest date, latest date)');
    await c.query('INSERT INTO dpool SELECT ord - 1, m, d, e, l FROM unnest($1::text[], $2::text[], $3::date[], $4::date[]) WITH ORDINALITY AS u(m, d, e, l, ord)', [
      pool.map((x) => x.made), pool.map((x) => x.display), pool.map((x) => x.earliest), pool.map((x) => x.latest),
    ]);
    await c.query('ANALYZE prof; ANALYZE prof_pick; ANALYZE enc_pick; ANALYZE prof_warn; ANALYZE tmpl; ANALYZE dpool; ANALYZE mk; ANALYZE pp; ANALYZE rc; ANALYZE lf; ANALYZE en');
  });

  // ── The plan: one row per print with every random choice, in PostgreSQL ──
  await c.query(`CREATE TEMP TABLE plan (n int PRIMARY KEY, id uuid, acq int, lot int, item int, maker int, profile int, enclosure int, paper_k int,
    loc int, year int, date_ix int, status text, size int, upright boolean, margin int, mounted boolean, u float8)`);
  await timed('plan (random choices)', () => count('plan'), async () => {
    for (let lo = 1; lo <= PRINTS; lo += BATCH) {
      const hi = Math.min(PRINTS, lo + BATCH - 1);
      await c.query(
        `INSERT INTO plan
         SELECT n, gen_random_uuid(), acq, lot, item,
           CASE WHEN pg_temp.rnd(n, ${salt(2)}) < 0.8 THEN floor(pg_temp.rnd(acq * 100000 + lot, ${salt(3)}) * ${nMakers})
                ELSE floor(pg_temp.rnd(n, ${salt(4)}) * ${nMakers}) END::int,
           pp.profile, ep.enclosure, floor(pg_temp.rnd(n, ${salt(7)}) * 1000000)::int, floor(pg_temp.rnd(n, ${salt(8)}) * ${nLeaves})::int,
           yr, (yr - ${FIRST_YEAR}) * ${DATE_SLOTS} + floor(pg_temp.rnd(n, ${salt(10)}) * ${DATE_SLOTS})::int,
           CASE WHEN u14 < 0.84 THEN 'in_store' WHEN u14 < 0.89 THEN 'on_display' WHEN u14 < 0.93 THEN 'on_loan' WHEN u14 < 0.97 THEN 'in_treatment' ELSE 'deaccessioned' END,
           floor(pg_temp.rnd(n, ${salt(15)}) * 8)::int, pg_temp.rnd(n, ${salt(16)}) < 0.45, (ARRAY[0, 6, 12, 20, 25, 38])[1 + floor(pg_temp.rnd(n, ${salt(17)}) * 6)::int],
           pg_temp.rnd(n, ${salt(18)}) < 0.3, pg_temp.rnd(n, ${salt(19)})
         FROM (
           SELECT n, 1976 + (n - 1) % 49 AS acq, 1 + ((n - 1) / 49) / 40 AS lot, 1 + ((n - 1) / 49) % 40 AS item, pg_temp.rnd(n, ${salt(14)}) AS u14
           FROM generate_series($1::int, $2::int) n
         ) g
         CROSS JOIN LATERAL (SELECT ${FIRST_YEAR} + floor(pg_temp.rnd(n, ${salt(9)}) * (least(acq, ${LAST_YEAR}) - ${FIRST_YEAR} + 1))::int AS yr) y
         JOIN prof_pick pp ON pp.slot = floor(pg_temp.rnd(n, ${salt(5)}) * 10000)::int
         JOIN enc_pick ep ON ep.slot = floor(pg_temp.rnd(n, ${salt(6)}) * 1000)::int`,
        [lo, hi],
      );
    }
    await c.query('ANALYZE plan');
  });

  // ── Prints ──
  const sizes = [[127, 178], [152, 203], [190, 240], [203, 254], [240, 305], [279, 356], [356, 432], [406, 508]];
  await timed('prints', () => count('prints'), async () => {
    for (let lo = 1; lo <= PRINTS; lo += BATCH) {
      const hi = Math.min(PRINTS, lo + BATCH - 1);
      await c.query(
        `INSERT INTO prints (id, accession_number, accession_sort, title, maker_id, maker_name, date_made, date_display, date_earliest, date_latest,
           image_width_mm, image_height_mm, sheet_width_mm, sheet_height_mm, mount_width_mm, mount_height_mm, process, support, paper_id, paper_label,
           inscriptions, provenance, credit_line, status, location_id, enclosure_id, light_responsivity, staff_notes, valuation_amount, valuation_currency,
           toner_classes, warning_codes, created_at, updated_at)
         SELECT pl.id, pl.acq || '.' || pl.lot || '.' || pl.item,
           lpad(pl.acq::text, 12, '0') || '.' || lpad(pl.lot::text, 12, '0') || '.' || lpad(pl.item::text, 12, '0'),
           CASE floor(pg_temp.rnd(pl.n, ${salt(11)}) * 13)::int
             WHEN 0 THEN 'Untitled (' || lower(($3::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(12)}) * $7)::int]) || ')'
             WHEN 1 THEN ($4::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(13)}) * $8)::int] || ' series, no. ' || (1 + floor(pg_temp.rnd(pl.n, ${salt(20)}) * 40)::int)
             WHEN 2 THEN 'Portrait of ' || ($6::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(21)}) * $10)::int] || ', ' || ($4::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(13)}) * $8)::int]
             WHEN 3 THEN 'Portrait of ' || ($6::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(21)}) * $10)::int]
             WHEN 4 THEN ($3::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(12)}) * $7)::int] || ' ' || ($5::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(22)}) * $9)::int]
             WHEN 5 THEN ($3::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(12)}) * $7)::int] || ' ' || ($5::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(22)}) * $9)::int]
             ELSE ($3::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(12)}) * $7)::int] || ', ' || ($4::text[])[1 + floor(pg_temp.rnd(pl.n, ${salt(13)}) * $8)::int]
           END,
           mk.id, mk.name, d.made, d.display, d.earliest, d.latest,
           CASE WHEN pl.upright THEN s.h ELSE s.w END, CASE WHEN pl.upright THEN s.w ELSE s.h END,
           CASE WHEN pl.upright THEN s.h ELSE s.w END + 2 * pl.margin, CASE WHEN pl.upright THEN s.w ELSE s.h END + 2 * pl.margin,
           CASE WHEN pl.mounted THEN CASE WHEN pl.upright THEN s.h ELSE s.w END + 2 * pl.margin + 80 END,
           CASE WHEN pl.mounted THEN CASE WHEN pl.upright THEN s.w ELSE s.h END + 2 * pl.margin + 120 END,
           pr.process, pr.support, pp.id, pp.label,
           CASE WHEN pl.u < 0.35 THEN 'Signed in pencil on verso.'
                WHEN pl.u < 0.55 THEN 'Signed and dated in pencil on verso: "' || pl.year || '".'
                WHEN pl.u < 0.62 THEN 'Printer''s blind stamp, lower right of the mount.'
                WHEN pl.u < 0.68 THEN 'Negative number in ink on verso: "N' || (pl.n % 997) || '".' END,
           'The photographer''s studio; ' || ($11::text[])[1 + (hashint8extended(pl.acq * 1000 + pl.lot, ${salt(23)}) & 1048575)::int % $12] || '; given to the Trust, ' || pl.acq || '.',
           'Calder Reach Photographic Trust. Gift of ' || ($11::text[])[1 + (hashint8extended(pl.acq * 1000 + pl.lot, ${salt(23)}) & 1048575)::int % $12] || ', ' || pl.acq,
           pl.status,
           CASE WHEN pl.status <> 'deaccessioned' THEN lf.id END,
           en.id,
           NULL, -- the light category is computed below, as the app does (light-category-sql.ts)
           CASE WHEN pg_temp.rnd(pl.n, ${salt(24)}) < 0.1 THEN 'Matched to the negative register, volume ' || (1 + pl.n % 9) || '.' END,
           CASE WHEN pg_temp.rnd(pl.n, ${salt(25)}) < 0.3 THEN 50 * (3 + floor(pg_temp.rnd(pl.n, ${salt(26)}) * 240)::int) END,
           CASE WHEN pg_temp.rnd(pl.n, ${salt(25)}) < 0.3 THEN 'GBP' END,
           pr.toner_classes, pw.codes,
           ts, ts + (pg_temp.rnd(pl.n, ${salt(28)}) * (timestamptz '2025-06-30' - ts))
         FROM plan pl
         JOIN prof pr ON pr.ix = pl.profile
         JOIN prof_warn pw ON pw.profile = pl.profile AND pw.enclosure = pl.enclosure
         JOIN en ON en.ix = pl.enclosure
         JOIN mk ON mk.ix = pl.maker
         JOIN dpool d ON d.ix = pl.date_ix
         JOIN lf ON lf.ix = pl.loc
         JOIN pp ON pp.base = pr.paper_base AND pp.k = pl.paper_k % (CASE pr.paper_base WHEN 'fibre' THEN ${paperCounts.fibre} WHEN 'rc' THEN ${paperCounts.rc} ELSE ${paperCounts.other} END)
         JOIN (SELECT ord - 1 AS ix, w, h FROM unnest($13::int[], $14::int[]) WITH ORDINALITY AS u(w, h, ord)) s ON s.ix = pl.size
         CROSS JOIN LATERAL (SELECT timestamptz '2005-01-01' + pg_temp.rnd(pl.n, ${salt(27)}) * interval '20 years' AS ts) t
         WHERE pl.n BETWEEN $1 AND $2`,
        [lo, hi, SUBJECTS, PLACES, TIMES, SITTERS, SUBJECTS.length, PLACES.length, TIMES.length, SITTERS.length, DONORS, DONORS.length,
          sizes.map((x) => x[0]), sizes.map((x) => x[1])],
      );
      log(`  prints ${hi.toLocaleString('en-GB')} of ${PRINTS.toLocaleString('en-GB')}`);
    }
  });

  // ── Process steps ──
  await timed('process steps', () => count('process_steps'), async () => {
    for (let lo = 1; lo <= PRINTS; lo += BATCH) {
      const hi = Math.min(PRINTS, lo + BATCH - 1);
      await c.query(
        `INSERT INTO process_steps (print_id, position, type, agent, toner_class, recipe_id, dilution, time_seconds, temperature_c, extent, concentration,
           alkaline, method, value, unit, notes)
         SELECT pl.id, t.position, t.type, t.agent, t.toner_class, rc.id, t.dilution,
           CASE WHEN t.time_seconds IS NOT NULL THEN round(t.time_seconds * (0.7 + 0.6 * pg_temp.rnd(pl.n * 16 + t.position, ${salt(30)})))::int END,
           t.temperature_c, t.extent, t.concentration, t.alkaline, t.method,
           CASE WHEN t.has_value THEN round((0.02 + 0.28 * pg_temp.rnd(pl.n, ${salt(31)}))::numeric, 3) END, t.unit, t.notes
         FROM plan pl
         JOIN tmpl t ON t.profile = pl.profile
         LEFT JOIN rc ON rc.key = t.recipe_key AND rc.variant = pl.n % ${RECIPE_VARIANTS}
         WHERE pl.n BETWEEN $1 AND $2`,
        [lo, hi],
      );
      log(`  steps for prints ${hi.toLocaleString('en-GB')} of ${PRINTS.toLocaleString('en-GB')}`);
    }
  });

  // ── Measurement histories and signed condition reports (seed-scale-histories.ts), by COPY ──
  const histories = await timed('measurements and condition reports', () => count('spot_readings'), async () =>
    seedScaleHistories(c, {
      prints: PRINTS, seed: SEED, log,
      profiles: profiles.map((p) => ({
        tonerClasses: tonerClassesOf(facts(p.steps)), alkaline: p.steps.some((x) => x.type === 'after_bath' && x.alkaline === true), support: p.support, process: p.process,
      })),
    }));
  log(`  ${histories.spots.toLocaleString('en-GB')} spots, ${histories.sessions.toLocaleString('en-GB')} sessions, ${histories.readings.toLocaleString('en-GB')} spot readings, ` +
    `${histories.reports.toLocaleString('en-GB')} signed reports, ${histories.observations.toLocaleString('en-GB')} observations`);

  // ── Light categories: the statement the app runs when the light settings' rules change ──
  await timed('light categories (one UPDATE, default rules)', () => PRINTS, async () => {
    const bind: unknown[] = [];
    const expr = categorySql(DEFAULT_LIGHT_SETTINGS, bind);
    await c.query(`UPDATE prints p SET light_responsivity = ${expr} WHERE p.light_responsivity IS DISTINCT FROM ${expr}`, bind);
  });

  await timed('VACUUM ANALYZE', () => 0, async () => {
    await c.query('VACUUM (ANALYZE)');
  });

  // ── Consistency: a sample re-derived with the app's own functions ──
  await timed('consistency check (2,000 sampled)', () => 2000, async () => {
    const sample = await c.query(
      `SELECT p.accession_number, p.accession_sort, p.date_made, p.date_display, p.date_earliest::text, p.date_latest::text, p.process, p.toner_classes,
         p.light_responsivity, p.warning_codes, e.name AS enc_name, e.alkaline_buffered, e.pat_result,
         (SELECT json_agg(json_build_object('type', s.type, 'tonerClass', s.toner_class, 'agent', s.agent, 'alkaline', s.alkaline) ORDER BY s.position)
            FROM process_steps s WHERE s.print_id = p.id) AS steps,
         (SELECT count(*) FROM process_steps s WHERE s.print_id = p.id)::int AS n_steps
       FROM prints p LEFT JOIN enclosure_types e ON e.id = p.enclosure_id
       WHERE p.id IN (SELECT id FROM plan WHERE n % greatest(1, $1::int / 2000) = 0 LIMIT 2000)`,
      [PRINTS],
    );
    const bad: string[] = [];
    for (const row of sample.rows) {
      const steps = (row.steps ?? []) as StepFacts[];
      const d = deriveDate(row.date_made);
      const warnings = warningsOf(row.process, steps, row.enc_name ? { name: row.enc_name, alkalineBuffered: row.alkaline_buffered, patResult: row.pat_result } : null).map((w) => w.code);
      const checks: [string, unknown, unknown][] = [
        ['accession_sort', row.accession_sort, accessionSortKey(row.accession_number)],
        ['date', [row.date_display, row.date_earliest, row.date_latest], [d.dateDisplay, d.dateEarliest, d.dateLatest]],
        ['toner_classes', row.toner_classes, tonerClassesOf(steps)],
        ['warning_codes', row.warning_codes, warnings],
        ['light_responsivity', row.light_responsivity, categoryByRules(DEFAULT_LIGHT_SETTINGS, row.process, row.toner_classes)],
      ];
      for (const [what, got, want] of checks) if (JSON.stringify(got) !== JSON.stringify(want)) bad.push(`${row.accession_number} ${what}: ${JSON.stringify(got)} ≠ ${JSON.stringify(want)}`);
      if (row.n_steps < 3 || row.n_steps > 9) bad.push(`${row.accession_number}: ${row.n_steps} steps`);
    }
    if (bad.length) throw new Error(`Derived columns disagree with the app in ${bad.length} cases, e.g.\n  ${bad.slice(0, 5).join('\n  ')}`);
    log(`  ${sample.rowCount} sampled prints match accessionSortKey, deriveDate, tonerClassesOf, warningsOf and categoryByRules`);
  });

  await timed('fading rates of 3,000 prints (the app\'s analysis)', () => 3000, async () => {
    for (const l of await summariseScaleRates(c)) log(`  ${l}`);
  });

  const summary = (await c.query(`SELECT (SELECT count(*) FROM prints) AS prints, (SELECT count(*) FROM process_steps) AS steps,
      (SELECT count(*) FROM spot_readings) AS readings, (SELECT count(*) FROM condition_reports) AS reports,
      (SELECT count(*) FROM prints WHERE warning_codes <> '{}') AS with_warnings,
      pg_size_pretty(pg_database_size(current_database())) AS size`)).rows[0];
  log(`${DATABASE}: ${Number(summary.prints).toLocaleString('en-GB')} prints, ${Number(summary.steps).toLocaleString('en-GB')} steps, ` +
    `${Number(summary.readings).toLocaleString('en-GB')} spot readings, ${Number(summary.reports).toLocaleString('en-GB')} condition reports, ` +
    `${Number(summary.with_warnings).toLocaleString('en-GB')} with warnings, ${summary.size}; total ${((performance.now() - started) / 1000).toFixed(1)} s.`);
  await c.end();
  log('Next: npm run bench');
} catch (err) {
  console.error(err instanceof Error ? err.stack ?? err.message : err);
  code = 1;
} finally {
  if (cluster) await cluster.stop();
}
process.exit(code);

function facts(steps: TStep[]): StepFacts[] {
  return steps.map((s) => ({ type: s.type, tonerClass: s.tonerClass ?? null, agent: s.agent ?? null, alkaline: s.alkaline ?? null }));
}
