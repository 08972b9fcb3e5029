/**
 * A date made as a registrar writes it on a catalogue card: "1994", "ca. 1994", "1994?",
 * "April 1968", "1960s", "1971–1977", "before 1960", "after 1960" (common practice in museum
 * cataloguing; the wording is this product's choice). The EDTF value itself stays the record's
 * value and is shown beside it in a tooltip or the record's details.
 *
 * Only strings `parseEdtf` accepts are worded; anything else is returned as typed, so a screen never
 * shows less than the record holds.
 *
 * Conventions:
 *  - `~` (approximate) → "ca. " before the date; `?` (uncertain) → "?" after it; `%` → both;
 *  - unspecified digits: `196X` → "1960s", `19XX` → "1900–1999", `2004-XX` → "2004",
 *    `1985-04-XX` → "April 1985";
 *  - seasons (21–24) → "spring 2001";
 *  - a date and time → its calendar date ("12 April 1985");
 *  - intervals: "1971–1977" (en dash); spaced " – " when an end has spaces ("April 1985 – May 1986");
 *    a qualifier shared by both ends is written once ("ca. 1971–1977");
 *  - open ends: `../1960` → "before 1960", `1960/..` → "after 1960" (catalogue usage: the named
 *    year itself is included, as EDTF's open interval includes it);
 *  - unknown ends: `1960/` → "1960–?", `/1960` → "?–1960".
 */
import { parseEdtf } from './edtf';

const MONTHS = [
  'January', 'February', 'March', 'April', 'May', 'June',
  'July', 'August', 'September', 'October', 'November', 'December',
];
const SEASONS: Record<string, string> = { '21': 'spring', '22': 'summer', '23': 'autumn', '24': 'winter' };

interface Words {
  bare: string;
  approximate: boolean;
  uncertain: boolean;
}

function pointWords(text: string): Words {
  const q = /[?~%]$/.exec(text)?.[0];
  const body = q ? text.slice(0, -1) : text;
  const approximate = q === '~' || q === '%';
  const uncertain = q === '?' || q === '%';
  const [y, m, d] = body.replace(/T.*$/, '').split('-');
  let bare: string;
  if (/^\d{3}X$/.test(y)) bare = `${y.slice(0, 3)}0s`;
  else if (/^\d{2}XX$/.test(y)) bare = `${y.slice(0, 2)}00–${y.slice(0, 2)}99`;
  else if (m === undefined || m === 'XX') bare = y;
  else if (SEASONS[m]) bare = `${SEASONS[m]} ${y}`;
  else if (d === undefined || d === 'XX') bare = `${MONTHS[Number(m) - 1]} ${y}`;
  else bare = `${Number(d)} ${MONTHS[Number(m) - 1]} ${y}`;
  return { bare, approximate, uncertain };
}

function qualified(w: Words, withQualifiers = true): string {
  if (!withQualifiers) return w.bare;
  return `${w.approximate ? 'ca. ' : ''}${w.bare}${w.uncertain ? '?' : ''}`;
}

/** The registrar's wording of an EDTF date made; the input unchanged when it is not EDTF this product reads. */
export function edtfAsWritten(input: string | null | undefined): string {
  if (input == null) return '';
  const parsed = parseEdtf(input);
  if (!parsed.ok) return input;
  if (parsed.value.kind === 'date') return qualified(pointWords(input));

  const [startText, endText] = input.split('/');
  if (startText === '..') return `before ${qualified(pointWords(endText))}`;
  if (endText === '..') return `after ${qualified(pointWords(startText))}`;
  if (startText === '') return `?–${qualified(pointWords(endText))}`;
  if (endText === '') return `${qualified(pointWords(startText))}–?`;

  const a = pointWords(startText);
  const b = pointWords(endText);
  const dash = a.bare.includes(' ') || b.bare.includes(' ') ? ' – ' : '–';
  if (a.approximate === b.approximate && a.uncertain === b.uncertain) {
    const shared: Words = { bare: `${a.bare}${dash}${b.bare}`, approximate: a.approximate, uncertain: a.uncertain };
    return qualified(shared);
  }
  return `${qualified(a)}${dash}${qualified(b)}`;
}
