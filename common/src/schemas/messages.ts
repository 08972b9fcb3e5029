import { z } from 'zod';

/**
 * The product's own words for zod's default messages. A schema's own message (`.min(1, 'Enter a
 * name')`) always wins; this map only words what a schema leaves unsaid, so a person never reads
 * "Invalid input: expected number, received NaN". Installed once, globally, by importing this
 * module: `envelope.ts` imports it, and both the server (error handler) and the client (API client)
 * load that module.
 */

type Issue = z.core.$ZodRawIssue;

const count = (n: number | bigint) => new Intl.NumberFormat('en-GB', { maximumFractionDigits: 6 }).format(n);
const plural = (n: number | bigint, one: string, many: string) => `${count(n)} ${Number(n) === 1 ? one : many}`;

function isMissing(input: unknown): boolean {
  return input === undefined || input === null || (typeof input === 'string' && input.trim() === '');
}

const FORMATS: Record<string, string> = {
  date: 'Enter a real date, as YYYY-MM-DD',
  datetime: 'Enter a date and time',
  time: 'Enter a time, as HH:MM',
  email: 'Enter an e-mail address',
  url: 'Enter a web address',
  uuid: 'Choose one of the listed records',
  guid: 'Choose one of the listed records',
};

function tooSmall(issue: Extract<Issue, { code: 'too_small' }>): string {
  const { origin, minimum, inclusive, exact } = issue;
  if (origin === 'string') {
    if (exact) return `Exactly ${plural(minimum, 'character', 'characters')}`;
    return Number(minimum) <= 1 ? 'Required' : `At least ${plural(minimum, 'character', 'characters')}`;
  }
  if (origin === 'array' || origin === 'set') {
    if (exact) return `Exactly ${plural(minimum, 'item', 'items')}`;
    return Number(minimum) <= 1 ? 'Add at least one' : `At least ${plural(minimum, 'item', 'items')}`;
  }
  if (origin === 'date') return `On or after ${new Date(Number(minimum)).toISOString().slice(0, 10)}`;
  return inclusive === false ? `More than ${count(minimum)}` : `At least ${count(minimum)}`;
}

function tooBig(issue: Extract<Issue, { code: 'too_big' }>): string {
  const { origin, maximum, inclusive, exact } = issue;
  if (origin === 'string') return `${exact ? 'Exactly' : 'At most'} ${plural(maximum, 'character', 'characters')}`;
  if (origin === 'array' || origin === 'set') return `${exact ? 'Exactly' : 'At most'} ${plural(maximum, 'item', 'items')}`;
  if (origin === 'date') return `On or before ${new Date(Number(maximum)).toISOString().slice(0, 10)}`;
  return inclusive === false ? `Less than ${count(maximum)}` : `At most ${count(maximum)}`;
}

function invalidType(issue: Extract<Issue, { code: 'invalid_type' }>): string {
  const { expected, input } = issue;
  if (expected === 'number' || expected === 'bigint') return isMissing(input) ? 'Required' : 'Enter a number';
  if (expected === 'int') return typeof input === 'number' && Number.isFinite(input) ? 'Enter a whole number' : 'Enter a number';
  if (expected === 'date') return 'Enter a real date, as YYYY-MM-DD';
  if (isMissing(input)) return 'Required';
  if (expected === 'boolean') return 'Choose yes or no';
  if (expected === 'string') return 'Enter text';
  return 'Not a value this field takes';
}

/** A zod issue in the product's words. */
export function productMessage(issue: Issue): string {
  switch (issue.code) {
    case 'invalid_type':
      return invalidType(issue);
    case 'too_small':
      return tooSmall(issue);
    case 'too_big':
      return tooBig(issue);
    case 'invalid_value':
      return 'Choose one of the listed values';
    case 'invalid_format':
      return FORMATS[issue.format] ?? 'Not in the expected form';
    case 'not_multiple_of':
      return `Must be a multiple of ${count(issue.divisor as number)}`;
    case 'unrecognized_keys':
      return `Not a field of this record: ${issue.keys.join(', ')}`;
    case 'invalid_union':
      return 'Not a value this field takes';
    case 'invalid_key':
    case 'invalid_element':
      return 'Check the values in this list';
    default:
      return 'Check this value';
  }
}

z.config({ customError: productMessage });
