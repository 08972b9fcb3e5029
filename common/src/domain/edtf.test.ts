import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { compareEdtf, daysInMonth, isLeapYear, parseEdtf, type EdtfValue } from './edtf';

// Second opinion: the `edtf` package from the npm registry (an independent EDTF / ISO 8601-2
// parser). It ships no type declarations, so it is loaded through require and typed here.
interface LibEdtf {
  min: number | null;
  max: number | null;
}
const require = createRequire(import.meta.url);
const lib = require('edtf') as {
  default: (s: string) => LibEdtf;
  parse: (s: string, c: { level: number }) => { level: number; type: string };
};

/** Lowest EDTF level at which the library accepts the string, or null if it refuses it at 0–3. */
function libLevel(s: string): number | null {
  for (const level of [0, 1, 2, 3]) {
    try {
      lib.parse(s, { level });
      return level;
    } catch {
      /* try the next level */
    }
  }
  return null;
}

/** The library's bounds as YYYY-MM-DD (null for open/unknown ends). */
function libBounds(s: string): [string | null, string | null] {
  const d = lib.default(s);
  const day = (t: number | null) => (t === null || !Number.isFinite(t) ? null : new Date(t).toISOString().slice(0, 10));
  return [day(d.min), day(d.max)];
}

function ok(s: string): EdtfValue {
  const r = parseEdtf(s);
  if (!r.ok) throw new Error(`expected ${s} to parse, got: ${r.error}`);
  return r.value;
}

type Row = [input: string, level: 0 | 1, kind: 'date' | 'interval', earliest: string | null, latest: string | null, u: boolean, a: boolean, display: string];

// Expected values are worked out by hand from the EDTF specification (Library of Congress EDTF,
// basis of ISO 8601-2; examples listed in REFERENCES.md §8 [published]) and the Gregorian
// calendar (month lengths, leap years); each row is also checked against the `edtf` package.
const VALID: Row[] = [
  // REFERENCES.md §8, EDTF line, level 0
  ['1985', 0, 'date', '1985-01-01', '1985-12-31', false, false, '1985'],
  ['1985-04', 0, 'date', '1985-04-01', '1985-04-30', false, false, 'April 1985'],
  ['1985-04-12', 0, 'date', '1985-04-12', '1985-04-12', false, false, '12 April 1985'],
  ['1964/2008', 0, 'interval', '1964-01-01', '2008-12-31', false, false, '1964 to 2008'],
  // REFERENCES.md §8, EDTF line, level 1
  ['1984?', 1, 'date', '1984-01-01', '1984-12-31', true, false, '1984, uncertain'],
  ['2004-06~', 1, 'date', '2004-06-01', '2004-06-30', false, true, 'about June 2004'],
  ['2004-06-11%', 1, 'date', '2004-06-11', '2004-06-11', true, true, 'about 11 June 2004, uncertain'],
  ['201X', 1, 'date', '2010-01-01', '2019-12-31', false, false, '2010s'],
  ['2004-XX', 1, 'date', '2004-01-01', '2004-12-31', false, false, '2004 (month unknown)'],
  ['1985-04/..', 1, 'interval', '1985-04-01', null, false, false, 'April 1985 or later'],
  ['../1985-04-12', 1, 'interval', null, '1985-04-12', false, false, '12 April 1985 or earlier'],
  // Brief examples
  ['1968', 0, 'date', '1968-01-01', '1968-12-31', false, false, '1968'],
  ['1968-04~', 1, 'date', '1968-04-01', '1968-04-30', false, true, 'about April 1968'],
  ['196X', 1, 'date', '1960-01-01', '1969-12-31', false, false, '1960s'],
  ['19XX', 1, 'date', '1900-01-01', '1999-12-31', false, false, '1900 to 1999'],
  ['1971?', 1, 'date', '1971-01-01', '1971-12-31', true, false, '1971, uncertain'],
  ['1964/1969', 0, 'interval', '1964-01-01', '1969-12-31', false, false, '1964 to 1969'],
  // Gregorian leap-year rule: 2000 is divisible by 400, so February 2000 has 29 days
  ['2000-02-29', 0, 'date', '2000-02-29', '2000-02-29', false, false, '29 February 2000'],
  ['2000-02', 0, 'date', '2000-02-01', '2000-02-29', false, false, 'February 2000'],
  ['1900-02', 0, 'date', '1900-02-01', '1900-02-28', false, false, 'February 1900'],
  // Further level 0/1 forms from the EDTF specification
  ['1985-04-12T23:20:30Z', 0, 'date', '1985-04-12', '1985-04-12', false, false, '12 April 1985, 23:20:30 UTC'],
  ['1985-04-12T23:20:30', 0, 'date', '1985-04-12', '1985-04-12', false, false, '12 April 1985, 23:20:30 (local time)'],
  ['1985-04-12T10:20:30+04:30', 0, 'date', '1985-04-12', '1985-04-12', false, false, '12 April 1985, 10:20:30 UTC+04:30'],
  ['2004-06/2006-08', 0, 'interval', '2004-06-01', '2006-08-31', false, false, 'June 2004 to August 2006'],
  ['1985-04-XX', 1, 'date', '1985-04-01', '1985-04-30', false, false, 'April 1985 (day unknown)'],
  ['1985-XX-XX', 1, 'date', '1985-01-01', '1985-12-31', false, false, '1985 (month and day unknown)'],
  ['20XX', 1, 'date', '2000-01-01', '2099-12-31', false, false, '2000 to 2099'],
  ['1984~/2004-06', 1, 'interval', '1984-01-01', '2004-06-30', false, true, 'about 1984 to June 2004'],
  ['1984?/2004%', 1, 'interval', '1984-01-01', '2004-12-31', true, true, '1984, uncertain to about 2004, uncertain'],
  ['1985-04-12/', 1, 'interval', '1985-04-12', null, false, false, 'from 12 April 1985 to an unknown date'],
  ['/1985-04-12', 1, 'interval', null, '1985-04-12', false, false, 'from an unknown date to 12 April 1985'],
  ['1985/..', 1, 'interval', '1985-01-01', null, false, false, '1985 or later'],
];

describe('parseEdtf: valid level 0 and 1 strings', () => {
  it.each(VALID)('%s', (input, level, kind, earliest, latest, uncertain, approximate, display) => {
    expect(ok(input)).toEqual({ input, level, kind, earliest, latest, uncertain, approximate, display });
  });

  it.each(VALID.map((r) => [r[0], r[1], r[3], r[4]] as const))(
    '%s agrees with the edtf package on level and bounds (second opinion)',
    (input, level, earliest, latest) => {
      expect(libLevel(input)).toBe(level);
      expect(libBounds(input)).toEqual([earliest, latest]);
    },
  );
});

describe('parseEdtf: seasons 21–24 (EDTF level 1)', () => {
  // Month mapping: northern-hemisphere meteorological seasons (common practice). The edtf
  // package maps seasons to calendar quarters instead, so it is used here only for the level.
  it.each([
    ['2001-21', '2001-03-01', '2001-05-31', 'spring 2001'],
    ['2001-22', '2001-06-01', '2001-08-31', 'summer 2001'],
    ['2001-23', '2001-09-01', '2001-11-30', 'autumn 2001'],
    // Winter runs into February of the next year; 2002 is not a leap year, 2004 is (Gregorian rule)
    ['2001-24', '2001-12-01', '2002-02-28', 'winter 2001'],
    ['2003-24', '2003-12-01', '2004-02-29', 'winter 2003'],
  ])('%s', (input, earliest, latest, display) => {
    expect(ok(input)).toEqual({
      input, level: 1, kind: 'date', earliest, latest, uncertain: false, approximate: false, display,
    });
    expect(libLevel(input)).toBe(1);
  });
});

describe('parseEdtf: invalid input', () => {
  // Each is refused by the edtf package at levels 0–1 too (second opinion), except where noted.
  it.each([
    ['1968-13', /^1968-13: month must be 01–12$/],
    ['1968-00', /month must be 01–12/],
    ['1968-20', /month must be 01–12/],
    ['1985-04-31', /day must be 01–30 for April 1985/],
    ['1985-02-30', /day must be 01–28 for February 1985/],
    ['1968-13-01', /month must be 01–12/],
    ['2001-25', /seasons 25–41 are EDTF level 2, not supported here/],
    ['2004?-06-11', /qualifying one part of a date is EDTF level 2/],
    ['?2004-06-11', /qualifying one part of a date is EDTF level 2/],
    ['1985-XX-12', /X may only replace/],
    ['19XX-XX', /X may only replace/],
    ['1XXX', /X may only replace/],
    ['2001-21~', /qualified season/],
    ['201X/2015', /unspecified digits \(X\) in an interval/],
    ['2004-06-11~?', /use one qualifier/],
    ['[1667,1668]', /sets and lists are EDTF level 2/],
    ['19850', /four digits/],
    ['1968-04-12 10:00', /no spaces/],
    ['April 1968', /no spaces/],
    ['abc', /not an EDTF date/],
    ['1985-4', /two digits/],
    ['1985-04-1', /two digits/],
    ['1968/1969/1970', /exactly one "\/"/],
    ['..', /only allowed as one end of an interval/],
    ['1985-04-12T23:20:30?', /date and time cannot be qualified/],
  ])('%s is refused', (input, message) => {
    const r = parseEdtf(input);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(message);
    const level = libLevel(input);
    expect(level === null || level >= 2).toBe(true);
  });

  // Refusals where this module is deliberately stricter than the edtf package.
  it('1900-02-29 is refused: 1900 is a century not divisible by 400, so not a leap year (Gregorian rule)', () => {
    const r = parseEdtf('1900-02-29');
    expect(r).toEqual({ ok: false, error: '1900-02-29: day must be 01–28 for February 1900 (1900 is not a leap year)' });
    // The edtf package accepts it and rolls it over to 1 March, so it is no help here.
    expect(libBounds('1900-02-29')).toEqual(['1900-03-01', '1900-03-01']);
  });

  it('a two-digit year is refused (the package reads "85" as a century, a form from an EDTF draft that the published levels 0–1 no longer have: from memory)', () => {
    expect(parseEdtf('85')).toEqual({ ok: false, error: '85: the year must have four digits' });
    expect(libLevel('85')).toBe(0);
  });

  it('hour 24 is refused: hours are 00–23 here (ISO 8601 has at times allowed 24:00:00 for the end of a day, as the package does)', () => {
    expect(parseEdtf('1968-04-12T24:00:00')).toEqual({ ok: false, error: '1968-04-12T24:00:00: hour must be 00–23' });
    expect(libLevel('1968-04-12T24:00:00')).toBe(0);
  });

  it('negative and Y-prefixed years are refused as not supported here (the package accepts them)', () => {
    expect(parseEdtf('-1985')).toEqual({ ok: false, error: '-1985: negative years (before year 0) are not supported here' });
    expect(parseEdtf('Y170000002')).toEqual({ ok: false, error: 'Y170000002: Y-prefixed (long) years are not supported here' });
    expect(libLevel('-1985')).toBe(0);
    expect(libLevel('Y170000002')).toBe(1);
  });

  it('an interval that starts after it ends, or has no known end, is refused', () => {
    expect(parseEdtf('1990/1985')).toEqual({ ok: false, error: '1990/1985: the interval starts after it ends' });
    expect(parseEdtf('../..')).toMatchObject({ ok: false, error: expect.stringMatching(/at least one known date/) });
    expect(parseEdtf('/')).toMatchObject({ ok: false, error: expect.stringMatching(/at least one known date/) });
  });

  it('a date and time with an offset no place uses, or none can be, is refused with the reason', () => {
    // EDTF level 0 allows a time followed by Z or a shift of ±hh or ±hh:mm. Real UTC offsets run from
    // −12:00 to +14:00 (Line Islands), so beyond ±14:00 is not a real offset, and an offset beyond
    // ±23:59 (hours over 23 or minutes over 59) is impossible. Both bounds recalled from memory.
    expect(parseEdtf('2024-01-01T00:00:00+99:00')).toEqual({
      ok: false, error: '2024-01-01T00:00:00+99:00: the UTC offset +99:00 is impossible (hours 00–23, minutes 00–59)',
    });
    expect(parseEdtf('2024-01-01T00:00:00+05:75')).toMatchObject({ ok: false, error: expect.stringMatching(/UTC offset \+05:75 is impossible/) });
    expect(parseEdtf('2024-01-01T00:00:00-15:00')).toEqual({
      ok: false, error: '2024-01-01T00:00:00-15:00: the UTC offset -15:00 is not a real one (offsets in use are at most 14 hours from UTC)',
    });
    expect(parseEdtf('2024-01-01T00:00:00+1430')).toMatchObject({ ok: false, error: expect.stringMatching(/not a real one/) });
    expect(parseEdtf('1960/2024-01-01T00:00:00+99')).toMatchObject({ ok: false, error: expect.stringMatching(/impossible/) });
    // The edges are accepted.
    expect(parseEdtf('2024-01-01T00:00:00+14:00')).toMatchObject({ ok: true });
    expect(parseEdtf('2024-01-01T00:00:00-12:00')).toMatchObject({ ok: true });
    expect(parseEdtf('2024-01-01T00:00:00+0530')).toMatchObject({ ok: true });
  });

  it('year 0000 is refused: it would be 1 BC, and bounds before year 1 are not supported here', () => {
    expect(parseEdtf('0000')).toMatchObject({ ok: false, error: expect.stringMatching(/^0000: year 0000 .*not supported here/) });
    expect(parseEdtf('000X')).toMatchObject({ ok: false, error: expect.stringMatching(/year 0000/) });
    expect(parseEdtf('0000-02-29/1900')).toMatchObject({ ok: false, error: expect.stringMatching(/year 0000/) });
    expect(parseEdtf('0001')).toMatchObject({ ok: true });
  });

  it('empty and blank input is refused', () => {
    expect(parseEdtf('')).toMatchObject({ ok: false, error: expect.stringMatching(/^empty date/) });
    expect(parseEdtf('   ')).toMatchObject({ ok: false, error: expect.stringMatching(/^empty date/) });
  });
});

describe('calendar helpers (Gregorian rule, as used by ISO 8601)', () => {
  it('leap years', () => {
    expect([1900, 1968, 2000, 2001, 2100].map(isLeapYear)).toEqual([false, true, true, false, false]);
  });
  it('days in month', () => {
    expect([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12].map((m) => daysInMonth(2001, m))).toEqual([31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31]);
    expect(daysInMonth(2004, 2)).toBe(29);
  });
});

describe('compareEdtf', () => {
  it('sorts by earliest, then latest, open start first and open end last', () => {
    const input = ['1985-04/..', '1985', '1964/1969', '../1985-04-12', '1985-04-12', '196X', '1985-04', '1960', 'not a date'];
    const sorted = [...input].sort(compareEdtf);
    expect(sorted).toEqual([
      '../1985-04-12', // open start
      '1960', // 1960-01-01..1960-12-31
      '196X', // 1960-01-01..1969-12-31
      '1964/1969',
      '1985', // 1985-01-01..1985-12-31
      '1985-04', // 1985-04-01..1985-04-30
      '1985-04/..', // 1985-04-01..open
      '1985-04-12',
      'not a date', // invalid strings last
    ]);
  });

  it('accepts parsed values and breaks ties by the input text', () => {
    expect(compareEdtf(ok('1968'), ok('1968?'))).toBeLessThan(0);
    expect(compareEdtf(ok('1968?'), ok('1968'))).toBeGreaterThan(0);
    expect(compareEdtf(ok('1968'), ok('1968'))).toBe(0);
    expect(compareEdtf(ok('1968-12'), ok('1969-01'))).toBeLessThan(0);
  });
});
