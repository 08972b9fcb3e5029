/**
 * Extended Date/Time Format (EDTF, Library of Congress; the basis of ISO 8601-2), levels 0 and 1.
 *
 * A print's "date made" is stored as the EDTF string the registrar typed; this module checks it,
 * turns it into calendar bounds (for sorting, filtering and ageing sums) and into plain English.
 *
 * Supported:
 *  - level 0: `1985`, `1985-04`, `1985-04-12`, `1985-04-12T23:20:30` (optional `Z` or `±hh[:mm]`),
 *    intervals of those (`1964/2008`, `2004-06/2006-08`);
 *  - level 1: a qualifier at the end of a date (`?` uncertain, `~` approximate, `%` both);
 *    unspecified digits from the right in the four cases level 1 allows (`201X`, `20XX`,
 *    `2004-XX`, `1985-04-XX`, `1985-XX-XX`); seasons `21`–`24`; intervals whose ends are any
 *    level 0/1 date, an open end `..` or an unknown (empty) end.
 *
 * Decisions (refused with a clear message rather than half-supported):
 *  - year 0000, negative years (`-1985`) and `Y`-prefixed long years (`Y170000002`): a photograph cannot
 *    predate 1839, and the bounds here are plain `YYYY-MM-DD` strings; "not supported here";
 *  - anything that only level 2 allows (qualifying one part of a date, `X` elsewhere than level 1
 *    allows, seasons 25–41, sets `[..]`/`{..}`, exponents, significant digits);
 *  - a qualified season (`2001-21~`), unspecified digits inside an interval and a qualified
 *    date-and-time: not level 1;
 *  - an interval with no known end at all (`../..`, `/`), or whose start is after its end;
 *  - years of other than four digits, and the hour 24 (hours are 00–23);
 *  - a time shift no place uses (beyond ±14:00) or none can be (hours over 23, minutes over 59).
 *
 * `display` is plain English: "1968", "April 1968", "12 April 1968", "1960s", "1900 to 1999",
 * "spring 2001", "about April 1968", "1971, uncertain", "about 11 June 2004, uncertain",
 * "1964 to 1969", "April 1985 or later", "12 April 1985 or earlier",
 * "from 12 April 1985 to an unknown date".
 *
 * Seasons use northern-hemisphere meteorological months (common practice): spring = March–May,
 * summer = June–August, autumn = September–November, winter = December of the given year to
 * February of the next.
 *
 * Calendar: proleptic Gregorian, as in ISO 8601 (leap year: divisible by 4, except centuries
 * not divisible by 400). A date-and-time is bounded by its calendar date as written.
 */

export interface EdtfValue {
  input: string;
  level: 0 | 1;
  kind: 'date' | 'interval';
  /** ISO calendar date YYYY-MM-DD; null for an open (`..`) or unknown (empty) start. */
  earliest: string | null;
  /** ISO calendar date YYYY-MM-DD; null for an open (`..`) or unknown (empty) end. */
  latest: string | null;
  uncertain: boolean;
  approximate: boolean;
  display: string;
}

export type EdtfResult = { ok: true; value: EdtfValue } | { ok: false; error: string };

const MONTH_NAMES = [
  'January', 'February', 'March', 'April', 'May', 'June',
  'July', 'August', 'September', 'October', 'November', 'December',
];

const SEASONS: Record<number, { name: string; startMonth: number }> = {
  21: { name: 'spring', startMonth: 3 },
  22: { name: 'summer', startMonth: 6 },
  23: { name: 'autumn', startMonth: 9 },
  24: { name: 'winter', startMonth: 12 },
};

/** One date (not an interval), before qualifiers are applied to the wording. */
interface Point {
  level: 0 | 1;
  earliest: string;
  latest: string;
  uncertain: boolean;
  approximate: boolean;
  /** English without the qualifier wording, e.g. "April 1968". */
  bare: string;
  /** True when the date uses X digits (not allowed as an interval end at level 1). */
  unspecified: boolean;
  season: boolean;
}

class EdtfError extends Error {}

export function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

export function daysInMonth(year: number, month: number): number {
  if (month === 2) return isLeapYear(year) ? 29 : 28;
  return [4, 6, 9, 11].includes(month) ? 30 : 31;
}

function pad(n: number, width: number): string {
  return String(n).padStart(width, '0');
}

function iso(year: number, month: number, day: number): string {
  return `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}`;
}

function qualify(bare: string, uncertain: boolean, approximate: boolean): string {
  let s = approximate ? `about ${bare}` : bare;
  if (uncertain) s += ', uncertain';
  return s;
}

function checkMonth(input: string, month: number): void {
  if (month >= 25 && month <= 41) {
    throw new EdtfError(`${input}: seasons 25–41 are EDTF level 2, not supported here (use 21–24)`);
  }
  if (month < 1 || month > 24 || (month > 12 && month < 21)) {
    throw new EdtfError(`${input}: month must be 01–12`);
  }
}

function checkDay(input: string, year: number, month: number, day: number): void {
  const max = daysInMonth(year, month);
  if (day < 1 || day > max) {
    const why = month === 2 && day === 29 ? ` (${pad(year, 4)} is not a leap year)` : '';
    throw new EdtfError(`${input}: day must be 01–${max} for ${MONTH_NAMES[month - 1]} ${pad(year, 4)}${why}`);
  }
}

/** Real UTC offsets run from −12:00 to +14:00; beyond ±14:00 no place uses one. */
const MAX_OFFSET_MINUTES = 14 * 60;

/** A time shift `±hh`, `±hhmm` or `±hh:mm`: impossible beyond 23 hours or 59 minutes, not real beyond ±14:00. */
function checkOffset(input: string, zone: string): void {
  const hours = Number(zone.slice(1, 3));
  const minutes = Number(zone.slice(3).replace(':', '') || '0');
  if (hours > 23 || minutes > 59) {
    throw new EdtfError(`${input}: the UTC offset ${zone} is impossible (hours 00–23, minutes 00–59)`);
  }
  if (hours * 60 + minutes > MAX_OFFSET_MINUTES) {
    throw new EdtfError(`${input}: the UTC offset ${zone} is not a real one (offsets in use are at most 14 hours from UTC)`);
  }
}

/** Refusals that deserve a specific message rather than the generic "not an EDTF date". */
function explainUnsupported(input: string, body: string): never {
  if (/^-\d/.test(body)) throw new EdtfError(`${input}: negative years (before year 0) are not supported here`);
  if (/^Y/i.test(body)) throw new EdtfError(`${input}: Y-prefixed (long) years are not supported here`);
  if (/^[[{].*[\]}]$/.test(body)) throw new EdtfError(`${input}: sets and lists are EDTF level 2, not supported here`);
  if (/[?~%]{2,}$/.test(body)) throw new EdtfError(`${input}: use one qualifier: ? (uncertain), ~ (approximate) or % (both)`);
  if (/\d[?~%]./.test(body) || /^[?~%]/.test(body)) {
    throw new EdtfError(`${input}: qualifying one part of a date is EDTF level 2, not supported here; put ?, ~ or % at the end`);
  }
  if (/X/.test(body) && /^[\dX]{4}(-[\dX]{2}){0,2}$/.test(body)) {
    throw new EdtfError(
      `${input}: at level 1, X may only replace the last one or two digits of a year alone (201X, 20XX), ` +
        'the month of a year-month (2004-XX), or the day (1985-04-XX) or month and day (1985-XX-XX); other placements are level 2, not supported here',
    );
  }
  if (/[SE]\d/.test(body)) throw new EdtfError(`${input}: exponents and significant digits are EDTF level 2, not supported here`);
  if (/^\d{4}-\d{2}-\d{2}T.*[?~%]$/.test(body)) {
    throw new EdtfError(`${input}: a date and time cannot be qualified at EDTF level 1; qualify a date without the time`);
  }
  if (/^\d{4}-\d{2}-\d{2}T/.test(body)) {
    throw new EdtfError(`${input}: a date and time must be written YYYY-MM-DDThh:mm:ss, optionally followed by Z or ±hh:mm`);
  }
  if (/^\d{4}-(\d|\d{2}-\d)([?~%]?)$/.test(body)) {
    throw new EdtfError(`${input}: month and day must have two digits, as in 1968-04-09`);
  }
  if (/^\d{1,3}(-|$)/.test(body) || /^\d{5,}/.test(body)) throw new EdtfError(`${input}: the year must have four digits`);
  throw new EdtfError(
    `${input}: not an EDTF date; expected forms such as 1968, 1968-04, 1968-04-12, 196X, 1968?, 1968-04~, 2001-21 or 1964/1969`,
  );
}

function parsePoint(input: string, text: string): Point {
  if (text === '') throw new EdtfError('empty date: enter an EDTF date such as 1968 or 1968-04-12');

  // Level 0 date and time. Bounded by the calendar date as written; no qualifier allowed.
  const dt = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})(Z|[+-]\d{2}(?::?\d{2})?)?$/.exec(text);
  if (dt) {
    const [y, m, d, hh, mm, ss] = dt.slice(1, 7).map(Number);
    const zone = dt[7];
    if (m < 1 || m > 12) throw new EdtfError(`${input}: month must be 01–12`);
    checkDay(input, y, m, d);
    if (hh > 23) throw new EdtfError(`${input}: hour must be 00–23`);
    if (mm > 59) throw new EdtfError(`${input}: minute must be 00–59`);
    if (ss > 59) throw new EdtfError(`${input}: second must be 00–59`);
    if (zone !== undefined && zone !== 'Z') checkOffset(input, zone);
    const day = iso(y, m, d);
    const zoneText = zone === undefined ? ' (local time)' : zone === 'Z' ? ' UTC' : ` UTC${zone}`;
    return {
      level: 0, earliest: day, latest: day, uncertain: false, approximate: false,
      bare: `${d} ${MONTH_NAMES[m - 1]} ${pad(y, 4)}, ${pad(hh, 2)}:${pad(mm, 2)}:${pad(ss, 2)}${zoneText}`,
      unspecified: false, season: false,
    };
  }

  // A single qualifier at the very end applies to the whole date (level 1).
  let body = text;
  let uncertain = false;
  let approximate = false;
  const q = /^(.*\d|.*X)([?~%])$/.exec(text);
  if (q) {
    body = q[1];
    uncertain = q[2] === '?' || q[2] === '%';
    approximate = q[2] === '~' || q[2] === '%';
  }
  const qualified = uncertain || approximate;
  let level: 0 | 1 = qualified ? 1 : 0;

  // Year alone, possibly with one or two unspecified digits from the right.
  let m = /^(\d{4}|\d{3}X|\d{2}XX)$/.exec(body);
  if (m) {
    const xs = (body.match(/X/g) ?? []).length;
    const low = Number(body.replace(/X/g, '0'));
    const high = Number(body.replace(/X/g, '9'));
    if (xs > 0) level = 1;
    const bare = xs === 0 ? body : xs === 1 ? `${body.slice(0, 3)}0s` : `${pad(low, 4)} to ${pad(high, 4)}`;
    return {
      level, earliest: iso(low, 1, 1), latest: iso(high, 12, 31), uncertain, approximate, bare,
      unspecified: xs > 0, season: false,
    };
  }

  // Year-month, year with unspecified month, or season.
  m = /^(\d{4})-(\d{2}|XX)$/.exec(body);
  if (m) {
    const year = Number(m[1]);
    if (m[2] === 'XX') {
      return {
        level: 1, earliest: iso(year, 1, 1), latest: iso(year, 12, 31), uncertain, approximate,
        bare: `${m[1]} (month unknown)`, unspecified: true, season: false,
      };
    }
    const month = Number(m[2]);
    checkMonth(input, month);
    if (month >= 21) {
      if (qualified) throw new EdtfError(`${input}: a qualified season is beyond EDTF level 1, not supported here`);
      const s = SEASONS[month];
      // Winter runs from December into February of the next year.
      const endYear = month === 24 ? year + 1 : year;
      const endMonth = month === 24 ? 2 : s.startMonth + 2;
      if (endYear > 9999) throw new EdtfError(`${input}: winter ${year} runs into year 10000, which is not supported here`);
      return {
        level: 1, earliest: iso(year, s.startMonth, 1), latest: iso(endYear, endMonth, daysInMonth(endYear, endMonth)),
        uncertain, approximate, bare: `${s.name} ${m[1]}`, unspecified: false, season: true,
      };
    }
    return {
      level, earliest: iso(year, month, 1), latest: iso(year, month, daysInMonth(year, month)), uncertain, approximate,
      bare: `${MONTH_NAMES[month - 1]} ${m[1]}`, unspecified: false, season: false,
    };
  }

  // Year-month-day, with the day or month-and-day unspecified allowed at level 1.
  m = /^(\d{4})-(\d{2}|XX)-(\d{2}|XX)$/.exec(body);
  if (m && !(m[2] === 'XX' && m[3] !== 'XX')) {
    const year = Number(m[1]);
    if (m[2] === 'XX') {
      return {
        level: 1, earliest: iso(year, 1, 1), latest: iso(year, 12, 31), uncertain, approximate,
        bare: `${m[1]} (month and day unknown)`, unspecified: true, season: false,
      };
    }
    const month = Number(m[2]);
    if (month < 1 || month > 12) throw new EdtfError(`${input}: month must be 01–12`);
    if (m[3] === 'XX') {
      return {
        level: 1, earliest: iso(year, month, 1), latest: iso(year, month, daysInMonth(year, month)), uncertain, approximate,
        bare: `${MONTH_NAMES[month - 1]} ${m[1]} (day unknown)`, unspecified: true, season: false,
      };
    }
    const day = Number(m[3]);
    checkDay(input, year, month, day);
    return {
      level, earliest: iso(year, month, day), latest: iso(year, month, day), uncertain, approximate,
      bare: `${day} ${MONTH_NAMES[month - 1]} ${m[1]}`, unspecified: false, season: false,
    };
  }

  explainUnsupported(input, text);
}

function parseInterval(input: string, startText: string, endText: string): EdtfValue {
  // `..` = open (no bound); empty = unknown. Both give a null bound.
  const start = startText === '..' || startText === '' ? null : parsePoint(input, startText);
  const end = endText === '..' || endText === '' ? null : parsePoint(input, endText);
  if (!start && !end) throw new EdtfError(`${input}: an interval needs at least one known date`);
  for (const p of [start, end]) {
    if (p?.unspecified) throw new EdtfError(`${input}: unspecified digits (X) in an interval are EDTF level 2, not supported here`);
    if (p?.season) throw new EdtfError(`${input}: a season in an interval is beyond EDTF level 1, not supported here`);
  }
  if (start && end && start.earliest > end.latest) {
    throw new EdtfError(`${input}: the interval starts after it ends`);
  }
  const open = startText === '..' || endText === '..' || startText === '' || endText === '';
  const level: 0 | 1 = open || start?.level === 1 || end?.level === 1 ? 1 : 0;
  const words = (p: Point) => qualify(p.bare, p.uncertain, p.approximate);

  let display: string;
  if (start && end) display = `${words(start)} to ${words(end)}`;
  else if (start) display = endText === '..' ? `${words(start)} or later` : `from ${words(start)} to an unknown date`;
  else display = startText === '..' ? `${words(end!)} or earlier` : `from an unknown date to ${words(end!)}`;

  return {
    input, level, kind: 'interval',
    earliest: start ? start.earliest : null,
    latest: end ? end.latest : null,
    uncertain: Boolean(start?.uncertain || end?.uncertain),
    approximate: Boolean(start?.approximate || end?.approximate),
    display,
  };
}

/** Year 0000 is 1 BC in ISO 8601; like negative years, not supported here (and not storable as a date). */
function refuseYearZero(input: string, earliest: string | null): void {
  if (earliest?.startsWith('0000')) throw new EdtfError(`${input}: year 0000 (1 BC) is not supported here; years start at 0001`);
}

/** Parse an EDTF level 0 or level 1 string. Never throws; bad input gives `{ ok: false, error }`. */
export function parseEdtf(input: string): EdtfResult {
  try {
    if (typeof input !== 'string') throw new EdtfError('a date must be given as text');
    if (input.trim() === '') throw new EdtfError('empty date: enter an EDTF date such as 1968 or 1968-04-12');
    if (input !== input.trim() || /\s/.test(input)) throw new EdtfError(`"${input}": EDTF dates contain no spaces`);
    const parts = input.split('/');
    if (parts.length > 2) throw new EdtfError(`${input}: an interval has exactly one "/"`);
    if (parts.length === 2) {
      const value = parseInterval(input, parts[0], parts[1]);
      refuseYearZero(input, value.earliest);
      return { ok: true, value };
    }
    if (input === '..') throw new EdtfError(`${input}: ".." is only allowed as one end of an interval`);
    const p = parsePoint(input, input);
    refuseYearZero(input, p.earliest);
    return {
      ok: true,
      value: {
        input, level: p.level, kind: 'date', earliest: p.earliest, latest: p.latest,
        uncertain: p.uncertain, approximate: p.approximate, display: qualify(p.bare, p.uncertain, p.approximate),
      },
    };
  } catch (e) {
    if (e instanceof EdtfError) return { ok: false, error: e.message };
    throw e;
  }
}

/**
 * Sort order: by earliest bound, then latest bound, then the input text (so the order is total
 * and stable). An open/unknown start sorts before any date, an open/unknown end after any date.
 * Strings are parsed first; a string that is not valid EDTF sorts after every valid value.
 */
export function compareEdtf(a: EdtfValue | string, b: EdtfValue | string): number {
  const va = typeof a === 'string' ? parseEdtf(a) : ({ ok: true, value: a } as const);
  const vb = typeof b === 'string' ? parseEdtf(b) : ({ ok: true, value: b } as const);
  if (!va.ok || !vb.ok) {
    if (va.ok) return -1;
    if (vb.ok) return 1;
    return cmp(String(a), String(b));
  }
  const x = va.value;
  const y = vb.value;
  // '' sorts before any date; '\uffff' after any date.
  const byStart = cmp(x.earliest ?? '', y.earliest ?? '');
  if (byStart !== 0) return byStart;
  const byEnd = cmp(x.latest ?? '\uffff', y.latest ?? '\uffff');
  if (byEnd !== 0) return byEnd;
  return cmp(x.input, y.input);
}

function cmp(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
