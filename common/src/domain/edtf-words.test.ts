import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { edtfAsWritten } from './edtf-words';

// Outside check: the `edtf` package from the npm registry (an independent EDTF / ISO 8601-2 parser)
// reads each example; its bounds and its approximate/uncertain flags must agree with the words.
interface LibDate {
  type: string;
  min: number;
  max: number;
  approximate?: { value: number };
  uncertain?: { value: number };
  lower?: LibDate | null;
  upper?: LibDate | number | null;
}
const require = createRequire(import.meta.url);
const lib = require('edtf') as { default: (s: string) => LibDate };

// Examples from the EDTF specification (Library of Congress; REFERENCES.md §8 [published]) and the
// brief's registrar forms. The wording is catalogue usage (common practice): "ca." for approximate,
// a trailing "?" for uncertain, an en dash between the ends of a range.
const EXAMPLES: Array<[edtf: string, written: string]> = [
  ['1985', '1985'],
  ['1985-04', 'April 1985'],
  ['1985-04-12', '12 April 1985'],
  ['1964/2008', '1964–2008'],
  ['1971/1977', '1971–1977'],
  ['1984?', '1984?'],
  ['1994~', 'ca. 1994'],
  ['2004-06~', 'ca. June 2004'],
  ['2004-06-11%', 'ca. 11 June 2004?'],
  ['201X', '2010s'],
  ['196X', '1960s'],
  ['19XX', '1900–1999'],
  ['2004-XX', '2004'],
  ['1985-04-XX', 'April 1985'],
  ['1985-XX-XX', '1985'],
  ['2001-21', 'spring 2001'],
  ['1985-04-12T23:20:30Z', '12 April 1985'],
  ['2004-06/2006-08', 'June 2004 – August 2006'],
  ['1971~/1977~', 'ca. 1971–1977'],
  ['1984~/2004-06', 'ca. 1984 – June 2004'],
  ['../1960', 'before 1960'],
  ['1960/..', 'after 1960'],
  ['1985-04/..', 'after April 1985'],
  ['1985-04-12/', '12 April 1985–?'],
  ['/1985-04-12', '?–12 April 1985'],
];

describe('edtfAsWritten: what a registrar writes', () => {
  it.each(EXAMPLES)('%s → %s', (input, written) => {
    expect(edtfAsWritten(input)).toBe(written);
  });

  it('returns text that is not EDTF as typed, and nothing for no date', () => {
    expect(edtfAsWritten('about 1970')).toBe('about 1970');
    expect(edtfAsWritten('1985-02-30')).toBe('1985-02-30');
    expect(edtfAsWritten(null)).toBe('');
  });
});

describe('edtfAsWritten agrees with the edtf package (outside check)', () => {
  const year = (t: number) => new Date(t).getUTCFullYear();

  it.each(EXAMPLES.filter(([s]) => !s.includes('/') && !/-2[1-4]$/.test(s)))('%s: qualifiers and years', (input, written) => {
    const d = lib.default(input);
    expect(written.startsWith('ca. ')).toBe((d.approximate?.value ?? 0) !== 0);
    expect(written.endsWith('?')).toBe((d.uncertain?.value ?? 0) !== 0);
    // The first year written is the library's earliest year; for a decade or century its range.
    expect(written).toContain(String(year(d.min)).slice(0, 3));
    expect(year(d.max) - year(d.min)).toBe(/^\d{2}00–\d{2}99$/.test(written) ? 99 : /0s$/.test(written) ? 9 : 0);
  });

  it.each(EXAMPLES.filter(([s]) => s.includes('/') && !s.startsWith('..')))('%s: the ends of a range', (input, written) => {
    const d = lib.default(input);
    expect(d.type).toBe('Interval');
    if (d.upper === Infinity) expect(written.startsWith('after ')).toBe(true);
    else if (d.upper && typeof d.upper === 'object') expect(written).toContain(String(year(d.upper.max)));
    if (d.lower && typeof d.lower === 'object') expect(written).toContain(String(year(d.lower.min)));
    else expect(written.startsWith('?–')).toBe(true);
  });
});
