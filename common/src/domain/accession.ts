/**
 * Accession numbers. The institution's pattern is a setting, written as a simple template:
 *
 *   YYYY  a four-digit year (exactly four Y's; any four digits)
 *   N     a number: one or more digits (leading zeros allowed, kept as typed)
 *   #     exactly one digit (so `####` is four digits)
 *   A     exactly one capital letter A–Z
 *   \x    the character x literally (to write a literal Y, N, A, # or \)
 *   anything else is literal: punctuation, spaces, other letters and digits
 *
 * Two N's in a row are refused (`NN` would mean "two or more digits" and reads like a fixed
 * width: write `##` for that). A lone `Y` (not part of `YYYY`) is refused for the same reason.
 *
 * Or a regular expression with a `re:` prefix, e.g. `re:[A-Z]{2}\d{4}`; it must match the whole
 * value (it is anchored here). JavaScript's engine backtracks, so an expression like `(\d+\.?)+[A-Z]`
 * can take seconds or hours on a value of thirty characters. Such an expression is refused
 * (`UnsafeAccessionPatternError`): a repeated part inside another repeated part (safe-regex2's star
 * height), alternatives inside a repeated part, or more than MAX_REPEATS repeated parts in all. A
 * stored pattern that breaks this rule (saved before it existed) is not applied: `checkAccession`
 * accepts any non-empty value and says why in `unchecked`, for the caller to log.
 *
 * Matching is case-sensitive. Checking trims surrounding white space; nothing else is changed.
 *
 * Default: `YYYY.N.N` — year of acquisition, lot (acquisition) number, item number within the lot,
 * e.g. 1987.14.3 (common practice for museum accession numbers).
 */

import safeRegex from 'safe-regex2';
import parseRegExp, { types as reTypes } from 'ret';

export const DEFAULT_ACCESSION_PATTERN = 'YYYY.N.N';

/** The most repeated parts (`*`, `+`, `{n,m}`) a `re:` pattern may hold. */
export const MAX_REPEATS = 6;

/** A `re:` pattern that could take too long to check a value; the message says what to write instead. */
export class UnsafeAccessionPatternError extends Error {}

const UNSAFE_ADVICE =
  'Write the pattern as a template instead (YYYY a year, N a number, # one digit, A one capital letter, e.g. YYYY.N.N), ' +
  'or as a regular expression without a repeated part inside another repeated part, without alternatives (|) inside a repeated part, ' +
  `and with at most ${MAX_REPEATS} repeated parts, e.g. re:[A-Z]{2}\\d+`;

type ReToken = ReturnType<typeof parseRegExp> | { type: number; [k: string]: unknown };

/** True when an alternation sits inside a part repeated more than once (`(a|a)*` backtracks exponentially). */
function alternationInsideRepeat(node: ReToken, repeated: boolean): boolean {
  const n = node as { type: number; options?: ReToken[][]; stack?: ReToken[]; value?: unknown; max?: number };
  if (n.type === reTypes.REPETITION) return alternationInsideRepeat(n.value as ReToken, repeated || (n.max ?? 0) > 1);
  if (n.options) {
    if (repeated && n.options.length > 1) return true;
    return n.options.some((branch) => branch.some((t) => alternationInsideRepeat(t, repeated)));
  }
  return (n.stack ?? []).some((t) => alternationInsideRepeat(t, repeated));
}

/** Why a regular expression source could backtrack catastrophically, or null when it cannot. */
function unsafeReason(source: string): string | null {
  if (!safeRegex(source, { limit: MAX_REPEATS })) return `it repeats a part inside another repeated part, or has more than ${MAX_REPEATS} repeated parts`;
  let tree: ReToken;
  try {
    tree = parseRegExp(source);
  } catch {
    return 'it uses syntax this check cannot read';
  }
  if (alternationInsideRepeat(tree, false)) return 'it has alternatives (|) inside a repeated part';
  return null;
}

export interface AccessionRule {
  test(value: string): boolean;
  /** A value that matches the pattern ('' for a `re:` pattern, which cannot be sampled). */
  example: string;
  /** Plain English, e.g. "a four-digit year, a full stop, a number, a full stop, a number". */
  describe: string;
}

type Token =
  | { kind: 'year' }
  | { kind: 'number' }
  | { kind: 'digit' }
  | { kind: 'letter' }
  | { kind: 'literal'; text: string };

const PUNCTUATION_NAMES: Record<string, string> = {
  '.': 'a full stop',
  '-': 'a hyphen',
  '/': 'a slash',
  ':': 'a colon',
  ',': 'a comma',
  '_': 'an underscore',
  ' ': 'a space',
};

// Values used to build the example, in order of appearance.
const SAMPLE_NUMBERS = ['14', '3', '2', '7', '5'];
const SAMPLE_DIGITS = '1234567890';
const SAMPLE_LETTERS = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ';

function escapeRegExp(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
}

function tokenise(pattern: string): Token[] {
  const tokens: Token[] = [];
  const pushLiteral = (ch: string) => {
    const last = tokens[tokens.length - 1];
    if (last?.kind === 'literal') last.text += ch;
    else tokens.push({ kind: 'literal', text: ch });
  };
  for (let i = 0; i < pattern.length; i++) {
    const ch = pattern[i];
    if (ch === '\\') {
      if (i + 1 >= pattern.length) throw new Error(`accession pattern "${pattern}": a "\\" must be followed by the character it makes literal`);
      pushLiteral(pattern[++i]);
    } else if (ch === 'Y') {
      if (pattern.slice(i, i + 4) !== 'YYYY' || pattern[i + 4] === 'Y') {
        throw new Error(`accession pattern "${pattern}": a year is written YYYY (exactly four Y's); write \\Y for a literal Y`);
      }
      tokens.push({ kind: 'year' });
      i += 3;
    } else if (ch === 'N') {
      if (tokens[tokens.length - 1]?.kind === 'number') {
        throw new Error(`accession pattern "${pattern}": NN is ambiguous; N already means one or more digits, use # for exactly one digit`);
      }
      tokens.push({ kind: 'number' });
    } else if (ch === '#') {
      tokens.push({ kind: 'digit' });
    } else if (ch === 'A') {
      tokens.push({ kind: 'letter' });
    } else {
      pushLiteral(ch);
    }
  }
  return tokens;
}

function describeTokens(tokens: Token[]): string {
  const parts: string[] = [];
  for (const t of tokens) {
    if (t.kind === 'year') parts.push('a four-digit year');
    else if (t.kind === 'number') parts.push('a number');
    else if (t.kind === 'letter') parts.push('one capital letter');
    else if (t.kind === 'digit') {
      // Run-length: "####" reads "4 digits".
      const prev = parts[parts.length - 1];
      const m = prev && /^(one digit|(\d+) digits)$/.exec(prev);
      if (m) parts[parts.length - 1] = `${m[2] ? Number(m[2]) + 1 : 2} digits`;
      else parts.push('one digit');
    } else {
      // Letters and digits are read as a word ("PH"); each other character is named on its own.
      for (const piece of t.text.match(/[\p{L}\p{N}]+|./gu) ?? []) parts.push(PUNCTUATION_NAMES[piece] ?? `"${piece}"`);
    }
  }
  return parts.join(', ');
}

/** Compile an accession-number pattern. Throws an Error naming the pattern if it is malformed. */
export function accessionRule(pattern: string): AccessionRule {
  if (pattern.startsWith('re:')) {
    const source = pattern.slice(3);
    if (source === '') throw new Error('accession pattern "re:": the regular expression is empty');
    let re: RegExp;
    try {
      re = new RegExp(`^(?:${source})$`, 'u');
    } catch (e) {
      throw new Error(`accession pattern "${pattern}": not a valid regular expression (${(e as Error).message})`);
    }
    const reason = unsafeReason(source);
    if (reason) {
      throw new UnsafeAccessionPatternError(
        `accession pattern "${pattern}": this regular expression could take minutes to check some accession numbers (${reason}). ${UNSAFE_ADVICE}.`,
      );
    }
    return { test: (v) => re.test(v), example: '', describe: `text matching the regular expression ${source}` };
  }
  if (pattern.trim() === '') throw new Error('the accession-number pattern is empty');

  const tokens = tokenise(pattern);
  let numbers = 0;
  let digits = 0;
  let letters = 0;
  let source = '';
  let example = '';
  for (const t of tokens) {
    if (t.kind === 'year') {
      source += '\\d{4}';
      example += '1987';
    } else if (t.kind === 'number') {
      source += '\\d+';
      example += SAMPLE_NUMBERS[numbers++ % SAMPLE_NUMBERS.length];
    } else if (t.kind === 'digit') {
      source += '\\d';
      example += SAMPLE_DIGITS[digits++ % SAMPLE_DIGITS.length];
    } else if (t.kind === 'letter') {
      source += '[A-Z]';
      example += SAMPLE_LETTERS[letters++ % SAMPLE_LETTERS.length];
    } else {
      source += escapeRegExp(t.text);
      example += t.text;
    }
  }
  const re = new RegExp(`^${source}$`);
  return { test: (v) => re.test(v), example, describe: describeTokens(tokens) };
}

/**
 * Check an accession number as typed against the institution's pattern. A stored `re:` pattern
 * that is unsafe to run is not applied: any non-empty value passes, and `unchecked` says why.
 */
export function checkAccession(
  pattern: string,
  value: string,
): { ok: true; normalised: string; unchecked?: string } | { ok: false; message: string } {
  let rule: AccessionRule;
  try {
    rule = accessionRule(pattern);
  } catch (e) {
    if (e instanceof UnsafeAccessionPatternError) {
      const v = (value ?? '').trim();
      if (v === '') return { ok: false, message: 'An accession number is required.' };
      return { ok: true, normalised: v, unchecked: `The accession-number pattern setting was not applied: ${e.message}` };
    }
    return { ok: false, message: `The accession-number pattern setting is not valid: ${(e as Error).message}` };
  }
  const forExample = rule.example ? `, for example ${rule.example}` : '';
  const v = (value ?? '').trim();
  if (v === '') {
    return { ok: false, message: `An accession number is required (pattern ${pattern}: ${rule.describe}${forExample}).` };
  }
  if (!rule.test(v)) {
    return {
      ok: false,
      message: `"${v}" does not match the accession-number pattern ${pattern} (${rule.describe})${forExample}.`,
    };
  }
  return { ok: true, normalised: v };
}
