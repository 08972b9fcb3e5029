import { baselineChoiceSchema, sessionInputSchema, spotInputSchema, type SessionInput } from '@toneledger/common/schemas/measurements';
import { Image, MeasurementSession, MeasurementSpot } from '../models';
import { chooseBaseline, createSpot, recordSession, type Actor } from '../services/measurement.service';
import {
  chooseConditionPrints, hasMargin, labAt, loadDemoPrints, rngFor, seedToday, spotPointOf, storyOf, type Lab3, type SpotPurpose, type Story,
} from './demo-condition';
import { inPool } from './pool';

/**
 * Colour and density measurements of about 190 demo prints (most of the gelatin silver prints),
 * from the early 1990s to now: two or three registered spots per print, a session every two to six
 * years, two or three readings per spot. Some prints were first measured only recently, so their
 * histories are short (censored in a survival analysis). The readings follow the same ageing model
 * as the condition reports and photographs (demo-condition.ts), with noise on top: a session's own
 * offset (placement, instrument warm-up) of about 0.2–0.3 ΔE00 and reading noise within it. Iron
 * blue fades fastest at first and slows (faster still after a borax after-bath), sulfide and
 * untoned silver slowly and steadily, selenium slowest; an iron-blue print that went on display
 * is measured on its return and a year later, when most of the loss has come back in the dark.
 *
 * Two deliberate cases: one print has a session in the middle measured under D65/10° (stored,
 * and shown as not comparable), and one has its baseline moved by the conservator to a later
 * session, with the reason. Everything goes through the measurement service.
 */

interface InstrumentEra {
  until: number;
  instrument: string;
  serial: string;
  condition: SessionInput['condition'];
  aperture: string;
  /** A small, steady difference between instruments. */
  offset: Lab3;
}

/** The Trust's (invented) instruments, by period. */
const INSTRUMENTS: InstrumentEra[] = [
  { until: 2003, instrument: 'Harlow Instruments SP-4 spectrophotometer', serial: 'SP4-01187', condition: null, aperture: '4 mm', offset: [0.06, -0.02, 0.04] },
  { until: 2015, instrument: 'Harlow Instruments SP-6 spectrophotometer', serial: 'SP6-22910', condition: 'M0', aperture: '4 mm', offset: [0, 0, 0] },
  { until: 9999, instrument: 'Brightwater Optics Lumen 45 spectrodensitometer', serial: 'BL45-03071', condition: 'M0', aperture: '3.5 mm', offset: [-0.04, 0.02, -0.03] },
];

const SPOT_NAMES: Record<SpotPurpose, string> = {
  dmax: 'Dmax, dark foreground',
  mid_tone: 'Mid-tone, sea',
  highlight: 'Highlight, sky at the horizon',
  paper_base: 'Paper base, lower margin',
};

const round = (v: number, places = 2) => Math.round(v * 10 ** places) / 10 ** places;
const pad2 = (n: number) => String(n).padStart(2, '0');

/** Roughly normal noise from a uniform generator (sum of three). */
function noise(next: () => number, sd: number): number {
  return ((next() + next() + next() - 1.5) / 0.5) * sd;
}

/** Visual density of a neutral-ish patch from its L* (D = −log10 Y). */
function densityFromL(L: number): number {
  const Y = L > 8 ? ((L + 16) / 116) ** 3 : L / 903.3;
  return -Math.log10(Y);
}

interface PlannedSession {
  date: string;
  t: number;
  input: Omit<SessionInput, 'readings'>;
  /** Extra offset of this session's readings (a different illuminant, or a sleeve in the way). */
  offset: Lab3;
}

/**
 * The share of each group that is measured: nearly every print of the groups a study compares
 * (iron blue with and without a borax after-bath, resin-coated paper, sulfide, untoned), fewer
 * of the many selenium prints; some iron-blue prints stay unmeasured (the demo's touring loans take them).
 */
function measuredShare(s: Story): number {
  if (s.toner === 'iron_blue') return s.print.alkalineAfterBath ? 0.95 : 0.85;
  if (s.print.support === 'resin_coated') return 0.85;
  if (s.toner === 'sulfide') return 0.8;
  if (s.toner === 'untoned') return 0.6;
  if (s.toner === 'selenium') return 0.45;
  return 0.4;
}

/** The prints with condition histories, then a share of each group (a draw per print), accessioned in time for two sessions. */
function chooseMeasuredPrints(all: Story[], withHistories: Story[]): Story[] {
  const chosen = new Set(withHistories.map((s) => s.print.id));
  const rest = all.filter((s) => !chosen.has(s.print.id) && s.print.accessionYear <= 2024 && rngFor(s.print.accessionNumber, 'measured').chance(measuredShare(s)));
  return [...withHistories, ...rest];
}

const dateOf = (t: number) => {
  const year = Math.floor(t);
  const month = Math.min(12, 1 + Math.floor((t - year) * 12));
  const day = Math.min(28, 1 + Math.floor(((t - year) * 12 - (month - 1)) * 28));
  return `${year}-${pad2(month)}-${pad2(day)}`;
};

function planSessions(s: Story, today: string, withHistory: boolean): PlannedSession[] {
  const r = rngFor(s.print.accessionNumber, 'sessions');
  const sessions: PlannedSession[] = [];
  let year = Math.max(1992, s.print.accessionYear) + r.int(0, 1);
  // About one print in six was first measured only in the last decade (a short, censored history).
  const late = rngFor(s.print.accessionNumber, 'late');
  const lateStart = !withHistory && late.chance(0.17);
  if (lateStart) year = Math.max(year, 2014 + late.int(0, 9));
  // An iron-blue print back from display is measured on its return and again after a year in the dark.
  const extra = s.display && s.display.at > year
    ? [{ t: s.display.at + 0.08, note: 'Measured on return from display, before it went back into store.' }, { t: s.display.at + 1.1, note: 'Measured again after a year in the dark, to see how much of the blue had come back.' }]
    : [];
  while (year <= 2026) {
    const month = year === 2026 ? r.int(1, 10) : r.int(1, 12);
    const day = r.int(1, 28);
    const date = `${year}-${pad2(month)}-${pad2(day)}`;
    if (date > today) break;
    const era = INSTRUMENTS.find((i) => year <= i.until)!;
    const firstWithThis = !sessions.some((x) => x.input.instrument === era.instrument);
    sessions.push({
      date, t: year + (month - 1) / 12 + (day - 1) / 365,
      input: {
        measuredOn: date, instrument: era.instrument, serial: era.serial, illuminant: 'D50', observer: '2', geometry: '45/0',
        condition: era.condition, aperture: era.aperture, backing: 'White backing tile',
        notes: sessions.length === 0
          ? 'Spots marked on the mount diagram and on the recto photograph; three readings each, instrument repositioned between readings.'
          : firstWithThis && era.condition === 'M0' && era.until > 2015
            ? 'First session with this instrument; set to M0 to match the earlier records.'
            : null,
      },
      offset: era.offset,
    });
    // Recent acquisitions are measured more often at first (a baseline and then every year or three).
    year += s.print.accessionYear >= 2008 && !lateStart ? r.int(1, 3) : r.int(2, 6);
  }
  for (const e of extra) {
    const date = dateOf(e.t);
    if (date > today || sessions.some((x) => x.date.slice(0, 7) === date.slice(0, 7))) continue;
    const era = INSTRUMENTS.find((i) => Math.floor(e.t) <= i.until)!;
    sessions.push({
      date, t: e.t,
      input: {
        measuredOn: date, instrument: era.instrument, serial: era.serial, illuminant: 'D50', observer: '2', geometry: '45/0',
        condition: era.condition, aperture: era.aperture, backing: 'White backing tile', notes: e.note,
      },
      offset: era.offset,
    });
  }
  return sessions.sort((a, b) => a.t - b.t);
}

export interface DemoMeasurementResult {
  prints: number;
  spots: number;
  sessions: number;
  readings: number;
}

/** Records spots and sessions for about 190 prints; spots are placed on the latest recto photograph when there is one. */
export async function seedDemoMeasurements(
  actor: Actor, log: (m: string) => void, options: { concurrency?: number; signal?: AbortSignal } = {},
): Promise<DemoMeasurementResult> {
  const started = Date.now();
  const signal = options.signal;
  signal?.throwIfAborted();
  const today = seedToday();
  const prints = await loadDemoPrints();
  const all = prints.map(storyOf);
  const withHistories = chooseConditionPrints(prints);
  const histories = new Set(withHistories.map((s) => s.print.id));
  const measured = chooseMeasuredPrints(all, withHistories);
  const planned = measured.map((s) => ({ story: s, sessions: planSessions(s, today, histories.has(s.print.id)) })).filter((x) => x.sessions.length >= 2);

  // One print measured once under D65/10° in the middle of its history; one whose baseline is moved.
  const d65 = planned.find((x) => x.story.kind === 'blue_buffered' && x.sessions.length >= 5);
  if (d65) {
    const mid = d65.sessions[Math.floor(d65.sessions.length / 2)];
    mid.input = {
      ...mid.input, instrument: 'Verrow Labs CM-10 spectrophotometer', serial: 'CM10-5520', illuminant: 'D65', observer: '10', condition: null, aperture: '4 mm',
      notes: "Measured by a visiting research project with its own instrument, set to D65/10°. Kept as received; not converted to the Trust's D50/2°.",
    };
    mid.offset = [0.35, -1.1, -1.9];
  }
  const moved = planned.find((x) => x !== d65 && (x.story.kind === 'blue_unbuffered' || x.story.kind === 'selenium_fibre') && x.sessions.length >= 5);
  if (moved) {
    const first = moved.sessions[0];
    first.input = { ...first.input, backing: 'Through the polyester sleeve, on the studio bench' };
    first.offset = [-1.3, 0.2, 0.9];
  }

  let spots = 0;
  let sessions = 0;
  let readings = 0;
  await inPool(planned, options.concurrency ?? 3, async ({ story: s, sessions: plan }) => {
    const p = s.print;
    const r = rngFor(p.accessionNumber, 'readings');
    const photo = await Image.findOne({ where: { printId: p.id, viewType: 'recto', withdrawnAt: null }, order: [['capturedOn', 'DESC']], attributes: ['id', 'capturedOn'] });
    const purposes: SpotPurpose[] = ['dmax', 'mid_tone'];
    if (s.kind === 'rc_untoned' || r.chance(0.7)) purposes.push(hasMargin(p) ? 'paper_base' : 'highlight');
    const made: { id: string; purpose: SpotPurpose; version: number; baselineSessionId: string | null }[] = [];
    // Spots and sessions an interrupted seed recorded are kept and not recorded again (sessions come in plan order).
    const earlierSpots = await MeasurementSpot.findAll({ where: { printId: p.id }, attributes: ['id', 'name', 'version', 'baselineSessionId'] });
    const earlierSessions = await MeasurementSession.findAll({ where: { printId: p.id }, order: [['createdAt', 'ASC'], ['id', 'ASC']], attributes: ['id', 'measuredOn'] });
    for (const purpose of purposes) {
      const kept = earlierSpots.find((x) => x.name === SPOT_NAMES[purpose]);
      if (kept) {
        made.push({ id: kept.id, purpose, version: kept.version, baselineSessionId: kept.baselineSessionId });
        continue;
      }
      signal?.throwIfAborted();
      const at = photo?.capturedOn ? spotPointOf(p, photo.capturedOn, purpose) : null;
      const spot = await createSpot(
        p.id,
        spotInputSchema.parse({
          name: SPOT_NAMES[purpose], purpose, point: at && photo ? { imageId: photo.id, ...at } : null,
          notes: purpose === 'paper_base' ? 'Clear of any pencil inscription; the same place each time.' : null,
        }),
        actor,
        'seed',
      );
      made.push({ id: spot.id, purpose, version: spot.version, baselineSessionId: null });
      spots += 1;
    }
    const recorded: string[] = [];
    for (const session of plan) {
      // The session's own offset (placement on the spot, instrument warm-up): about 0.2–0.3 ΔE00.
      const drift: Lab3 = [noise(r.next, 0.3), noise(r.next, 0.2), noise(r.next, 0.25)];
      const spotReadings = made.map((spot) => {
        const truth = labAt(s, spot.purpose, session.t);
        const centre: Lab3 = [0, 1, 2].map((k) => truth[k] + session.offset[k] + drift[k]) as Lab3;
        const n = r.int(2, 3);
        const labs = Array.from({ length: n }, () => ({
          L: round(Math.min(100, Math.max(0, centre[0] + noise(r.next, 0.12)))),
          a: round(centre[1] + noise(r.next, 0.1)),
          b: round(centre[2] + noise(r.next, 0.1)),
        }));
        readings += n;
        return {
          spotId: spot.id, readings: labs,
          ...(spot.purpose === 'dmax' ? { density: round(densityFromL(centre[0]) + noise(r.next, 0.008)), densityType: 'visual' as const } : {}),
        };
      });
      const input = sessionInputSchema.parse({ ...session.input, readings: spotReadings });
      const kept = earlierSessions[recorded.length];
      if (kept) {
        if (kept.measuredOn !== input.measuredOn) throw new Error(`The demo measurements of ${p.accessionNumber} are not the ones the seed plans; seed an empty database.`);
        recorded.push(kept.id);
        continue;
      }
      signal?.throwIfAborted();
      recorded.push((await recordSession(p.id, input, actor, 'seed')).id);
      sessions += 1;
    }
    if (moved && moved.story === s) {
      for (const spot of made) {
        if (spot.baselineSessionId === recorded[1]) continue;
        signal?.throwIfAborted();
        await chooseBaseline(
          spot.id,
          baselineChoiceSchema.parse({
            sessionId: recorded[1], version: spot.version,
            reason: `The ${plan[0].date.slice(0, 4)} readings were taken through the polyester sleeve; from ${plan[1].date.slice(0, 4)} on the print is measured out of the sleeve on the white tile, so that session is the baseline.`,
          }),
          actor,
          'seed',
        );
      }
    }
  }, signal);
  log(`Demo measurements: ${planned.length} prints, ${spots} spots, ${sessions} sessions, ${readings} readings in ${((Date.now() - started) / 1000).toFixed(1)} s.`);
  return { prints: planned.length, spots, sessions, readings };
}
