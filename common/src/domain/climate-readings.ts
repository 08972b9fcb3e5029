import { DateTime, FixedOffsetZone, IANAZone, type Zone } from 'luxon';
import type { ClimateMapping } from '../schemas/climate';

/**
 * Reading a logger file's rows: timestamps in a time zone (an IANA zone, so summer time is followed,
 * or a fixed offset; a timestamp carrying its own offset keeps it), day-first or month-first dates,
 * °F → °C, RH 0–100. Time-zone arithmetic is luxon's. Nothing here is silently changed: a value that
 * cannot be read is a problem naming its row and column.
 */

export interface Reading {
  /** Milliseconds since 1970-01-01T00:00Z. */
  at: number;
  temperatureC: number;
  rhPercent: number;
}

export interface RowProblem {
  /** Row number in the file, the header being row 1. */
  row: number;
  column: string | null;
  message: string;
}

/** The bounds of the readings table (migration climate_readings). */
export const TEMPERATURE_RANGE_C = { min: -60, max: 80 } as const;
export const READING_YEARS = { min: 1970, max: 2100 } as const;
export const MAX_PROBLEMS = 200;

/** °C from °F by the definition of the Fahrenheit scale: °C = (°F − 32) × 5/9. */
export function fahrenheitToCelsius(f: number): number {
  return ((f - 32) * 5) / 9;
}

const FIXED = /^(?:UTC|GMT)?\s*([+-])(\d{1,2})(?::?(\d{2}))?$/i;

/** The luxon zone of a mapping's time zone (IANA name, 'UTC', or a fixed offset such as +01:00, at most ±14:00); null when not one. */
export function zoneOf(name: string): Zone | null {
  const s = name.trim();
  if (/^(UTC|GMT|Z)$/i.test(s)) return FixedOffsetZone.utcInstance;
  const m = FIXED.exec(s);
  if (m) {
    const minutes = Number(m[2]) * 60 + Number(m[3] ?? 0);
    if (Number(m[3] ?? 0) > 59 || minutes > 14 * 60) return null;
    return FixedOffsetZone.instance(m[1] === '-' ? -minutes : minutes);
  }
  return IANAZone.isValidZone(s) ? IANAZone.create(s) : null;
}

/** A number as written in a logger file: digits with an optional sign and one decimal point or comma; no exponent, no thousands. */
export function readNumber(text: string): number | null {
  const s = text.trim();
  if (!/^[+-]?\d{1,6}(?:[.,]\d{1,9})?$/.test(s)) return null;
  return Number(s.replace(',', '.'));
}

interface Fields { year: number; month: number; day: number; hour: number; minute: number; second: number; offset: string | null }

const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,]\d{1,9})?)?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;
const SLASHED = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})(?:[ T,]+(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,]\d{1,9})?)?(?:\s*([AP])\.?M\.?)?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;

function fieldsOf(text: string, order: ClimateMapping['dateOrder']): Fields | string {
  const s = text.trim();
  const iso = ISO.exec(s);
  if (iso) {
    return { year: +iso[1], month: +iso[2], day: +iso[3], hour: +(iso[4] ?? 0), minute: +(iso[5] ?? 0), second: +(iso[6] ?? 0), offset: iso[7] ?? null };
  }
  const sl = SLASHED.exec(s);
  if (!sl) return 'Not a date and time this reader knows (YYYY-MM-DD HH:mm, DD/MM/YYYY HH:mm or MM/DD/YYYY HH:mm)';
  const [a, b] = [+sl[1], +sl[2]];
  const monthFirst = order === 'month-first';
  let hour = +(sl[4] ?? 0);
  if (sl[7]) {
    if (hour < 1 || hour > 12) return 'An hour with AM/PM is 1 to 12';
    hour = (hour % 12) + (sl[7].toUpperCase() === 'P' ? 12 : 0);
  }
  return {
    year: +sl[3], month: monthFirst ? a : b, day: monthFirst ? b : a, hour, minute: +(sl[5] ?? 0), second: +(sl[6] ?? 0), offset: sl[8] ?? null,
  };
}

const DAY = 86_400_000;

/**
 * Turns local date-time fields into instants in one zone. A fixed offset is arithmetic. In an IANA
 * zone the offset of each local day is asked of luxon once and kept when it is the same a day before
 * and two days after (no change of the clocks near that day); on the days the clocks change, every
 * time goes through luxon's own reading, so a skipped or doubled local time is seen.
 */
export function instantReader(zone: Zone) {
  const days = new Map<number, number | null>();
  const steadyOffset = (local: number): number | null => {
    const day = Math.floor(local / DAY);
    let o = days.get(day);
    if (o === undefined) {
      const before = zone.offset(day * DAY - DAY - 14 * 3_600_000);
      const after = zone.offset(day * DAY + 2 * DAY + 14 * 3_600_000);
      o = before === after ? before : null;
      days.set(day, o);
    }
    return o;
  };
  return (f: Omit<Fields, 'offset'>, previous: number | null): { at: number } | { error: string } => {
    const local = Date.UTC(f.year, f.month - 1, f.day, f.hour, f.minute, f.second);
    const back = new Date(local);
    if (f.month < 1 || f.month > 12 || back.getUTCDate() !== f.day || back.getUTCMonth() !== f.month - 1 || f.hour > 23 || f.minute > 59 || f.second > 59) {
      return { error: 'Not a real date and time' };
    }
    if (zone.isUniversal) return { at: local - zone.offset(local) * 60_000 };
    const steady = steadyOffset(local);
    if (steady !== null) return { at: local - steady * 60_000 };
    const dt = DateTime.fromObject(f, { zone });
    if (!dt.isValid) return { error: `Not a real date and time (${dt.invalidExplanation ?? dt.invalidReason ?? 'out of range'})` };
    // luxon moves a local time that the clocks skipped (spring forward) to a real one: refuse it instead.
    if (dt.hour !== f.hour || dt.minute !== f.minute || dt.day !== f.day) {
      return { error: `This local time does not exist in ${zone.name} (the clocks went forward)` };
    }
    const candidates = dt.getPossibleOffsets().map((d) => d.toMillis()).sort((x, y) => x - y);
    if (candidates.length > 1 && previous !== null) return { at: candidates.find((c) => c > previous) ?? candidates[0] };
    return { at: candidates[0] ?? dt.toMillis() };
  };
}

/**
 * One timestamp as an instant. `previous` is the instant of the file's row before (when read well):
 * a local time that happens twice when the clocks go back is the earlier instant unless that would
 * go back before the previous row, so a logger writing local time across the change reads in order.
 */
export function readTimestamp(
  text: string, zone: Zone, order: ClimateMapping['dateOrder'], previous: number | null = null, reader: ReturnType<typeof instantReader> = instantReader(zone),
): { at: number } | { error: string } {
  const f = fieldsOf(text, order);
  if (typeof f === 'string') return { error: f };
  if (f.year < READING_YEARS.min || f.year > READING_YEARS.max) return { error: `The year must be between ${READING_YEARS.min} and ${READING_YEARS.max}` };
  const { offset, ...units } = f;
  if (!offset) return reader(units, previous);
  const own = zoneOf(offset.toUpperCase() === 'Z' ? 'UTC' : offset);
  if (!own) return { error: 'The offset must be at most ±14:00' };
  return instantReader(own)(units, previous);
}

export interface ReadOutcome {
  readings: Reading[];
  /** Rows of each reading, in the same order (for naming duplicates). */
  rows: number[];
  badRows: number;
  problems: RowProblem[];
}

/**
 * Reads the data rows of a file (after the header) with a mapping. Each row read well gives one
 * reading; a bad row gives its problems (the first 200 kept) and counts once in `badRows`. Two rows
 * at the same instant: the second is bad.
 */
export function readClimateRows(header: readonly string[], dataRows: readonly (readonly string[])[], mapping: ClimateMapping): ReadOutcome {
  const out: ReadOutcome = { readings: [], rows: [], badRows: 0, problems: [] };
  const zone = zoneOf(mapping.timeZone);
  const col = (name: string) => header.indexOf(name);
  const idx = { t: col(mapping.timestampColumn), temp: col(mapping.temperatureColumn), rh: col(mapping.rhColumn) };
  const missing: RowProblem[] = ([['t', mapping.timestampColumn], ['temp', mapping.temperatureColumn], ['rh', mapping.rhColumn]] as const)
    .filter(([k]) => idx[k] < 0).map(([, name]) => ({ row: 1, column: name, message: 'No column of this name in the header' }));
  if (!zone) missing.push({ row: 1, column: null, message: `"${mapping.timeZone}" is not a time zone (an IANA name such as Europe/London, or an offset such as +01:00)` });
  if (missing.length) return { ...out, badRows: dataRows.length, problems: missing };

  const seen = new Map<number, number>();
  const reader = instantReader(zone!);
  let previous: number | null = null;
  dataRows.forEach((cells, i) => {
    const row = i + 2;
    const problems: RowProblem[] = [];
    const t = readTimestamp(cells[idx.t] ?? '', zone!, mapping.dateOrder, previous, reader);
    if ('error' in t) problems.push({ row, column: mapping.timestampColumn, message: t.error });
    const rawT = readNumber(cells[idx.temp] ?? '');
    let temperatureC: number | null = null;
    if (rawT === null) problems.push({ row, column: mapping.temperatureColumn, message: 'Not a number' });
    else {
      temperatureC = mapping.temperatureUnit === 'F' ? fahrenheitToCelsius(rawT) : rawT;
      if (temperatureC < TEMPERATURE_RANGE_C.min || temperatureC > TEMPERATURE_RANGE_C.max) {
        problems.push({ row, column: mapping.temperatureColumn, message: `A temperature must be between ${TEMPERATURE_RANGE_C.min} and ${TEMPERATURE_RANGE_C.max} °C` });
      }
    }
    const rh = readNumber(cells[idx.rh] ?? '');
    if (rh === null) problems.push({ row, column: mapping.rhColumn, message: 'Not a number' });
    else if (rh < 0 || rh > 100) problems.push({ row, column: mapping.rhColumn, message: 'RH must be between 0 and 100 %' });
    if ('at' in t) {
      const first = seen.get(t.at);
      if (first !== undefined) problems.push({ row, column: mapping.timestampColumn, message: `The same instant as row ${first}` });
      else seen.set(t.at, row);
      previous = t.at;
    }
    if (problems.length) {
      out.badRows += 1;
      for (const p of problems) if (out.problems.length < MAX_PROBLEMS) out.problems.push(p);
      return;
    }
    out.readings.push({ at: (t as { at: number }).at, temperatureC: temperatureC!, rhPercent: rh! });
    out.rows.push(row);
  });
  return out;
}

/** A mapping guessed from the header names (and, for the unit, °F in a name). */
export function suggestMapping(header: readonly string[]): Partial<ClimateMapping> {
  const find = (re: RegExp) => header.find((h) => re.test(h));
  const timestampColumn = find(/time\s*stamp|date|time|datum|zeit/i);
  const temperatureColumn = find(/temp|°\s*[cf]\b|deg/i);
  const rhColumn = find(/\brh\b|humid|%\s*rh|rh\s*%|r\.h\./i) ?? find(/%/);
  const s: Partial<ClimateMapping> = { dateOrder: 'auto' };
  if (timestampColumn) s.timestampColumn = timestampColumn;
  if (temperatureColumn) {
    s.temperatureColumn = temperatureColumn;
    s.temperatureUnit = /°\s*f\b|\(f\)|fahrenheit|\bdeg\s*f\b/i.test(temperatureColumn) ? 'F' : 'C';
  }
  if (rhColumn && rhColumn !== temperatureColumn) s.rhColumn = rhColumn;
  return s;
}
