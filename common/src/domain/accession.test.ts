import { describe, expect, it } from 'vitest';
import { DEFAULT_ACCESSION_PATTERN, MAX_REPEATS, UnsafeAccessionPatternError, accessionRule, checkAccession } from './accession';

// The three-part year.lot.item accession number is common practice in museum registration; the
// template syntax is this module's own (documented in accession.ts).
describe('default pattern YYYY.N.N (common practice: year, lot, item)', () => {
  const rule = accessionRule(DEFAULT_ACCESSION_PATTERN);

  it('is YYYY.N.N with example 1987.14.3 and a plain description', () => {
    expect(DEFAULT_ACCESSION_PATTERN).toBe('YYYY.N.N');
    expect(rule.example).toBe('1987.14.3');
    expect(rule.test(rule.example)).toBe(true);
    expect(rule.describe).toBe('a four-digit year, a full stop, a number, a full stop, a number');
  });

  it.each(['1987.14.3', '2003.1.120', '1954.007.01'])('accepts %s', (v) => {
    expect(rule.test(v)).toBe(true);
  });

  it.each(['1987.14', '87.14.3', '1987-14-3', '1987.14.3a', '1987..3', '19870.1.2', ' 1987.14.3', '1987.14.3.1'])('refuses %s', (v) => {
    expect(rule.test(v)).toBe(false);
  });
});

describe('template syntax', () => {
  it('# is one digit, A one capital letter, other characters literal', () => {
    const r = accessionRule('PH-YYYY/####A');
    expect(r.example).toBe('PH-1987/1234A');
    expect(r.test('PH-2001/0042B')).toBe(true);
    expect(r.test('PH-2001/042B')).toBe(false);
    expect(r.test('ph-2001/0042B')).toBe(false); // case-sensitive
    expect(r.test('PH-2001/0042b')).toBe(false);
    expect(r.describe).toBe('"PH", a hyphen, a four-digit year, a slash, 4 digits, one capital letter');
  });

  it('a backslash makes a token letter literal, and regex characters in literals are literal', () => {
    const r = accessionRule('\\N\\A\\Y-N(N)');
    expect(r.example).toBe('NAY-14(3)');
    expect(r.test('NAY-5(6)')).toBe(true);
    expect(r.test('NAY-5x6)')).toBe(false);
  });

  it('refuses malformed templates with a message naming the pattern', () => {
    expect(() => accessionRule('YY.N')).toThrow(/"YY\.N": a year is written YYYY/);
    expect(() => accessionRule('YYYYY.N')).toThrow(/a year is written YYYY/);
    expect(() => accessionRule('YYYY.NN')).toThrow(/NN is ambiguous/);
    expect(() => accessionRule('YYYY\\')).toThrow(/must be followed/);
    expect(() => accessionRule('  ')).toThrow(/empty/);
  });

  it('re: patterns match the whole value', () => {
    const r = accessionRule('re:[A-Z]{2}\\d{4}');
    expect(r.test('PH1987')).toBe(true);
    expect(r.test('xPH1987')).toBe(false);
    expect(r.test('PH19870')).toBe(false);
    expect(r.example).toBe('');
    expect(() => accessionRule('re:[A-Z')).toThrow(/not a valid regular expression/);
  });
});

describe('checkAccession', () => {
  it('trims and accepts', () => {
    expect(checkAccession(DEFAULT_ACCESSION_PATTERN, '  1987.14.3\n')).toEqual({ ok: true, normalised: '1987.14.3' });
  });

  it('refuses empty, naming the pattern and an example', () => {
    expect(checkAccession(DEFAULT_ACCESSION_PATTERN, '   ')).toEqual({
      ok: false,
      message: 'An accession number is required (pattern YYYY.N.N: a four-digit year, a full stop, a number, a full stop, a number, for example 1987.14.3).',
    });
  });

  it('refuses a mismatch, naming the pattern and an example', () => {
    expect(checkAccession(DEFAULT_ACCESSION_PATTERN, '1987-14-3')).toEqual({
      ok: false,
      message: '"1987-14-3" does not match the accession-number pattern YYYY.N.N (a four-digit year, a full stop, a number, a full stop, a number), for example 1987.14.3.',
    });
  });

  it('a regex pattern has no example to offer', () => {
    const r = checkAccession('re:\\d+', 'abc');
    expect(r).toEqual({ ok: false, message: '"abc" does not match the accession-number pattern re:\\d+ (text matching the regular expression \\d+).' });
  });

  it('a malformed pattern setting is reported, not thrown', () => {
    const r = checkAccession('YY.N', '87.1');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/^The accession-number pattern setting is not valid: accession pattern "YY\.N"/);
  });
});

describe('re: patterns that could freeze the server', () => {
  const NUMBER_29 = '1987.14.3.1987.14.3.1987.14.3'; // 29 characters, no letter at the end

  it('refuses the nested repeat that takes seconds on a 29-character number, saying what to write instead', () => {
    expect(NUMBER_29).toHaveLength(29);
    expect(() => accessionRule('re:(\\d+\\.?)+[A-Z]')).toThrow(UnsafeAccessionPatternError);
    expect(() => accessionRule('re:(\\d+\\.?)+[A-Z]')).toThrow(/repeats a part inside another repeated part.*template instead.*YYYY\.N\.N/);
  });

  it('refuses alternatives inside a repeated part and too many repeated parts', () => {
    expect(() => accessionRule('re:(\\d|\\d)*[A-Z]')).toThrow(/alternatives \(\|\) inside a repeated part/);
    expect(() => accessionRule('re:(1|\\d){1,40}[A-Z]')).toThrow(UnsafeAccessionPatternError);
    expect(() => accessionRule(`re:${'\\d*'.repeat(MAX_REPEATS + 1)}[A-Z]`)).toThrow(/more than 6 repeated parts/);
  });

  it('still accepts ordinary expressions', () => {
    expect(accessionRule('re:[A-Z]{2}\\d{4}').test('PH1987')).toBe(true);
    expect(accessionRule('re:(PH|NEG)-?\\d+').test('NEG-12')).toBe(true);
  });

  it('checking a 29-character number against any pattern that can still be saved gives an answer', () => {
    const candidates = [
      '(\\d+\\.?)+[A-Z]', '(\\d*)*[A-Z]', '(\\d|\\d)*[A-Z]', '(\\d|\\d\\d)+[A-Z]', '(\\d+)+[A-Z]', '(.*\\.)*[A-Z]',
      '\\d*\\d*\\d*\\d*\\d*\\d*[A-Z]', '[\\d.]*\\d*\\.*\\d*[A-Z]', '.*.*.*.*.*.*[A-Z]', '(?:\\d+\\.)*[A-Z]',
      '(\\d{1,3}){1,10}[A-Z]', '(\\d\\d?){1,29}[A-Z]', '(\\w+\\s?)*$', '[A-Z]{2}\\d{4}', '\\d+(\\.\\d+)*[A-Z]',
      '(?:(?:\\d+)?\\.?)*[A-Z]', '(1|\\d|[0-9])+[A-Z]', '\\d+\\.\\d+\\.\\d+[A-Z]',
    ];
    let saved = 0;
    for (const source of candidates) {
      let rule: ReturnType<typeof accessionRule>;
      try {
        rule = accessionRule(`re:${source}`);
      } catch (e) {
        expect(e).toBeInstanceOf(UnsafeAccessionPatternError);
        continue;
      }
      saved++;
      expect(checkAccession(`re:${source}`, NUMBER_29).ok, source).toBe(false);
      expect(rule.test(NUMBER_29), source).toBe(false);
    }
    expect(saved).toBeGreaterThanOrEqual(3);
  });

  it('a stored unsafe pattern is not applied: the value passes and the reason is given for the log', () => {
    const r = checkAccession('re:(\\d+\\.?)+[A-Z]', ` ${NUMBER_29} `);
    expect(r).toEqual({ ok: true, normalised: NUMBER_29, unchecked: expect.stringMatching(/^The accession-number pattern setting was not applied: .*template instead/) });
    expect(checkAccession('re:(\\d+\\.?)+[A-Z]', '  ').ok).toBe(false);
  });
});
