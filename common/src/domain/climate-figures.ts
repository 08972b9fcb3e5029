import type { ClimateSettings, ClimateSummary, Excursion } from '../schemas/climate';
import type { Reading } from './climate-readings';
import { timeWeightedPermanence } from './isoperm';

/**
 * The figures of a location's readings over a period.
 *
 * Each reading stands for the time from it to the next reading (the logger's value holds until the
 * next one is taken), cut at the end of the period. When the next reading is more than `gapMinutes`
 * away, that stretch is a gap: listed, and counted neither inside nor outside the targets (the
 * reading before it then stands for no time). The shares outside the targets and the permanence are
 * weighted by these spans; min, max and mean are over the readings themselves.
 */

export const MINUTE = 60_000;

export interface FiguresInput {
  /** Readings in the period, in time order. */
  readings: readonly Reading[];
  /** The first reading after the period, if any: it ends the span of the period's last reading. */
  next?: Reading | null;
  /** End of the period (exclusive), ms. */
  end: number;
  settings: ClimateSettings;
}

export type Figures = Pick<ClimateSummary,
  'readings' | 'coveredMinutes' | 'gaps' | 'temperature' | 'rh' | 'outsideTemperature' | 'outsideRh' | 'outsideEither' | 'excursions' | 'permanence'>;

const iso = (ms: number) => new Date(ms).toISOString();

interface Span { r: Reading; minutes: number; end: number }

/** Each reading's span (minutes it stands for) and the gaps. */
export function spansOf(readings: readonly Reading[], next: Reading | null | undefined, end: number, gapMinutes: number) {
  const spans: Span[] = [];
  const gaps: ClimateSummary['gaps'] = [];
  readings.forEach((r, i) => {
    const after = readings[i + 1] ?? next ?? null;
    if (!after) return spans.push({ r, minutes: 0, end: r.at });
    const until = Math.min(after.at, end);
    const full = (after.at - r.at) / MINUTE;
    if (full > gapMinutes) {
      if (until > r.at) gaps.push({ start: iso(r.at), end: iso(until), minutes: (until - r.at) / MINUTE });
      return spans.push({ r, minutes: 0, end: r.at });
    }
    spans.push({ r, minutes: Math.max(0, (until - r.at) / MINUTE), end: Math.max(until, r.at) });
  });
  return { spans, gaps };
}

type Side = { quantity: Excursion['quantity']; direction: Excursion['direction'] };
const SIDES: Side[] = [
  { quantity: 'temperature', direction: 'above' }, { quantity: 'temperature', direction: 'below' },
  { quantity: 'rh', direction: 'above' }, { quantity: 'rh', direction: 'below' },
];

function outside(r: Reading, s: Side, target: ClimateSettings['target']): boolean {
  const v = s.quantity === 'temperature' ? r.temperatureC : r.rhPercent;
  const [lo, hi] = s.quantity === 'temperature' ? [target.temperatureMinC, target.temperatureMaxC] : [target.rhMinPercent, target.rhMaxPercent];
  return s.direction === 'above' ? v > hi : v < lo;
}

/**
 * Excursions: runs of consecutive readings out of a range on one side. It starts at the first reading
 * outside and ends where the last one's span ends (the next reading, back inside); a gap ends it.
 * Its peak is the furthest value; it is brief when shorter than `briefExcursionMinutes`.
 */
export function excursionsOf(spans: readonly Span[], settings: ClimateSettings): Excursion[] {
  const found: Excursion[] = [];
  for (const side of SIDES) {
    let open: Excursion | null = null;
    const close = () => {
      if (open) found.push({ ...open, brief: open.minutes < settings.briefExcursionMinutes });
      open = null;
    };
    for (const sp of spans) {
      if (!outside(sp.r, side, settings.target)) { close(); continue; }
      const v = side.quantity === 'temperature' ? sp.r.temperatureC : sp.r.rhPercent;
      if (!open) open = { ...side, start: iso(sp.r.at), end: iso(sp.end), minutes: 0, peak: v, brief: false };
      const o: Excursion = open;
      o.minutes += sp.minutes;
      o.end = iso(sp.end);
      o.peak = side.direction === 'above' ? Math.max(o.peak, v) : Math.min(o.peak, v);
      if (sp.minutes === 0 && sp.end === sp.r.at) close(); // a gap or the last reading ends it
    }
    close();
  }
  return found.sort((a, b) => a.start.localeCompare(b.start) || a.quantity.localeCompare(b.quantity));
}

function stats(values: readonly number[]) {
  if (!values.length) return { min: null, max: null, mean: null };
  let min = Infinity; let max = -Infinity; let sum = 0;
  for (const v of values) { if (v < min) min = v; if (v > max) max = v; sum += v; }
  return { min, max, mean: sum / values.length };
}

export function climateFigures({ readings, next, end, settings }: FiguresInput): Figures {
  const { spans, gaps } = spansOf(readings, next, end, settings.gapMinutes);
  let covered = 0; let outT = 0; let outRh = 0; let outEither = 0;
  const t = settings.target;
  for (const sp of spans) {
    covered += sp.minutes;
    const badT = sp.r.temperatureC < t.temperatureMinC || sp.r.temperatureC > t.temperatureMaxC;
    const badRh = sp.r.rhPercent < t.rhMinPercent || sp.r.rhPercent > t.rhMaxPercent;
    if (badT) outT += sp.minutes;
    if (badRh) outRh += sp.minutes;
    if (badT || badRh) outEither += sp.minutes;
  }
  const share = (x: number) => (covered > 0 ? x / covered : null);
  return {
    readings: readings.length,
    coveredMinutes: covered,
    gaps,
    temperature: stats(readings.map((r) => r.temperatureC)),
    rh: stats(readings.map((r) => r.rhPercent)),
    outsideTemperature: share(outT),
    outsideRh: share(outRh),
    outsideEither: share(outEither),
    excursions: excursionsOf(spans, settings),
    permanence: timeWeightedPermanence(spans.map((s) => ({ minutes: s.minutes, temperatureC: s.r.temperatureC, rhPercent: s.r.rhPercent })), settings),
  };
}

/** The period of a query: the last 365 days to today (UTC calendar days) when left out; `end` is the day after `to`, exclusive. */
export function climatePeriod(q: { from?: string; to?: string }, today: string): { from: string; to: string; start: number; end: number } {
  const day = 86_400_000;
  const to = q.to ?? today;
  const from = q.from ?? new Date(Date.parse(`${to}T00:00:00Z`) - 364 * day).toISOString().slice(0, 10);
  return { from, to, start: Date.parse(`${from}T00:00:00Z`), end: Date.parse(`${to}T00:00:00Z`) + day };
}
