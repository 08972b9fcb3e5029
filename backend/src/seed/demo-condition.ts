import { createHash } from 'node:crypto';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import sharp, { type Sharp } from 'sharp';
import { QueryTypes } from 'sequelize';
import type { ObjectStore } from '@toneledger/storage/object-store';
import { reportInputSchema, type ObservationInput, type ReportInput } from '@toneledger/common/schemas/condition';
import { imageUploadFieldsSchema } from '@toneledger/common/schemas/images';
import { db } from '../db';
import { Addendum, ConditionReport, Image } from '../models';
import { addAddendum, createReport, signReport, type Actor } from '../services/condition.service';
import { copySetupFor, signedAtFor } from './demo-times';
import { storeImage } from '../services/image.service';
import type { ReceivedFile } from '../services/image-ingest';
import { DEMO_INSTITUTION } from './demo-accounts';
import { prng } from './demo-catalogue';
import { inPool } from './pool';

/**
 * Condition histories and photographs for part of the (invented) demo collection: dated reports
 * from the late 1980s to now, by the demo conservator, and copy photographs of each print made
 * every decade or so, in which the prints that are fading can be seen to fade.
 *
 * How each print ages is decided once, here, from what the catalogue says about it (toner,
 * support, enclosure, date): iron-blue prints in buffered housings lose their blue, selenium on
 * fibre holds, old untoned fibre prints grow silver mirroring at the edges, brightened
 * RC paper yellows a little. The reports, the photographs and the measurement seed
 * (demo-measurements.ts) all read the same model, so the three agree with one another.
 *
 * Everything is written through the services (reports, signing, addenda, image storage with its
 * SHA-256, EXIF and display copies), so audit rows and rules are exactly what the app writes.
 * The examination and capture dates lie in the past, as they do for records migrated from paper;
 * signing and upload times are those of the seed run. Deterministic: one catalogue, one history.
 */

// ── Deterministic randomness per print ──────────────────────────────────────

type Rng = ReturnType<typeof prng>;

/** A generator of its own for each print and purpose, so the result does not depend on the order of work. */
export function rngFor(key: string, purpose: string, seed = 1988): Rng {
  const h = createHash('sha256').update(`${seed}:${purpose}:${key}`).digest();
  return prng(h.readUInt32BE(0));
}

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));
const lerp = (a: number, b: number, t: number) => a + (b - a) * t;
const pad2 = (n: number) => String(n).padStart(2, '0');

/** A real calendar day of a year, with its decimal year. */
function dayIn(r: Rng, year: number, months: [number, number] = [1, 12]): { date: string; t: number } {
  const month = r.int(months[0], months[1]);
  const day = r.int(1, 28);
  return { date: `${year}-${pad2(month)}-${pad2(day)}`, t: year + (month - 1) / 12 + (day - 1) / 365 };
}

function addMonths(date: string, months: number, r: Rng): { date: string; t: number } {
  const [y, m] = date.split('-').map(Number);
  const total = y * 12 + (m - 1) + months;
  const year = Math.floor(total / 12);
  const month = (total % 12) + 1;
  const day = r.int(1, 28);
  return { date: `${year}-${pad2(month)}-${pad2(day)}`, t: year + (month - 1) / 12 + (day - 1) / 365 };
}

const yearOf = (date: string) => Number(date.slice(0, 4));

/** The latest day allowed for a dated record: nothing is examined or measured in the future. */
export function seedToday(): string {
  return new Date().toISOString().slice(0, 10);
}

// ── The prints, and how each one ages ───────────────────────────────────────

export interface DemoPrint {
  id: string;
  accessionNumber: string;
  title: string;
  process: string;
  support: string | null;
  tonerClasses: string[];
  partialToning: boolean;
  madeYear: number;
  accessionYear: number;
  buffered: boolean | null;
  /** An alkaline after-bath (borax) is recorded in the process history. */
  alkalineAfterBath: boolean;
  enclosureName: string | null;
  warmPaper: boolean;
  imageWidthMm: number;
  imageHeightMm: number;
  sheetWidthMm: number;
  sheetHeightMm: number;
  inscriptions: string | null;
}

interface PrintRow {
  id: string;
  accessionNumber: string;
  title: string;
  process: string;
  support: string | null;
  tonerClasses: string[];
  partialToning: boolean;
  madeYear: number | null;
  buffered: boolean | null;
  alkalineAfterBath: boolean;
  enclosureName: string | null;
  paperTint: string | null;
  imageWidthMm: number | null;
  imageHeightMm: number | null;
  sheetWidthMm: number | null;
  sheetHeightMm: number | null;
  inscriptions: string | null;
}

/** The gelatin silver prints still in the collection, in accession order, with what ageing depends on. */
export async function loadDemoPrints(): Promise<DemoPrint[]> {
  const rows = await db().query<PrintRow>(
    `SELECT p.id, p.accession_number AS "accessionNumber", p.title, p.process, p.support, p.toner_classes AS "tonerClasses",
            EXTRACT(YEAR FROM p.date_latest)::int AS "madeYear", e.alkaline_buffered AS buffered, e.name AS "enclosureName",
            pa.base_tint AS "paperTint", p.inscriptions,
            p.image_width_mm::float8 AS "imageWidthMm", p.image_height_mm::float8 AS "imageHeightMm",
            p.sheet_width_mm::float8 AS "sheetWidthMm", p.sheet_height_mm::float8 AS "sheetHeightMm",
            EXISTS (SELECT 1 FROM process_steps s WHERE s.print_id = p.id AND s.type = 'toning')
              AND NOT EXISTS (SELECT 1 FROM process_steps s WHERE s.print_id = p.id AND s.type = 'toning' AND s.extent = 'full') AS "partialToning",
            EXISTS (SELECT 1 FROM process_steps s WHERE s.print_id = p.id AND s.type = 'after_bath' AND s.alkaline) AS "alkalineAfterBath"
       FROM prints p
       LEFT JOIN enclosure_types e ON e.id = p.enclosure_id
       LEFT JOIN papers pa ON pa.id = p.paper_id
      WHERE p.status <> 'deaccessioned' AND p.process IN ('gelatin_silver_developing_out', 'gelatin_silver_printing_out')
      ORDER BY p.accession_sort`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((p) => {
    const accessionYear = Number(/^(\d{4})\./.exec(p.accessionNumber)?.[1] ?? 1990);
    const iw = p.imageWidthMm ?? 200;
    const ih = p.imageHeightMm ?? 250;
    return {
      id: p.id, accessionNumber: p.accessionNumber, title: p.title, process: p.process, support: p.support,
      tonerClasses: p.tonerClasses ?? [], partialToning: p.partialToning,
      madeYear: Math.min(accessionYear, p.madeYear ?? accessionYear - 5), accessionYear,
      buffered: p.buffered, alkalineAfterBath: p.alkalineAfterBath, enclosureName: p.enclosureName,
      warmPaper: /warm|cream|ivory|natural/i.test(p.paperTint ?? ''),
      imageWidthMm: iw, imageHeightMm: ih,
      sheetWidthMm: Math.max(iw, p.sheetWidthMm ?? iw), sheetHeightMm: Math.max(ih, p.sheetHeightMm ?? ih),
      inscriptions: p.inscriptions,
    };
  });
}

export type Toner = 'iron_blue' | 'selenium' | 'sulfide' | 'gold' | 'copper' | 'untoned';
export type Kind = 'blue_buffered' | 'blue_unbuffered' | 'selenium_fibre' | 'mirroring' | 'sulfide' | 'rc_untoned' | 'other';

export function tonerOf(p: DemoPrint): Toner {
  const t = p.tonerClasses;
  if (t.includes('iron_blue')) return 'iron_blue';
  if (t.includes('copper')) return 'copper';
  if (t.includes('sulfide') || t.includes('polysulfide')) return 'sulfide';
  if (t.includes('selenium')) return 'selenium';
  if (t.includes('gold')) return 'gold';
  return 'untoned';
}

export interface Story {
  print: DemoPrint;
  toner: Toner;
  kind: Kind;
  /** When the print went into the housing that drives its fading (blue prints in buffered board). */
  housedYear: number;
  /** Fading already present when it came in (0–1 of the way to fully faded). */
  initialFade: number;
  /** Fading per year once housed (0–1 scale); for iron blue, the rate at the start of a curve that slows. */
  fadeRate: number;
  /** Iron blue: the fading the curve levels off at (it slows as it nears it); null for a steady rate. */
  fadeLimit: number | null;
  /** Iron blue: a display that faded the print at `at` (decimal year) by `dip`, most of which came back in the dark. */
  display: { at: number; dip: number } | null;
  /** When silver mirroring starts at the edges, if it does. */
  mirroringOnset: number | null;
  /** Relative weight of the mirroring on each edge: top, right, bottom, left (strongest at the dark foreground). */
  mirroringEdges: [number, number, number, number];
  /** How many years the mirroring takes to go from first sign to heavy. */
  mirroringYears: number;
  /** Yellowing of the paper base per year (RC). */
  yellowingRate: number;
}

const fibre = (p: DemoPrint) => p.support === 'fibre_baryta';

export function kindOf(p: DemoPrint): Kind {
  const toner = tonerOf(p);
  if (toner === 'iron_blue') return p.buffered === true ? 'blue_buffered' : 'blue_unbuffered';
  if (toner === 'selenium' && fibre(p) && !p.partialToning) return 'selenium_fibre';
  if ((toner === 'untoned' || (toner === 'selenium' && p.partialToning)) && fibre(p) && p.madeYear <= 1975) return 'mirroring';
  if (toner === 'sulfide') return 'sulfide';
  if (toner === 'untoned' && p.support === 'resin_coated') return 'rc_untoned';
  return 'other';
}

export function storyOf(p: DemoPrint): Story {
  const r = rngFor(p.accessionNumber, 'story');
  const kind = kindOf(p);
  const toner = tonerOf(p);
  const story: Story = {
    print: p, toner, kind, housedYear: p.accessionYear, initialFade: 0, fadeRate: 0, fadeLimit: null, display: null, mirroringOnset: null,
    mirroringEdges: [0.2 + r.next() * 0.4, 0.4 + r.next() * 0.5, 1, 0.4 + r.next() * 0.5], mirroringYears: 30 + r.int(0, 20), yellowingRate: 0,
  };
  // The rates are drawn from a generator of their own, so the other draws of a story stay as they were.
  const f = rngFor(p.accessionNumber, 'fading');
  const spread = Math.exp(0.35 * gauss(f));
  // An alkaline after-bath (borax) leaves the blue less stable: the demo's invented factor.
  const borax = toner === 'iron_blue' && p.alkalineAfterBath ? BORAX_FACTOR : 1;
  switch (kind) {
    case 'blue_buffered':
      // Buffered folders became the store standard in the 1990s; prints that came later went straight into them.
      story.housedYear = Math.max(p.accessionYear, 1989 + r.int(0, 6));
      story.initialFade = r.next() * 0.03;
      story.fadeRate = (0.008 + r.next() * 0.01) * spread * borax;
      break;
    case 'blue_unbuffered':
      story.initialFade = r.next() * 0.02;
      story.fadeRate = (0.0035 + r.next() * 0.003) * spread * borax;
      break;
    case 'sulfide':
      r.next(); // the draw of an earlier, slower rate, kept so the draws after it stay as they were
      story.fadeRate = 0.006 * spread;
      break;
    case 'other':
      story.fadeRate = toner === 'copper' ? 0.0015 + r.next() * 0.001 : (STEADY_RATE[toner] ?? 0) * spread;
      break;
    case 'mirroring':
      story.mirroringOnset = Math.max(p.accessionYear + 2, 1986 + r.int(0, 14));
      story.fadeRate = STEADY_RATE.untoned! * spread;
      break;
    case 'rc_untoned':
      story.yellowingRate = 0.004 + r.next() * 0.003;
      story.fadeRate = STEADY_RATE.untoned! * 1.4 * spread;
      break;
    case 'selenium_fibre':
      story.fadeRate = STEADY_RATE.selenium! * spread;
      break;
    default:
      break;
  }
  if (p.support === 'resin_coated' && kind !== 'rc_untoned') story.yellowingRate = 0.002 + r.next() * 0.002;
  if (toner === 'iron_blue') {
    story.fadeLimit = 0.3 + f.next() * 0.25;
    // Some were shown in the light for a season and faded, then won most of it back in the dark.
    const at = Math.max(p.accessionYear + 2, 1995) + f.int(0, 22) + f.next();
    if (f.chance(0.35) && at < 2025.5) story.display = { at, dip: 0.03 + f.next() * 0.04 };
  }
  return story;
}

/** A roughly normal draw with mean 0 and standard deviation 1 (the sum of three uniform draws). */
function gauss(r: Rng): number {
  return (r.next() + r.next() + r.next() - 1.5) / 0.5;
}

/**
 * How much faster iron blue fades after an alkaline (borax) after-bath. Invented for the demo, like
 * every rate here: plausible in direction (Prussian blue is decomposed by alkali, common practice
 * keeps iron-blue prints away from alkaline baths and buffered board), not a measured figure.
 */
export const BORAX_FACTOR = 3;

/** Steady fading per year (0–1 scale) of the toners that fade slowly and evenly, before each print's own spread. Invented. */
const STEADY_RATE: Partial<Record<Toner, number>> = { untoned: 0.0026, selenium: 0.0007, gold: 0.0012 };

/** Iron blue slows as it nears its limit: f(τ) = limit · (1 − exp(−rate · τ / limit)), which starts at `rate` per year. */
function saturating(s: Story, years: number): number {
  if (s.fadeLimit === null) return years * s.fadeRate;
  return s.fadeLimit * (1 - Math.exp((-s.fadeRate * years) / s.fadeLimit));
}

/** A display's fading at t: the whole dip at once, then 60 % of it back in the dark over a year or two. */
function displayFadeAt(s: Story, t: number): number {
  if (!s.display || t < s.display.at) return 0;
  return s.display.dip * (0.4 + 0.6 * Math.exp(-(t - s.display.at) / 0.8));
}

/** How far the image has faded at decimal year t: 0 as made, 1 all but gone. */
export function fadeAt(s: Story, t: number): number {
  const since = (y: number) => Math.max(0, t - y);
  if (s.kind === 'blue_buffered') {
    // Before the buffered housing the print faded at 0.002 a year: as many years of the housed rate as give the same.
    const before = (Math.max(0, Math.min(t, s.housedYear) - s.print.accessionYear) * 0.002) / s.fadeRate;
    return clamp(s.initialFade + saturating(s, before + since(s.housedYear)) + displayFadeAt(s, t), 0, 0.9);
  }
  return clamp(s.initialFade + saturating(s, since(s.print.accessionYear)) + displayFadeAt(s, t), 0, 0.9);
}

/** Silver mirroring at the edges: 0 none, 1 heavy. */
export function mirroringAt(s: Story, t: number): number {
  return s.mirroringOnset === null ? 0 : clamp((t - s.mirroringOnset) / s.mirroringYears, 0, 1);
}

export function yellowingAt(s: Story, t: number): number {
  return clamp((t - s.print.madeYear) * s.yellowingRate, 0, 1);
}

// ── Colour: CIELAB (D50) of paper, mid-tone and maximum density ─────────────

export type Lab3 = [number, number, number];
export interface Tone {
  paper: Lab3;
  mid: Lab3;
  dmax: Lab3;
}

const FRESH: Record<Toner, Tone> = {
  iron_blue: { paper: [92.5, -1.8, -2.5], mid: [50, -6, -27], dmax: [25, -1, -27] },
  selenium: { paper: [94, 0.3, 3], mid: [46, 2.8, 1.8], dmax: [9, 2.2, -0.6] },
  sulfide: { paper: [91, 1.5, 9], mid: [55, 9, 23], dmax: [23, 8, 13] },
  gold: { paper: [94, 0, 1.5], mid: [47, -0.8, -4], dmax: [10, 0.4, -3.5] },
  copper: { paper: [93, 1.5, 5], mid: [52, 17, 20], dmax: [27, 20, 16] },
  untoned: { paper: [94.5, 0, 2.5], mid: [48, 0.3, 1.2], dmax: [7, 0.3, 0.6] },
};

/** Where each image would end if it faded completely; toners not listed hold their colour. */
const FADED: Partial<Record<Toner, Tone>> = {
  iron_blue: { paper: [93, -0.6, 2.5], mid: [72, -4.5, -4], dmax: [47, -5, -9] },
  sulfide: { paper: [90, 1.5, 12], mid: [64, 7, 20], dmax: [33, 7, 13] },
  copper: { paper: [92, 1.5, 6], mid: [63, 10, 17], dmax: [39, 12, 14] },
  // Silver images lose density and warm slightly as they age (slowly: see STEADY_RATE).
  untoned: { paper: [93.5, 0.3, 5], mid: [60, 1.2, 5], dmax: [30, 1.5, 8] },
  selenium: { paper: [93, 0.5, 5], mid: [58, 3, 4], dmax: [28, 2.5, 5] },
  gold: { paper: [93, 0.2, 3.5], mid: [58, 0, -1], dmax: [28, 0.8, 0] },
};

const mix = (a: Lab3, b: Lab3, t: number): Lab3 => [lerp(a[0], b[0], t), lerp(a[1], b[1], t), lerp(a[2], b[2], t)];

/** The colour of the print's paper, mid-tones and deepest shadows at decimal year t. */
export function toneAt(s: Story, t: number): Tone {
  const base = FRESH[s.toner];
  const plain = FRESH.untoned;
  // Split or partial toning: the toner's colour only part of the way.
  const share = s.print.partialToning ? 0.5 : 1;
  let tone: Tone = { paper: mix(plain.paper, base.paper, share), mid: mix(plain.mid, base.mid, share), dmax: mix(plain.dmax, base.dmax, share) };
  const faded = FADED[s.toner];
  const f = fadeAt(s, t);
  if (faded && f > 0) {
    const end: Tone = { paper: mix(plain.paper, faded.paper, share), mid: mix(plain.mid, faded.mid, share), dmax: mix(plain.dmax, faded.dmax, share) };
    tone = { paper: mix(tone.paper, end.paper, f), mid: mix(tone.mid, end.mid, f), dmax: mix(tone.dmax, end.dmax, f) };
  }
  if (s.print.warmPaper) {
    tone.paper = [tone.paper[0] - 1, tone.paper[1] + 0.6, tone.paper[2] + 4];
    tone.mid = [tone.mid[0], tone.mid[1] + 0.4, tone.mid[2] + 1.5];
  }
  if (s.print.support === 'resin_coated') {
    // Brightened RC paper reads slightly blue-white when new and yellows with age.
    const y = yellowingAt(s, t);
    tone.paper = [tone.paper[0] + 1 - 2.5 * y, tone.paper[1] + 0.6 - 0.9 * y, tone.paper[2] - 5.5 + 11 * y];
    tone.mid = [tone.mid[0], tone.mid[1], tone.mid[2] + 2 * y];
  }
  return tone;
}

export type SpotPurpose = 'dmax' | 'mid_tone' | 'highlight' | 'paper_base';

export function labAt(s: Story, purpose: SpotPurpose, t: number): Lab3 {
  const tone = toneAt(s, t);
  switch (purpose) {
    case 'dmax': return tone.dmax;
    case 'mid_tone': return tone.mid;
    case 'highlight': return mix(tone.paper, tone.mid, 0.16);
    default: return tone.paper;
  }
}

/** CIELAB (D50) to 8-bit sRGB, through XYZ with the Bradford-adapted matrix. */
function labToRgb([L, a, b]: Lab3): [number, number, number] {
  const fy = (L + 16) / 116;
  const fx = fy + a / 500;
  const fz = fy - b / 200;
  const inv = (f: number) => (f ** 3 > 0.008856 ? f ** 3 : (116 * f - 16) / 903.3);
  const X = 0.96422 * inv(fx);
  const Y = L > 8 ? fy ** 3 : L / 903.3;
  const Z = 0.82521 * inv(fz);
  const lin = [
    3.1338561 * X - 1.6168667 * Y - 0.4906146 * Z,
    -0.9787684 * X + 1.9161415 * Y + 0.033454 * Z,
    0.0719453 * X - 0.2289914 * Y + 1.4052427 * Z,
  ];
  const gamma = (c: number) => (c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055);
  return lin.map((c) => Math.round(clamp(gamma(clamp(c, 0, 1)), 0, 1) * 255)) as [number, number, number];
}

// ── The picture in each print, and where it sits in a photograph ────────────

interface Scene {
  horizon: number;
  shore: number;
  skyTop: number;
  sun: { u: number; v: number; r: number } | null;
  clouds: { u: number; v: number; rx: number; ry: number }[];
  headland: { fromLeft: boolean; reach: number; height: number; bumps: number[] };
  /** A jetty seen from the side, out from one edge; `level` is its place between horizon (0) and shore (1). */
  pier: { fromLeft: boolean; reach: number; level: number; hut: boolean } | null;
  pebbles: { u: number; v: number; r: number; d: number }[];
}

function sceneOf(p: DemoPrint): Scene {
  const r = rngFor(p.accessionNumber, 'scene');
  const horizon = 0.36 + r.next() * 0.2;
  const shore = Math.min(0.9, horizon + 0.22 + r.next() * 0.14);
  return {
    horizon, shore, skyTop: 0.22 + r.next() * 0.2,
    sun: r.chance(0.6) ? { u: 0.2 + r.next() * 0.6, v: horizon * (0.35 + r.next() * 0.4), r: 0.025 + r.next() * 0.02 } : null,
    clouds: Array.from({ length: r.int(2, 5) }, () => ({ u: r.next(), v: horizon * (0.1 + r.next() * 0.6), rx: 0.08 + r.next() * 0.16, ry: 0.02 + r.next() * 0.04 })),
    headland: { fromLeft: r.chance(0.5), reach: 0.25 + r.next() * 0.3, height: 0.03 + r.next() * 0.06, bumps: Array.from({ length: 6 }, () => r.next()) },
    pier: r.chance(0.75) ? { fromLeft: r.chance(0.5), reach: 0.35 + r.next() * 0.3, level: 0.3 + r.next() * 0.25, hut: r.chance(0.5) } : null,
    pebbles: Array.from({ length: 90 }, () => ({ u: r.next(), v: shore + 0.03 + r.next() * (1 - shore) * 0.5, r: 0.002 + r.next() * 0.006, d: 0.6 + r.next() * 0.2 })),
  };
}

interface Rect { x: number; y: number; w: number; h: number }
interface Layout { width: number; height: number; sheet: Rect; image: Rect }

const LONG_EDGE = 1200;

/** The frame of a copy photograph: the sheet on a grey copy board, shifted a little at each sitting. */
function layoutOf(p: DemoPrint, shift: [number, number], mirrored = false): Layout {
  const sw = p.sheetWidthMm;
  const sh = p.sheetHeightMm;
  const padMm = 0.06 * Math.max(sw, sh);
  const scale = LONG_EDGE / (Math.max(sw, sh) + 2 * padMm);
  const width = Math.round((sw + 2 * padMm) * scale);
  const height = Math.round((sh + 2 * padMm) * scale);
  const sheet = { x: Math.round(padMm * scale + shift[0] * width), y: Math.round(padMm * scale + shift[1] * height), w: Math.round(sw * scale), h: Math.round(sh * scale) };
  const side = (sw - p.imageWidthMm) / 2;
  const top = Math.min(side, (sh - p.imageHeightMm) / 2);
  const iw = Math.max(16, Math.round(p.imageWidthMm * scale));
  const ih = Math.max(16, Math.round(p.imageHeightMm * scale));
  let ix = sheet.x + Math.round(side * scale);
  if (mirrored) ix = sheet.x + sheet.w - (ix - sheet.x) - iw;
  return { width, height, sheet, image: { x: ix, y: sheet.y + Math.round(top * scale), w: iw, h: ih } };
}

/** The small offset of the sheet on the copy board at one sitting. */
function shiftFor(p: DemoPrint, capturedOn: string): [number, number] {
  const r = rngFor(p.accessionNumber, `shift:${capturedOn}`);
  return [(r.next() - 0.5) * 0.02, (r.next() - 0.5) * 0.02];
}

/** A point of the picture (u, v in 0–1 of the image area) as 0–1 of the whole photograph. */
function toFrame(l: Layout, u: number, v: number): [number, number] {
  const x = (l.image.x + u * l.image.w) / l.width;
  const y = (l.image.y + v * l.image.h) / l.height;
  return [Math.round(clamp(x, 0, 1) * 10000) / 10000, Math.round(clamp(y, 0, 1) * 10000) / 10000];
}

/**
 * Where a measurement spot sits on a recto photograph of the print: the maximum density in the
 * dark foreground, the mid-tone in the sea, the paper base in the lower margin (or, on a print
 * without margins, a highlight in the sky near the horizon). Null when the purpose has no place.
 */
export function spotPointOf(p: DemoPrint, capturedOn: string, purpose: SpotPurpose): { x: number; y: number } | null {
  const l = layoutOf(p, shiftFor(p, capturedOn));
  const scene = sceneOf(p);
  // Open sea, clear of the jetty; the darkest foreground at the bottom, below the pebbles.
  const open = scene.pier ? (scene.pier.fromLeft ? (1 + scene.pier.reach) / 2 : (1 - scene.pier.reach) / 2) : 0.5;
  let at: [number, number];
  if (purpose === 'dmax') at = toFrame(l, 1 - open, Math.min(0.96, scene.shore + (1 - scene.shore) * 0.8));
  else if (purpose === 'mid_tone') at = toFrame(l, open, scene.horizon + (scene.shore - scene.horizon) * 0.85);
  else if (purpose === 'highlight') at = toFrame(l, scene.sun ? scene.sun.u : 0.5, scene.horizon - 0.04);
  else {
    const below = l.sheet.y + l.sheet.h - (l.image.y + l.image.h);
    if (below < 8) return null;
    at = [(l.sheet.x + l.sheet.w / 2) / l.width, (l.image.y + l.image.h + below / 2) / l.height];
  }
  return { x: Math.round(at[0] * 10000) / 10000, y: Math.round(at[1] * 10000) / 10000 };
}

/** Whether the print has a margin wide enough to measure the paper base in. */
export function hasMargin(p: DemoPrint): boolean {
  return (p.sheetHeightMm - p.imageHeightMm) / 2 >= 5 || p.sheetHeightMm - p.imageHeightMm >= 10;
}

// ── Rendering ───────────────────────────────────────────────────────────────

const grey = (d: number) => {
  const v = Math.round(255 * (1 - clamp(d, 0, 1)));
  return `rgb(${v},${v},${v})`;
};

/** The picture as densities (0 paper white … 1 maximum black), drawn as SVG. */
function sceneSvg(s: Scene, w: number, h: number): string {
  const hy = s.horizon * h;
  const sy = s.shore * h;
  const parts: string[] = [];
  const wave = Array.from({ length: 9 }, (_, i) => `${(i / 8) * w},${sy + Math.sin(i * 1.7 + s.horizon * 10) * 0.012 * h}`);
  parts.push(`<rect x="0" y="0" width="${w}" height="${hy + 1}" fill="url(#sky)"/>`);
  for (const c of s.clouds) {
    parts.push(`<ellipse cx="${c.u * w}" cy="${c.v * h}" rx="${c.rx * w}" ry="${c.ry * h}" fill="url(#cloud)"/>`);
  }
  if (s.sun) {
    parts.push(`<circle cx="${s.sun.u * w}" cy="${s.sun.v * h}" r="${s.sun.r * w * 3.5}" fill="url(#glow)"/>`);
    parts.push(`<circle cx="${s.sun.u * w}" cy="${s.sun.v * h}" r="${s.sun.r * w}" fill="${grey(0)}"/>`);
  }
  parts.push(`<rect x="0" y="${hy}" width="${w}" height="${sy - hy + 2}" fill="url(#sea)"/>`);
  const ripples = 34;
  for (let i = 1; i < ripples; i++) {
    const f = i / ripples;
    const y = hy + (sy - hy) * f ** 1.7;
    const from = ((i * 0.37) % 1) * w * 0.5;
    parts.push(`<line x1="${from.toFixed(1)}" y1="${y.toFixed(1)}" x2="${(from + w * (0.3 + ((i * 0.61) % 1) * 0.7)).toFixed(1)}" y2="${(y + (i % 3) - 1).toFixed(1)}" stroke="${grey(i % 2 ? 0.2 : 0.68)}" stroke-width="${(0.6 + 3 * f).toFixed(2)}" opacity="0.16"/>`);
  }
  if (s.sun) {
    parts.push(`<ellipse cx="${s.sun.u * w}" cy="${(hy + sy) / 2}" rx="${0.05 * w}" ry="${(sy - hy) / 2}" fill="url(#glitter)"/>`);
  }
  const hd = s.headland;
  const x0 = hd.fromLeft ? 0 : w;
  const dir = hd.fromLeft ? 1 : -1;
  const pts = [`${x0},${hy + 1}`];
  hd.bumps.forEach((b, i) => {
    const f = (i + 1) / (hd.bumps.length + 1);
    pts.push(`${x0 + dir * f * hd.reach * w},${hy - hd.height * h * (1 - f * 0.8) * (0.7 + 0.5 * b)}`);
  });
  pts.push(`${x0 + dir * hd.reach * w * 1.05},${hy + 1}`);
  parts.push(`<polygon points="${pts.join(' ')}" fill="${grey(0.55)}"/>`);
  parts.push(`<polygon points="0,${h} ${wave.join(' ')} ${w},${h}" fill="url(#shore)"/>`);
  for (const pb of s.pebbles) {
    parts.push(`<ellipse cx="${(pb.u * w).toFixed(1)}" cy="${(pb.v * h).toFixed(1)}" rx="${(pb.r * w * 1.4).toFixed(1)}" ry="${(pb.r * w).toFixed(1)}" fill="${grey(pb.d)}" opacity="0.6"/>`);
  }
  parts.push(`<polyline points="${wave.join(' ')}" fill="none" stroke="${grey(0.08)}" stroke-width="${(0.004 * h).toFixed(1)}" opacity="0.7"/>`);
  if (s.pier) {
    const deckY = hy + (sy - hy) * s.pier.level;
    const deckH = 0.012 * h;
    const x0 = s.pier.fromLeft ? -4 : w * (1 - s.pier.reach);
    const x1 = s.pier.fromLeft ? w * s.pier.reach : w + 4;
    const postLen = 0.07 * h;
    for (let x = x0 + 0.01 * w; x < x1; x += 0.032 * w) {
      parts.push(`<line x1="${x.toFixed(1)}" y1="${deckY}" x2="${x.toFixed(1)}" y2="${deckY + postLen}" stroke="${grey(0.95)}" stroke-width="${(0.005 * w).toFixed(1)}"/>`);
      parts.push(`<line x1="${x.toFixed(1)}" y1="${deckY + postLen}" x2="${x.toFixed(1)}" y2="${deckY + postLen * 1.45}" stroke="${grey(0.75)}" stroke-width="${(0.005 * w).toFixed(1)}" opacity="0.35"/>`);
    }
    parts.push(`<rect x="${x0}" y="${deckY - deckH}" width="${x1 - x0}" height="${deckH}" fill="${grey(0.93)}"/>`);
    parts.push(`<line x1="${x0}" y1="${deckY - deckH - 0.025 * h}" x2="${x1}" y2="${deckY - deckH - 0.025 * h}" stroke="${grey(0.9)}" stroke-width="${(0.0025 * w).toFixed(1)}"/>`);
    for (let x = x0 + 0.02 * w; x < x1; x += 0.05 * w) {
      parts.push(`<line x1="${x.toFixed(1)}" y1="${deckY - deckH}" x2="${x.toFixed(1)}" y2="${deckY - deckH - 0.025 * h}" stroke="${grey(0.9)}" stroke-width="${(0.002 * w).toFixed(1)}"/>`);
    }
    if (s.pier.hut) {
      const hx = s.pier.fromLeft ? x1 - 0.08 * w : x0 + 0.02 * w;
      const hw = 0.06 * w;
      const hh = 0.055 * h;
      parts.push(`<rect x="${hx}" y="${deckY - deckH - hh}" width="${hw}" height="${hh}" fill="${grey(0.88)}"/>`);
      parts.push(`<polygon points="${hx - 0.006 * w},${deckY - deckH - hh} ${hx + hw / 2},${deckY - deckH - hh * 1.5} ${hx + hw + 0.006 * w},${deckY - deckH - hh}" fill="${grey(0.94)}"/>`);
    }
  }
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}"><defs>` +
    `<linearGradient id="sky" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="${grey(s.skyTop)}"/><stop offset="1" stop-color="${grey(0.05)}"/></linearGradient>` +
    `<linearGradient id="sea" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="${grey(0.3)}"/><stop offset="1" stop-color="${grey(0.62)}"/></linearGradient>` +
    `<linearGradient id="shore" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="${grey(0.8)}"/><stop offset="1" stop-color="${grey(0.98)}"/></linearGradient>` +
    `<radialGradient id="cloud"><stop offset="0" stop-color="${grey(0.02)}" stop-opacity="0.6"/><stop offset="0.6" stop-color="${grey(0.02)}" stop-opacity="0.35"/><stop offset="1" stop-color="${grey(0.02)}" stop-opacity="0"/></radialGradient>` +
    `<radialGradient id="glow"><stop offset="0" stop-color="${grey(0)}" stop-opacity="0.7"/><stop offset="1" stop-color="${grey(0)}" stop-opacity="0"/></radialGradient>` +
    `<radialGradient id="glitter"><stop offset="0" stop-color="${grey(0.05)}" stop-opacity="0.6"/><stop offset="1" stop-color="${grey(0.05)}" stop-opacity="0"/></radialGradient>` +
    `</defs>${parts.join('')}</svg>`
  );
}

/** Damage drawn into a photograph: a crease across the lower right corner, or a tear in from the upper edge. */
interface Damage {
  kind: 'crease' | 'tear';
  /** The polyline, in 0–1 of the sheet. */
  line: [number, number][];
}

function damageLine(kind: Damage['kind'], r: Rng): [number, number][] {
  if (kind === 'crease') return [[0.66 + r.next() * 0.08, 1], [1, 0.76 + r.next() * 0.08]];
  const x = 0.25 + r.next() * 0.2;
  return [[x, 0], [x + 0.012, 0.025], [x - 0.004, 0.045], [x + 0.015, 0.07]];
}

function sheetPoint(l: Layout, [u, v]: [number, number]): [number, number] {
  return [l.sheet.x + u * l.sheet.w, l.sheet.y + v * l.sheet.h];
}

/** Signed distance from (x, y) to the nearest segment of a polyline, with the segment's side. */
function distanceToLine(pts: [number, number][], x: number, y: number): number {
  let best = Infinity;
  let sign = 1;
  for (let i = 0; i < pts.length - 1; i++) {
    const [ax, ay] = pts[i];
    const [bx, by] = pts[i + 1];
    const dx = bx - ax;
    const dy = by - ay;
    const len2 = dx * dx + dy * dy;
    const t = clamp(((x - ax) * dx + (y - ay) * dy) / len2, 0, 1);
    const px = ax + t * dx;
    const py = ay + t * dy;
    const d = Math.hypot(x - px, y - py);
    if (d < best) {
      best = d;
      sign = dx * (y - ay) - dy * (x - ax) >= 0 ? 1 : -1;
    }
  }
  return best * sign;
}

function bounds(pts: [number, number][], margin: number) {
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]);
  return { x0: Math.min(...xs) - margin, x1: Math.max(...xs) + margin, y0: Math.min(...ys) - margin, y1: Math.max(...ys) + margin };
}

function xorshift(seed: number) {
  let x = seed >>> 0 || 1;
  return () => {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    return x;
  };
}

const BOARD: [number, number, number] = [62, 63, 66];

interface RectoState {
  tone: Tone;
  fade: number;
  mirroring: number;
  edges: [number, number, number, number];
  damage: Damage | null;
}

/** A recto copy photograph: the toned picture on its paper, on the copy board, with grain and a little light fall-off. */
async function renderRecto(p: DemoPrint, l: Layout, state: RectoState, seed: number): Promise<Sharp> {
  const scene = sceneOf(p);
  const { image: im, sheet } = l;
  const raster = await sharp(Buffer.from(sceneSvg(scene, im.w, im.h))).extractChannel(0).raw().toBuffer();
  // Density → colour: paper to mid-tone to maximum density, in CIELAB.
  // Iron blue fades first in the highlights: as it fades, low densities fall faster than high ones.
  const lut = new Uint8Array(256 * 3);
  const curve = 1 + 0.7 * state.fade;
  for (let i = 0; i < 256; i++) {
    const d = (i / 255) ** curve;
    const lab = d <= 0.5 ? mix(state.tone.paper, state.tone.mid, d / 0.5) : mix(state.tone.mid, state.tone.dmax, (d - 0.5) / 0.5);
    lut.set(labToRgb(lab), i * 3);
  }
  const paper = labToRgb(state.tone.paper);
  const { width: W, height: H } = l;
  const out = Buffer.alloc(W * H * 3);
  const rand = xorshift(seed);
  const band = 0.09 * Math.min(im.w, im.h);
  const silver = [158, 166, 180];
  const dmg = state.damage ? state.damage.line.map((pt) => sheetPoint(l, pt)) : null;
  const box = dmg ? bounds(dmg, 5) : null;
  for (let y = 0; y < H; y++) {
    for (let x = 0; x < W; x++) {
      let r: number;
      let g: number;
      let b: number;
      const inSheet = x >= sheet.x && x < sheet.x + sheet.w && y >= sheet.y && y < sheet.y + sheet.h;
      const ix = x - im.x;
      const iy = y - im.y;
      if (inSheet && ix >= 0 && iy >= 0 && ix < im.w && iy < im.h) {
        const d = 255 - raster[iy * im.w + ix];
        r = lut[d * 3];
        g = lut[d * 3 + 1];
        b = lut[d * 3 + 2];
        if (state.mirroring > 0) {
          const e = state.edges;
          const near = Math.max(
            e[0] * Math.max(0, 1 - iy / band), e[1] * Math.max(0, 1 - (im.w - 1 - ix) / band),
            e[2] * Math.max(0, 1 - (im.h - 1 - iy) / band), e[3] * Math.max(0, 1 - ix / band),
          );
          if (near > 0) {
            const mottle = 0.7 + 0.3 * Math.sin(ix * 0.043 + iy * 0.017) * Math.sin(iy * 0.061 - ix * 0.011);
            const m = clamp(state.mirroring * near ** 1.3 * (d / 255) ** 0.7 * mottle * 0.9, 0, 0.85);
            r = lerp(r, silver[0], m);
            g = lerp(g, silver[1], m);
            b = lerp(b, silver[2], m);
          }
        }
      } else if (inSheet) {
        [r, g, b] = paper;
      } else {
        const v = 1 - 0.12 * (y / H);
        [r, g, b] = [BOARD[0] * v, BOARD[1] * v, BOARD[2] * v];
      }
      if (dmg && box && x >= box.x0 && x <= box.x1 && y >= box.y0 && y <= box.y1) {
        const s = distanceToLine(dmg, x, y);
        if (state.damage!.kind === 'crease') {
          if (Math.abs(s) < 1.3) [r, g, b] = [lerp(r, 236, 0.7), lerp(g, 234, 0.7), lerp(b, 228, 0.7)];
          else if (s > 0 && s < 3.5) [r, g, b] = [r * 0.78, g * 0.78, b * 0.78];
          else if (s < 0 && s > -3) [r, g, b] = [Math.min(255, r * 1.06), Math.min(255, g * 1.06), Math.min(255, b * 1.06)];
        } else if (Math.abs(s) < 1.6) {
          [r, g, b] = BOARD;
        } else if (s > 0 && s < 4) {
          [r, g, b] = [r * 0.85, g * 0.85, b * 0.85];
        }
      }
      const fall = 1 - 0.06 * (((x / W - 0.5) * 2) ** 2 + ((y / H - 0.5) * 2) ** 2) / 2;
      const n = ((rand() & 255) - 127.5) / 127.5;
      const grain = inSheet ? n * 2.4 : n * 1.2;
      const o = (y * W + x) * 3;
      out[o] = clamp(r * fall + grain, 0, 255);
      out[o + 1] = clamp(g * fall + grain, 0, 255);
      out[o + 2] = clamp(b * fall + grain, 0, 255);
    }
  }
  return sharp(out, { raw: { width: W, height: H, channels: 3 } });
}

/** Raking light from the left: the paper's cockle, the image's faint gloss, and any crease in relief. */
function renderRaking(p: DemoPrint, l: Layout, damage: Damage | null, seed: number): Sharp {
  const { width: W, height: H, sheet, image: im } = l;
  const r = rngFor(p.accessionNumber, 'cockle');
  const waves = Array.from({ length: 3 }, () => ({ kx: (1.5 + r.next() * 3) * Math.PI / sheet.w, ky: (1.5 + r.next() * 3) * Math.PI / sheet.h, px: r.next() * 6, py: r.next() * 6, a: 0.5 + r.next() }));
  const out = Buffer.alloc(W * H);
  const rand = xorshift(seed);
  const dmg = damage ? damage.line.map((pt) => sheetPoint(l, pt)) : null;
  const box = dmg ? bounds(dmg, 9) : null;
  for (let y = 0; y < H; y++) {
    for (let x = 0; x < W; x++) {
      const light = 1.2 - 0.45 * (x / W);
      let v: number;
      if (x >= sheet.x && x < sheet.x + sheet.w && y >= sheet.y && y < sheet.y + sheet.h) {
        const sx = x - sheet.x;
        const sy = y - sheet.y;
        let slope = 0;
        for (const w of waves) slope += w.a * w.kx * Math.cos(w.kx * sx + w.px) * Math.sin(w.ky * sy + w.py);
        v = 150 + 350 * slope;
        if (x >= im.x && x < im.x + im.w && y >= im.y && y < im.y + im.h) v -= 14;
        if (dmg && box && x >= box.x0 && x <= box.x1 && y >= box.y0 && y <= box.y1) {
          const s = distanceToLine(dmg, x, y);
          v += 70 * Math.exp(-((s + 1.5) ** 2) / 3) - 80 * Math.exp(-((s - 2) ** 2) / 5);
        }
        v = v * light + ((rand() & 255) - 127.5) / 127.5 * 5;
      } else {
        v = 24 * light + ((rand() & 255) - 127.5) / 127.5;
      }
      out[y * W + x] = clamp(v, 0, 255);
    }
  }
  return sharp(out, { raw: { width: W, height: H, channels: 1 } });
}

const xmlEscape = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** The verso: the back of the sheet, its pencil inscriptions, the Trust's stamp and the accession number. */
function renderVerso(p: DemoPrint, l: Layout, year: number): Sharp {
  const { width: W, height: H, sheet } = l;
  // The back of the sheet is untoned: the paper's own colour, a little dulled with age.
  const age = clamp((year - p.madeYear) / 60, 0, 1);
  const back = labToRgb(p.support === 'resin_coated' ? [93 - 2 * age, 0.2, 1 + 4 * age] : [91 - 2 * age, 0.6, (p.warmPaper ? 9 : 5) + 4 * age]);
  const fs = Math.round(sheet.w * 0.035);
  const pencil = 'rgb(118,118,122)';
  const quoted = [...(p.inscriptions ?? '').matchAll(/"([^"]+)"/g)].map((m) => m[1]);
  const lines = quoted.map((q, i) =>
    `<text x="${sheet.x + sheet.w * 0.12}" y="${sheet.y + sheet.h * 0.18 + i * fs * 1.8}" font-family="DejaVu Serif, serif" font-style="italic" font-size="${fs}" fill="${pencil}" transform="rotate(-1.5 ${sheet.x + sheet.w * 0.12} ${sheet.y + sheet.h * 0.18})">${xmlEscape(q)}</text>`,
  );
  const stampW = sheet.w * 0.42;
  const stampH = fs * 3.2;
  const sx = sheet.x + sheet.w * 0.5;
  const sy = sheet.y + sheet.h * 0.62;
  const [first, ...rest] = DEMO_INSTITUTION.toUpperCase().split(' ');
  const stamp =
    `<g opacity="0.72" transform="rotate(2 ${sx} ${sy})"><rect x="${sx - stampW / 2}" y="${sy - stampH / 2}" width="${stampW}" height="${stampH}" rx="${fs * 0.4}" fill="none" stroke="rgb(86,70,140)" stroke-width="${Math.max(2, fs * 0.12)}"/>` +
    `<text x="${sx}" y="${sy - fs * 0.2}" text-anchor="middle" font-family="DejaVu Sans, sans-serif" font-weight="bold" font-size="${fs * 0.8}" fill="rgb(86,70,140)">${xmlEscape(`${first} ${rest.slice(0, 1).join(' ')}`)}</text>` +
    `<text x="${sx}" y="${sy + fs * 0.95}" text-anchor="middle" font-family="DejaVu Sans, sans-serif" font-size="${fs * 0.7}" fill="rgb(86,70,140)">${xmlEscape(rest.slice(1).join(' '))}</text></g>`;
  const acc = `<text x="${sheet.x + sheet.w * 0.1}" y="${sheet.y + sheet.h * 0.92}" font-family="DejaVu Serif, serif" font-style="italic" font-size="${fs}" fill="${pencil}">${xmlEscape(p.accessionNumber)}</text>`;
  const svg =
    `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">` +
    `<rect width="${W}" height="${H}" fill="rgb(${BOARD.join(',')})"/>` +
    `<rect x="${sheet.x}" y="${sheet.y}" width="${sheet.w}" height="${sheet.h}" fill="rgb(${back.join(',')})"/>` +
    `${lines.join('')}${stamp}${acc}</svg>`;
  return sharp(Buffer.from(svg));
}

// ── Copy photographs at each sitting ────────────────────────────────────────


type ViewType = 'recto' | 'raking_light' | 'verso';

interface Capture {
  date: string;
  t: number;
  view: ViewType;
  note: string;
}

interface StoredCapture extends Capture {
  imageId: string;
  layout: Layout;
}

/** Encodes a rendered photograph as the camera would have written it, and stores it as an upload would be. */
async function storeRendered(store: ObjectStore, p: DemoPrint, c: Capture, picture: Sharp, actor: Actor): Promise<string> {
  const camera = copySetupFor(c.date);
  const r = rngFor(p.accessionNumber, `time:${c.date}:${c.view}`);
  const when = `${c.date.replace(/-/g, ':')} ${pad2(r.int(9, 16))}:${pad2(r.int(0, 59))}:${pad2(r.int(0, 59))}`;
  const withExif = await picture
    .withExif({
      IFD0: { Make: camera.make, Model: camera.model, DateTime: when, ...(camera.description ? { ImageDescription: camera.description } : {}) },
      IFD2: camera.lens
        ? { DateTimeOriginal: when, ExposureTime: camera.exposure!, FNumber: camera.f!, ISOSpeedRatings: camera.iso!, FocalLength: camera.focal!, LensModel: camera.lens }
        : { DateTimeOriginal: when },
    })
    .jpeg({ quality: 88 })
    .toBuffer();
  const tempDir = await mkdtemp(path.join(os.tmpdir(), 'toneledger-seed-'));
  try {
    const file = path.join(tempDir, 'image.jpg');
    await writeFile(file, withExif);
    const received: ReceivedFile = {
      tempDir, path: file, originalName: `${p.accessionNumber}_${c.view}_${c.date}.jpg`, sizeBytes: withExif.length,
      sha256: createHash('sha256').update(withExif).digest('hex'), contentType: 'image/jpeg', fields: {},
    };
    const fields = imageUploadFieldsSchema.parse({ viewType: c.view, capturedOn: c.date, notes: c.note });
    // No queue: the display copies are made before this returns, so they exist when the seed ends.
    const image = await storeImage({ store, queue: null }, p.id, received, fields, actor, 'seed');
    return image.id;
  } finally {
    await rm(tempDir, { recursive: true, force: true });
  }
}

// ── Examinations ────────────────────────────────────────────────────────────

type Context = ReportInput['context'];
type Severity = ObservationInput['severity'];
type Grade = NonNullable<ReportInput['grade']>;

interface Exam {
  date: string;
  t: number;
  context: Context;
  /** Months on display or away, for the report after. */
  months?: number;
}

interface Plan {
  story: Story;
  exams: Exam[];
  captures: Capture[];
  damage: (Damage & { date: string; t: number }) | null;
  /** Long-standing minor marks found at the first examination and carried through. */
  oldMarks: ObservationInput[];
}

const SURVEY_YEARS = [1988, 1996, 2006, 2016];

function activeFading(s: Story): boolean {
  return s.kind === 'blue_buffered';
}

function planExams(s: Story, r: Rng, today: string): Exam[] {
  const p = s.print;
  const exams: Exam[] = [];
  const start = Math.max(1988, p.accessionYear);
  const first = dayIn(r, start, [2, 11]);
  exams.push({ ...first, context: p.accessionYear >= 1988 ? 'incoming' : 'survey' });
  let year = start;
  for (;;) {
    // Iron blue is checked more often, and more often still once it is seen to fade.
    const fading = activeFading(s) && fadeAt(s, year) >= 0.05;
    year += fading ? r.int(3, 4) : s.toner === 'iron_blue' ? r.int(3, 6) : r.int(4, 8);
    if (year > 2025) break;
    const survey = SURVEY_YEARS.find((y) => Math.abs(y - year) <= 1 && y > exams[exams.length - 1].t + 1);
    if (survey !== undefined && r.chance(0.6)) {
      year = survey;
      exams.push({ ...dayIn(r, year, [3, 10]), context: 'survey' });
      continue;
    }
    // Nothing goes out or on the wall once it shows fading (iron blue in buffered board), heavy mirroring or damage.
    const lendable = fadeAt(s, year) < (s.kind === 'blue_buffered' ? 0.05 : 0.12) && mirroringAt(s, year) < 0.45;
    const what = r.weighted([['routine', 5], ['display', lendable ? 2 : 0], ['loan', lendable ? 2 : 0]] as const);
    const at = dayIn(r, year, [1, 8]);
    if (what === 'display') {
      const months = r.int(3, 4);
      exams.push({ ...at, context: 'before_display' });
      exams.push({ ...addMonths(at.date, months, r), context: 'after_display', months });
    } else if (what === 'loan') {
      const months = r.int(3, 6);
      exams.push({ ...at, context: 'outgoing_loan' });
      exams.push({ ...addMonths(at.date, months, r), context: 'returning_loan', months });
    } else {
      exams.push({ ...at, context: 'routine' });
    }
  }
  if (exams[exams.length - 1].t < 2023) {
    exams.push({ ...dayIn(r, 2026, [1, 10]), context: s.toner === 'iron_blue' ? 'survey' : 'routine' });
  }
  return exams.filter((e) => e.date <= today);
}

/** After damage on loan, the print stays in: later loans and displays become routine checks. */
function keepInAfter(exams: Exam[], t: number): Exam[] {
  return exams.flatMap((e) => {
    if (e.t <= t) return [e];
    if (e.context === 'returning_loan' || e.context === 'after_display') return [];
    if (e.context === 'outgoing_loan' || e.context === 'before_display') return [{ ...e, context: 'routine' as const, months: undefined }];
    return [e];
  });
}

/** Makes sure the print went out on loan once, with a check on return (for the damaged prints). */
function ensureLoan(exams: Exam[], r: Rng): Exam | null {
  const back = exams.find((e) => e.context === 'returning_loan');
  if (back) return back;
  // A routine check (not the first, not the last) becomes the check before the loan.
  const i = exams.findIndex((e, k) => k > 0 && k < exams.length - 1 && e.context === 'routine');
  if (i < 0) return null;
  const out = exams[i];
  out.context = 'outgoing_loan';
  const months = r.int(3, 5);
  const ret: Exam = { ...addMonths(out.date, months, r), context: 'returning_loan', months };
  exams.splice(i + 1, 0, ret);
  return ret;
}

function capturesOf(s: Story, plan: { exams: Exam[]; damage: Plan['damage'] }, r: Rng, today: string): Capture[] {
  const p = s.print;
  const from = Math.max(p.accessionYear, p.madeYear);
  const notes = [
    'Recto, two copy lights at 45°, grey card in the first frame.',
    'Recto under the standard copy set-up, for comparison with earlier photographs.',
    'Recto, copy set-up with polarising filters on the lights.',
  ];
  const caps: Capture[] = [];
  for (const era of [1995, 2010, 2024]) {
    if (era < from) continue;
    caps.push({ ...dayIn(r, era, era === from ? [9, 12] : [2, 11]), view: 'recto', note: r.pick(notes) });
  }
  if (!caps.length) caps.push({ ...dayIn(r, Math.min(2026, from + 1), [1, 6]), view: 'recto', note: notes[1] });
  if (plan.damage) {
    caps.push({ date: plan.damage.date, t: plan.damage.t, view: 'raking_light', note: `Raking light from the left at about 10°, to record the ${plan.damage.kind} found on return from loan.` });
    caps.push({ date: plan.damage.date, t: plan.damage.t, view: 'recto', note: `Recto on return from loan, to record the ${plan.damage.kind}.` });
  } else if (s.kind === 'mirroring' && r.chance(0.6)) {
    const c = caps[caps.length - 1];
    caps.push({ date: c.date, t: c.t, view: 'raking_light', note: 'Raking light from the left at about 10°; the mirrored edges catch the light.' });
  }
  if (p.inscriptions && /"/.test(p.inscriptions) && r.chance(0.25)) {
    caps.push({ date: caps[0].date, t: caps[0].t, view: 'verso', note: 'Verso, to record the inscriptions and the stamp.' });
  }
  return caps.filter((c) => c.date <= today).sort((a, b) => a.t - b.t);
}

function severityOfFade(f: number): Severity | null {
  if (f < 0.05) return null;
  if (f < 0.15) return 'slight';
  if (f < 0.28) return 'moderate';
  return 'severe';
}

function severityOfShift(f: number): Severity | null {
  if (f < 0.1) return null;
  if (f < 0.2) return 'slight';
  if (f < 0.32) return 'moderate';
  return 'severe';
}

function severityOfMirroring(m: number): Severity | null {
  if (m < 0.06) return null;
  if (m < 0.45) return 'slight';
  if (m < 0.85) return 'moderate';
  return 'severe';
}

const RANK: Record<Severity, number> = { slight: 1, moderate: 2, severe: 3 };

const EDGE_NAMES = ['upper', 'right-hand', 'lower', 'left-hand'] as const;

function strongestEdges(s: Story): string {
  const e = s.mirroringEdges.map((w, i) => ({ w, i })).sort((a, b) => b.w - a.w);
  const names = e.filter((x) => x.w >= 0.7).map((x) => EDGE_NAMES[x.i]);
  if (names.length >= 3) return 'the lower and side edges, most along the lower edge';
  return `the ${names.join(' and ')} edge${names.length > 1 ? 's' : ''}`;
}

function oldMarksOf(s: Story, r: Rng): ObservationInput[] {
  const marks: ObservationInput[] = [];
  if (fibre(s.print) && s.print.madeYear < 1980 && r.chance(0.25)) {
    marks.push({ termCode: 'foxing', side: 'recto', area: 'margin', extent: 'scattered', severity: 'slight', notes: 'A few small foxing spots in the lower margin, clear of the image.' });
  }
  if (r.chance(0.15)) {
    marks.push({ termCode: 'abrasion', side: 'recto', area: 'image', extent: 'localised', severity: 'slight', notes: 'Fine surface abrasion in the sky, seen only at a low angle.' });
  }
  if (r.chance(0.1)) {
    marks.push({ termCode: 'adhesive_residue', side: 'verso', area: 'corner', extent: 'localised', severity: 'slight', notes: 'Traces of old hinge adhesive at the upper corners of the verso.' });
  }
  return marks;
}

const CONTEXT_OPENING: Record<Context, (e: Exam, year: number) => string> = {
  routine: () => 'Routine inspection in the print store.',
  incoming: () => 'Examined on entry to the collection.',
  survey: (_e, y) => (y === 1988 ? "Examined in the Trust's first condition survey of the print store." : `Examined in the ${y} collection survey.`),
  before_display: () => 'Examined before installation in Gallery One.',
  after_display: (e) => `Examined on de-installation after ${e.months ?? 3} months on display at 50 lux.`,
  outgoing_loan: () => 'Examined before packing for an outgoing loan.',
  returning_loan: () => "Examined on return from loan, after 24 hours' acclimatisation in the crate.",
  after_treatment: () => 'Examined after treatment.',
};

interface ReportDraft {
  exam: Exam;
  input: ReportInput;
  sign: boolean;
  addendum: string | null;
}

function nextCheck(exam: Exam, grade: Grade, after: Exam | undefined): string {
  if (exam.context === 'before_display' || exam.context === 'outgoing_loan') return after?.date ?? exam.date;
  const years = grade === 'good' ? 6 : grade === 'fair' ? 3 : 2;
  return `${yearOf(exam.date) + years}${exam.date.slice(4)}`;
}

/** The nearest photograph of a view to a date, optionally only those taken on or after another date. */
function nearest(caps: StoredCapture[], view: ViewType, t: number, notBefore = -Infinity): StoredCapture | null {
  const fit = caps.filter((c) => c.view === view && c.t >= notBefore);
  if (!fit.length) return null;
  return fit.reduce((best, c) => (Math.abs(c.t - t) < Math.abs(best.t - t) ? c : best));
}

function rectRegion(c: StoredCapture, u0: number, v0: number, u1: number, v1: number) {
  return { imageId: c.imageId, shape: 'rect' as const, points: [toFrame(c.layout, u0, v0), toFrame(c.layout, u1, v1)] };
}

function writeReports(plan: Plan, caps: StoredCapture[]): ReportDraft[] {
  const s = plan.story;
  const p = s.print;
  const scene = sceneOf(p);
  const drafts: ReportDraft[] = [];
  let firstRehouse: number | null = null;
  let prevFade: Severity | null = null;
  let prevMirror: Severity | null = null;
  plan.exams.forEach((exam, i) => {
    const year = yearOf(exam.date);
    const prev = plan.exams[i - 1];
    const f = fadeAt(s, exam.t);
    const fade = s.toner === 'iron_blue' || s.toner === 'copper' || s.toner === 'sulfide' ? severityOfFade(f) : null;
    const shift = s.toner === 'iron_blue' ? severityOfShift(f) : null;
    const mirror = severityOfMirroring(mirroringAt(s, exam.t));
    const damaged = plan.damage && exam.t >= plan.damage.t - 1e-9 ? plan.damage : null;
    const yellow = s.kind === 'rc_untoned' && yellowingAt(s, exam.t) >= 0.1;
    const observations: ObservationInput[] = [];
    const said: string[] = [CONTEXT_OPENING[exam.context](exam, year)];

    if (fade) {
      const pic = nearest(caps, 'recto', exam.t);
      const changed = prevFade && RANK[fade] > RANK[prevFade];
      const text =
        fade === 'slight'
          ? 'The blue has weakened slightly in the highlights and the sky; the shadows hold their colour.'
          : fade === 'moderate'
            ? 'The image has faded: the mid-tones have lost much of their blue and read slate-grey, and the sky is close to paper white.'
            : 'The image is severely faded: the blue survives only in the deepest shadows, the mid-tones have gone to a pale green-grey and detail in the sea is lost.';
      observations.push({
        termCode: 'fading', side: 'recto', area: 'image', extent: fade === 'slight' ? 'scattered' : 'overall', severity: fade,
        notes: s.toner === 'iron_blue' ? text : 'Slight loss of density and warmth in the highlights.',
        region: pic ? rectRegion(pic, 0.03, 0.03, 0.97, Math.min(0.97, scene.shore)) : null,
      });
      if (s.toner === 'iron_blue') {
        said.push(text);
        if (!prevFade) said.push(`Fading is recorded here for the first time${pic ? `; compare the photograph of ${pic.date.slice(0, 4)}` : ''}.`);
        else if (changed) said.push(`Worse than at the ${yearOf(prev.date)} examination.`);
        else if (fade !== 'slight') said.push(`Lighter again than at the ${yearOf(prev.date)} examination, though the grade of the loss is the same.`);
      } else {
        said.push('A slight loss of density in the highlights, as expected for the toner; the tone itself is even.');
      }
      prevFade = fade;
    } else if (s.toner === 'iron_blue') {
      said.push('The blue is strong and even from the highlights to the shadows.');
    }
    if (shift) {
      observations.push({
        termCode: 'colour_shift', side: 'recto', area: 'image', extent: 'overall', severity: shift,
        notes: shift === 'slight' ? 'The blue is shifting slightly toward green in the mid-tones.' : 'The remaining blue has shifted toward green-grey; the highlights have a faint yellow cast.',
      });
      if (shift !== 'slight') said.push('What blue remains has shifted toward green-grey.');
    }
    if (mirror) {
      const edgePic = nearest(caps, 'recto', exam.t, s.mirroringOnset ?? -Infinity);
      const e = s.mirroringEdges;
      const strongest = e.indexOf(Math.max(...e));
      const band = 0.08;
      const region = edgePic
        ? strongest === 0 ? rectRegion(edgePic, 0, 0, 1, band)
          : strongest === 1 ? rectRegion(edgePic, 1 - band, 0, 1, 1)
            : strongest === 2 ? rectRegion(edgePic, 0, 1 - band, 1, 1)
              : rectRegion(edgePic, 0, 0, band, 1)
        : null;
      const where = strongestEdges(s);
      const text =
        mirror === 'slight'
          ? `Faint bluish silver mirroring in the dark areas along ${where}, seen only at a low angle.`
          : mirror === 'moderate'
            ? `Silver mirroring along ${where} has spread a few millimetres into the image and is visible in ordinary light.`
            : `Heavy silver mirroring along ${where}: a metallic sheen over the shadows up to a centimetre into the image.`;
      observations.push({ termCode: 'silver_mirroring', side: 'recto', area: 'edge', extent: 'scattered', severity: mirror, notes: text, region });
      said.push(text);
      if (!prevMirror) said.push('Not recorded at earlier examinations.');
      else if (RANK[mirror] > RANK[prevMirror]) said.push(`More extensive than at the ${yearOf(prev.date)} examination.`);
      prevMirror = mirror;
    }
    if (damaged) {
      const first = exam.t - damaged.t < 1e-6;
      const pic = nearest(caps, first ? 'raking_light' : 'recto', exam.t, damaged.t) ?? nearest(caps, 'recto', exam.t, damaged.t);
      const line = damaged.line.map((pt) => {
        if (!pic) return [0, 0] as [number, number];
        const [x, y] = sheetPoint(pic.layout, pt);
        return [x / pic.layout.width, y / pic.layout.height] as [number, number];
      });
      const region = pic
        ? {
          imageId: pic.imageId, shape: 'polygon' as const,
          points: (damaged.kind === 'crease'
            ? [[line[0][0] - 0.02, line[0][1]], [line[0][0] + 0.02, line[0][1]], [line[1][0], line[1][1] - 0.02], [line[1][0], line[1][1] + 0.02]]
            : [[line[0][0] - 0.02, line[0][1]], [line[0][0] + 0.03, line[0][1]], [line[line.length - 1][0] + 0.02, line[line.length - 1][1] + 0.01], [line[line.length - 1][0] - 0.02, line[line.length - 1][1] + 0.01]]
          ).map(([x, y]) => [Math.round(clamp(x, 0, 1) * 10000) / 10000, Math.round(clamp(y, 0, 1) * 10000) / 10000] as [number, number]),
        }
        : null;
      if (damaged.kind === 'crease') {
        const text = 'A diagonal crease about 30 mm long across the lower right corner, running into the image; the emulsion is cracked along it but not lifting.';
        observations.push({ termCode: 'crease', side: 'recto', area: 'corner', extent: 'localised', severity: 'moderate', notes: text, region });
        said.push(first ? `${text} It was not there at the outgoing check.` : 'The crease at the lower right corner is unchanged; the cracked emulsion has not lifted.');
      } else {
        const text = 'A tear about 12 mm long in from the upper edge of the sheet, just reaching the image; the edges meet and nothing is lost.';
        observations.push({ termCode: 'tear', side: 'recto', area: 'edge', extent: 'localised', severity: 'moderate', notes: text, region });
        said.push(first ? `${text} It was not there at the outgoing check.` : 'The tear at the upper edge is unchanged and has not opened.');
      }
    }
    if (yellow) {
      observations.push({ termCode: 'yellowing_highlights', side: 'recto', area: 'overall', extent: 'overall', severity: 'slight', notes: 'Slight yellowing of the highlights and of the paper base in the margins.' });
      said.push('The highlights and margins have yellowed slightly, as is usual for resin-coated paper of this period.');
    }
    for (const m of plan.oldMarks) observations.push(m);
    if (plan.oldMarks.length && i === 0) said.push('Minor old marks recorded below; none affects how the image reads.');

    // Overall grade from the worst observation, and whether anything is still changing.
    const worst = Math.max(0, ...observations.map((o) => RANK[o.severity]));
    let grade: Grade = worst >= 3 ? 'poor' : worst === 2 ? 'fair' : 'good';
    if (grade === 'good' && (fade && s.kind === 'blue_buffered')) grade = 'fair';
    if (observations.length === 0 || (observations.every((o) => plan.oldMarks.includes(o)) && s.toner !== 'iron_blue')) {
      said.push(
        s.kind === 'selenium_fibre'
          ? `Image and support stable; the purple-brown tone is even from edge to edge${prev ? ` and unchanged since ${yearOf(prev.date)}` : ''}.`
          : s.toner === 'sulfide'
            ? `Warm brown tone even; image and support stable${prev ? ` and unchanged since ${yearOf(prev.date)}` : ''}.`
            : `Image and support stable${prev ? `; no change since ${yearOf(prev.date)}` : ''}.`,
      );
    }

    // Advice.
    const advice: string[] = [];
    if (s.kind === 'blue_buffered' && fade) {
      if (firstRehouse === null) {
        firstRehouse = year;
        advice.push(`Rehouse in an unbuffered cotton folder: the alkaline reserve of the present ${(p.enclosureName ?? 'housing').toLowerCase()} is the likely cause of the fading.`);
      } else {
        advice.push(`The rehousing in an unbuffered enclosure recommended in ${firstRehouse} has still to be done; it remains the first priority for this print.`);
      }
      advice.push(fade === 'slight' ? 'Display for no more than 3 months at 50 lux, and not until rehoused.' : 'Do not display or lend.');
      if (fade === 'severe') advice.push('Photograph again under the standard copy set-up at each examination so that further loss can be followed.');
    } else if (s.kind === 'blue_unbuffered') {
      advice.push('Keep in the present unbuffered housing; iron-blue images are harmed by alkaline materials, so no buffered board in framing or storage.');
    }
    if (mirror) advice.push('Do not try to reduce the mirroring. Keep in the cool store in an enclosure that has passed the Photographic Activity Test, away from fresh paint, wood and cardboard; handle with gloves.');
    if (damaged) {
      advice.push(damaged.kind === 'crease'
        ? 'Do not try to flatten the crease. Keep the print supported on a rigid board in a sink mat; consider consolidating the cracked emulsion before any further loan.'
        : 'Keep the print flat and supported; if the tear begins to open, a repair with thin tissue on the verso only should be considered. Not to be lent until then.');
    }
    if (yellow) advice.push('No treatment advised for the yellowing; keep away from light when not in use.');
    if (exam.context === 'before_display' && grade === 'good') {
      advice.push(s.toner === 'iron_blue' ? 'Suitable for display at 50 lux for up to 3 months, in an unbuffered window mat.' : 'Suitable for display at 50 lux for up to 3 months, in a window mat so that nothing touches the surface.');
    }
    if (exam.context === 'outgoing_loan' && grade !== 'poor') advice.push('Fit to travel. Pack face up in a sink mat inside the crate; the courier checks it on arrival and before return.');
    if (!advice.length) advice.push('No action needed; keep in the present housing.');

    const after = plan.exams[i + 1];
    const input = reportInputSchema.parse({
      examinedOn: exam.date, context: exam.context, grade, summary: said.join(' '), recommendations: advice.join(' '),
      nextCheckOn: nextCheck(exam, grade, after), observations,
    });
    drafts.push({ exam, input, sign: true, addendum: null });
  });
  return drafts;
}

// ── Choosing the prints and writing it all ──────────────────────────────────

const TARGETS: [Kind, number][] = [
  ['blue_buffered', 10], ['blue_unbuffered', 5], ['selenium_fibre', 7], ['mirroring', 8], ['sulfide', 4], ['rc_untoned', 3], ['other', 3],
];

/** About 40 prints with something to show, earliest accessions first in each group. */
export function chooseConditionPrints(prints: DemoPrint[]): Story[] {
  const stories = prints.map(storyOf);
  const chosen: Story[] = [];
  for (const [kind, n] of TARGETS) {
    const of = stories.filter((s) => s.kind === kind && s.print.accessionYear <= 2019).sort((a, b) => a.print.accessionYear - b.print.accessionYear);
    chosen.push(...of.slice(0, n));
  }
  return chosen.sort((a, b) => a.print.accessionNumber.localeCompare(b.print.accessionNumber, 'en', { numeric: true }));
}

export interface DemoConditionResult {
  prints: number;
  images: number;
  reports: number;
  signed: number;
  addenda: number;
}

/**
 * Writes photographs, then condition reports (whose observations point at regions of those
 * photographs), for about 40 prints. The two most recent reports are left as drafts, as a
 * survey under way would leave them; every other report is signed.
 */
export async function seedDemoCondition(
  store: ObjectStore, actor: Actor, log: (m: string) => void, options: { concurrency?: number; signal?: AbortSignal } = {},
): Promise<DemoConditionResult> {
  const started = Date.now();
  const signal = options.signal;
  signal?.throwIfAborted();
  const today = seedToday();
  const stories = chooseConditionPrints(await loadDemoPrints());

  // Plan everything first (pure), so the choice of drafts and addenda is known before writing.
  const damaged = new Map<string, Damage['kind']>();
  const lendable = stories.filter((s) => s.kind === 'selenium_fibre' || s.kind === 'sulfide' || s.kind === 'other');
  if (lendable.length >= 2) damaged.set(lendable[1].print.id, 'crease');
  if (lendable.length >= 4) damaged.set(lendable[lendable.length - 2].print.id, 'tear');
  const plans: Plan[] = stories.map((story) => {
    const r = rngFor(story.print.accessionNumber, 'history');
    const exams = planExams(story, r, today);
    let damage: Plan['damage'] = null;
    const kind = damaged.get(story.print.id);
    const back = kind && exams.length >= 3 ? ensureLoan(exams, r) : null;
    if (kind && back) damage = { kind, line: damageLine(kind, r), date: back.date, t: back.t };
    const kept = damage ? keepInAfter(exams, damage.t) : exams;
    const captures = capturesOf(story, { exams: kept, damage }, r, today);
    return { story, exams: kept, captures, damage, oldMarks: oldMarksOf(story, r) };
  });

  const rendering = Date.now();
  let images = 0;
  let reports = 0;
  let signed = 0;
  let addenda = 0;
  const written = new Map<Plan, ReportDraft[]>();
  await inPool(plans, options.concurrency ?? 2, async (plan) => {
    const s = plan.story;
    const p = s.print;
    const stored: StoredCapture[] = [];
    // Photographs an interrupted seed stored already are used, not made again (they come in plan order).
    const earlier = await Image.findAll({ where: { printId: p.id, withdrawnAt: null }, order: [['uploadedAt', 'ASC'], ['id', 'ASC']], attributes: ['id', 'viewType', 'capturedOn'] });
    for (const [i, c] of plan.captures.entries()) {
      const kept = earlier[i];
      if (kept) {
        if (kept.viewType !== c.view || kept.capturedOn !== c.date) throw new Error(`The demo photographs of ${p.accessionNumber} are not the ones the seed plans; seed an empty database.`);
        stored.push({ ...c, imageId: kept.id, layout: layoutOf(p, shiftFor(p, c.date), c.view === 'verso') });
        continue;
      }
      signal?.throwIfAborted();
      const layout = layoutOf(p, shiftFor(p, c.date), c.view === 'verso');
      const damage = plan.damage && c.t >= plan.damage.t - 1e-9 ? plan.damage : null;
      const seed = rngFor(p.accessionNumber, `grain:${c.date}:${c.view}`).int(1, 2 ** 31);
      const picture =
        c.view === 'recto'
          ? await renderRecto(p, layout, { tone: toneAt(s, c.t), fade: fadeAt(s, c.t), mirroring: mirroringAt(s, c.t), edges: s.mirroringEdges, damage }, seed)
          : c.view === 'raking_light'
            ? renderRaking(p, layout, damage, seed)
            : renderVerso(p, layout, c.t);
      stored.push({ ...c, imageId: await storeRendered(store, p, c, picture, actor), layout });
      images += 1;
    }
    written.set(plan, writeReports(plan, stored));
  }, signal);
  const photographed = Date.now();

  // Drafts: the two most recent examinations. Addenda: on the damaged prints' return reports,
  // on the first report that found severe fading, and on one report of mirroring.
  const all = plans.flatMap((plan) => (written.get(plan) ?? []).map((d) => ({ plan, d })));
  const latest = [...all].sort((x, y) => y.d.exam.t - x.d.exam.t).slice(0, 2);
  for (const { d } of latest) d.sign = false;
  for (const plan of plans) {
    const drafts = written.get(plan) ?? [];
    if (plan.damage) {
      const back = drafts.find((d) => d.exam.date === plan.damage!.date);
      if (back) {
        back.addendum = plan.damage.kind === 'crease'
          ? "The borrower's condition report on arrival, received after this report was signed, already notes the crease: the damage happened in transit or at unpacking on the outward journey. The registrar has informed the insurer."
          : "The borrower's condition check at de-installation, received after signing, records the tear: it happened when the print was taken out of its frame at the venue. The registrar has informed the insurer.";
      }
    }
  }
  const severe = all.find(({ d }) => d.input.observations.some((o) => o.termCode === 'fading' && o.severity === 'severe') && d.sign);
  if (severe) {
    severe.d.addendum = 'Spectrophotometer readings taken on the same day at the mid-tone and maximum-density spots confirm the loss of blue; see the print\'s measurements.';
  }
  const mirrored = all.find(({ d, plan }) => d.sign && plan.captures.some((c) => c.view === 'raking_light') && d.input.observations.some((o) => o.termCode === 'silver_mirroring' && o.severity !== 'slight'));
  if (mirrored) {
    mirrored.d.addendum = 'The raking-light photograph shows the mirroring more clearly than the recto; use it for comparison at the next examination.';
  }
  const reexamined = all.find(({ d, plan }) => d.sign && plan.story.kind === 'selenium_fibre' && d.exam.context === 'after_display');
  if (reexamined) {
    reexamined.d.addendum = 'Light-meter log for the display checked after signing: the print received about 50 lux for 8 hours a day, within the limit set for it.';
  }

  // The reports are database work only: more at once than the (CPU-bound) photographs.
  await inPool(plans, (options.concurrency ?? 2) * 2, async (plan) => {
    // Reports an interrupted seed wrote are completed (signed, their addendum added), not written again.
    const earlier = await ConditionReport.findAll({ where: { printId: plan.story.print.id }, order: [['createdAt', 'ASC'], ['id', 'ASC']], attributes: ['id', 'examinedOn', 'status', 'version'] });
    for (const [i, d] of (written.get(plan) ?? []).entries()) {
      signal?.throwIfAborted();
      let report: { id: string; version: number; status: string } | undefined = earlier[i];
      if (report && earlier[i].examinedOn !== d.input.examinedOn) throw new Error(`The demo reports of ${plan.story.print.accessionNumber} are not the ones the seed plans; seed an empty database.`);
      if (!report) {
        report = await createReport(plan.story.print.id, d.input, actor, 'seed');
        reports += 1;
      }
      if (!d.sign) continue;
      if (report.status !== 'signed') {
        signal?.throwIfAborted();
        const r = rngFor(plan.story.print.accessionNumber, `signed:${d.input.examinedOn}`);
        await signReport(report.id, report.version, actor, 'seed', signedAtFor(d.input.examinedOn, (min, max) => r.int(min, max)));
        signed += 1;
      }
      if (d.addendum && (await Addendum.count({ where: { reportId: report.id } })) === 0) {
        signal?.throwIfAborted();
        await addAddendum(report.id, d.addendum, actor, 'seed');
        addenda += 1;
      }
    }
  }, signal);
  const secs = (a: number, b: number) => ((b - a) / 1000).toFixed(1);
  log(
    `Demo condition: ${plans.length} prints, ${images} photographs (${secs(rendering, photographed)} s), ` +
    `${reports} reports (${signed} signed, ${addenda} addenda; ${secs(photographed, Date.now())} s), ${secs(started, Date.now())} s in all.`,
  );
  return { prints: plans.length, images, reports, signed, addenda };
}
