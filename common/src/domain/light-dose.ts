/**
 * Light dose of a print: exposure in lux-hours (lx·h) summed over its display periods
 * (exhibitions and loans, past and planned).
 *
 * Exposure is illuminance × hours: a period contributes `lux × hoursPerDay` on every day it is
 * open. Dose is taken as reciprocal (50 lx for 10 h equals 250 lx for 2 h), as conservation
 * practice does (REFERENCES.md §4, published national conservation institute guidance).
 *
 * Dates are calendar days written 'YYYY-MM-DD', free of time zones: they are counted as whole
 * UTC days, and a period runs from its first day to its last day, both included.
 */

/** One display period of one print. */
export interface DisplayPeriodInput {
  id?: string;
  /** First day shown, 'YYYY-MM-DD' (included). */
  start: string;
  /** Last day shown, 'YYYY-MM-DD' (included). */
  end: string;
  /** Illuminance on the object, lx (≥ 0). */
  lux: number;
  /** Hours lit on each open day (0 < h ≤ 24; fractions allowed, e.g. 7.5). */
  hoursPerDay: number;
  /** ISO weekdays the room is open, 1 = Monday … 7 = Sunday; every day when absent. */
  daysOpen?: number[];
  /** Further closed days (holidays), 'YYYY-MM-DD'. */
  closedDates?: string[];
}

export interface PeriodProblem {
  /** The field of DisplayPeriodInput at fault. */
  field: 'start' | 'end' | 'lux' | 'hoursPerDay' | 'daysOpen' | 'closedDates';
  message: string;
}

export interface DatedExposure {
  date: string;
  luxHours: number;
}

const MS_PER_DAY = 86_400_000;
const ISO_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Is `s` a real calendar date written 'YYYY-MM-DD'? */
export function isIsoDate(s: unknown): s is string {
  if (typeof s !== 'string') return false;
  const m = ISO_DAY.exec(s);
  if (!m) return false;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return d.getUTCFullYear() === Number(m[1]) && d.getUTCMonth() === Number(m[2]) - 1 && d.getUTCDate() === Number(m[3]);
}

/** Days since 1970-01-01 of a 'YYYY-MM-DD' date. Throws RangeError on anything else. */
export function dayNumber(s: string): number {
  if (!isIsoDate(s)) throw new RangeError(`not a calendar date 'YYYY-MM-DD': ${String(s)}`);
  return Date.parse(`${s}T00:00:00Z`) / MS_PER_DAY;
}

/** The 'YYYY-MM-DD' date of a day number (inverse of dayNumber). */
export function dayString(n: number): string {
  return new Date(n * MS_PER_DAY).toISOString().slice(0, 10);
}

/** The date `days` days after `s` (negative for before). */
export function addDays(s: string, days: number): string {
  return dayString(dayNumber(s) + days);
}

/** ISO weekday of a day number: 1 = Monday … 7 = Sunday (1970-01-01 was a Thursday). */
function isoWeekday(n: number): number {
  return ((((n + 3) % 7) + 7) % 7) + 1;
}

/** Problems with one period, each naming its field; empty when the period is sound. */
export function validatePeriod(p: DisplayPeriodInput): PeriodProblem[] {
  const out: PeriodProblem[] = [];
  const startOk = isIsoDate(p.start);
  const endOk = isIsoDate(p.end);
  if (!startOk) out.push({ field: 'start', message: 'Start must be a calendar date written YYYY-MM-DD.' });
  if (!endOk) out.push({ field: 'end', message: 'End must be a calendar date written YYYY-MM-DD.' });
  if (startOk && endOk && dayNumber(p.end) < dayNumber(p.start)) {
    out.push({ field: 'end', message: `End (${p.end}) is before start (${p.start}).` });
  }
  if (typeof p.lux !== 'number' || !Number.isFinite(p.lux)) out.push({ field: 'lux', message: 'Illuminance must be a number of lux.' });
  else if (p.lux < 0) out.push({ field: 'lux', message: `Illuminance cannot be negative (got ${p.lux} lx).` });
  if (typeof p.hoursPerDay !== 'number' || !Number.isFinite(p.hoursPerDay)) {
    out.push({ field: 'hoursPerDay', message: 'Hours a day must be a number.' });
  } else if (p.hoursPerDay <= 0 || p.hoursPerDay > 24) {
    out.push({ field: 'hoursPerDay', message: `Hours a day must be more than 0 and at most 24 (got ${p.hoursPerDay}).` });
  }
  if (p.daysOpen !== undefined) {
    if (!Array.isArray(p.daysOpen) || p.daysOpen.length === 0) {
      out.push({ field: 'daysOpen', message: 'Give at least one open weekday (1 = Monday … 7 = Sunday).' });
    } else if (p.daysOpen.some((d) => !Number.isInteger(d) || d < 1 || d > 7)) {
      out.push({ field: 'daysOpen', message: 'Open weekdays are whole numbers from 1 (Monday) to 7 (Sunday).' });
    } else if (new Set(p.daysOpen).size !== p.daysOpen.length) {
      out.push({ field: 'daysOpen', message: 'An open weekday is listed twice.' });
    }
  }
  if (p.closedDates !== undefined) {
    const bad = Array.isArray(p.closedDates) ? p.closedDates.filter((d) => !isIsoDate(d)) : ['(not a list)'];
    if (bad.length) out.push({ field: 'closedDates', message: `Closed days must be calendar dates YYYY-MM-DD (got ${bad.join(', ')}).` });
  }
  return out;
}

function assertValid(p: DisplayPeriodInput): void {
  const problems = validatePeriod(p);
  if (problems.length) {
    throw new RangeError(`invalid display period${p.id ? ` ${p.id}` : ''}: ${problems.map((x) => `${x.field}: ${x.message}`).join(' ')}`);
  }
}

/**
 * Exposure of one period, day by day: [day number, lx·h] for every open day from start to end,
 * in date order. Closed weekdays and closed dates give nothing and are left out.
 */
export function exposureByDay(p: DisplayPeriodInput): [number, number][] {
  assertValid(p);
  const open = new Set(p.daysOpen ?? [1, 2, 3, 4, 5, 6, 7]);
  const closed = new Set((p.closedDates ?? []).map(dayNumber));
  const perDay = p.lux * p.hoursPerDay;
  const out: [number, number][] = [];
  for (let d = dayNumber(p.start), last = dayNumber(p.end); d <= last; d++) {
    if (open.has(isoWeekday(d)) && !closed.has(d)) out.push([d, perDay]);
  }
  return out;
}

/** Number of open (lit) days of a period. */
export function openDays(p: DisplayPeriodInput): number {
  return exposureByDay(p).length;
}

/** Exposure of one whole period, lx·h. */
export function periodExposure(p: DisplayPeriodInput): number {
  return exposureByDay(p).reduce((s, [, v]) => s + v, 0);
}

/** Exposure of all periods added together, lx·h. */
export function totalExposure(periods: readonly DisplayPeriodInput[]): number {
  return periods.reduce((s, p) => s + periodExposure(p), 0);
}

/** Exposure of all periods merged by day: day number → lx·h (overlapping periods add up). */
export function dailyExposure(periods: readonly DisplayPeriodInput[]): Map<number, number> {
  const m = new Map<number, number>();
  for (const p of periods) for (const [d, v] of exposureByDay(p)) m.set(d, (m.get(d) ?? 0) + v);
  return m;
}

/**
 * Exposure received on the days from `from` to `to`, both included. A period that only partly
 * falls in the window counts only its days inside it.
 */
export function exposureBetween(periods: readonly DisplayPeriodInput[], from: string, to: string): number {
  const a = dayNumber(from);
  const b = dayNumber(to);
  let sum = 0;
  for (const [d, v] of dailyExposure(periods)) if (d >= a && d <= b) sum += v;
  return sum;
}

/** Exposure per calendar year, years in order; a period across 31 December is split there. */
export function exposureByYear(periods: readonly DisplayPeriodInput[]): { year: number; luxHours: number }[] {
  const m = new Map<number, number>();
  for (const [d, v] of dailyExposure(periods)) {
    const y = new Date(d * MS_PER_DAY).getUTCFullYear();
    m.set(y, (m.get(y) ?? 0) + v);
  }
  return [...m.entries()].sort((x, y) => x[0] - y[0]).map(([year, luxHours]) => ({ year, luxHours }));
}

/**
 * Exposure over the `days` days ending on `asOf` (both ends included): by default the 365 days
 * that make "the last 12 months".
 */
export function rollingExposure(periods: readonly DisplayPeriodInput[], asOf: string, days = 365): number {
  if (!Number.isInteger(days) || days < 1) throw new RangeError(`days must be a whole number ≥ 1 (got ${days})`);
  return exposureBetween(periods, addDays(asOf, -(days - 1)), asOf);
}

/**
 * Points for a chart of cumulative exposure: `luxHours` is what the print had received before
 * `date` began. There is a point at each period's start and on the day after each period's end,
 * so the line is flat between displays and rises across each one. Empty without periods.
 */
export function cumulativeSeries(periods: readonly DisplayPeriodInput[]): DatedExposure[] {
  const daily = [...dailyExposure(periods).entries()].sort((x, y) => x[0] - y[0]);
  const marks = new Set<number>();
  for (const p of periods) {
    marks.add(dayNumber(p.start));
    marks.add(dayNumber(p.end) + 1);
  }
  const out: DatedExposure[] = [];
  let i = 0;
  let sum = 0;
  for (const m of [...marks].sort((x, y) => x - y)) {
    while (i < daily.length && daily[i][0] < m) sum += daily[i++][1];
    out.push({ date: dayString(m), luxHours: sum });
  }
  return out;
}

export interface Overlap<P extends DisplayPeriodInput = DisplayPeriodInput> {
  /** Positions in the list given, first < second. */
  firstIndex: number;
  secondIndex: number;
  first: P;
  second: P;
  /** First and last day shared by both. */
  from: string;
  to: string;
}

/**
 * Every pair of periods that share at least one day (a print cannot be in two displays at once).
 * Periods that only touch — one ends the day before the other starts — do not overlap; a period
 * that starts on the day another ends does.
 */
export function findOverlaps<P extends DisplayPeriodInput>(periods: readonly P[]): Overlap<P>[] {
  const spans = periods.map((p) => [dayNumber(p.start), dayNumber(p.end)] as const);
  const out: Overlap<P>[] = [];
  for (let i = 0; i < periods.length; i++) {
    for (let j = i + 1; j < periods.length; j++) {
      const from = Math.max(spans[i][0], spans[j][0]);
      const to = Math.min(spans[i][1], spans[j][1]);
      if (from <= to) out.push({ firstIndex: i, secondIndex: j, first: periods[i], second: periods[j], from: dayString(from), to: dayString(to) });
    }
  }
  return out;
}
