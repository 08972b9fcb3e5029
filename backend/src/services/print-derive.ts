import { parseEdtf } from '@toneledger/common/domain/edtf';
import { compatibilityWarnings, type CompatibilityInput, type CompatibilityWarning } from '@toneledger/common/domain/compatibility';
import { validationFailed } from '../errors';

/**
 * Values a print carries that are computed from what the registrar entered: the sortable forms of
 * its accession number and date, the toner classes of its toning steps, and its warnings.
 */

/** Natural sort key: every run of digits padded to 12, so 1987.2.1 sorts before 1987.14.3. */
export function accessionSortKey(accession: string): string {
  return accession
    .trim()
    .toLowerCase()
    .replace(/\d+/g, (d) => d.replace(/^0+(?=\d)/, '').padStart(12, '0'));
}

export interface DerivedDate {
  dateMade: string | null;
  dateDisplay: string | null;
  dateEarliest: string | null;
  dateLatest: string | null;
}

/** Parses an EDTF date made; a bad value is a validation error on `path`. */
export function deriveDate(value: string | null | undefined, path = 'dateMade'): DerivedDate {
  if (value == null || value.trim() === '') return { dateMade: null, dateDisplay: null, dateEarliest: null, dateLatest: null };
  const parsed = parseEdtf(value.trim());
  if (!parsed.ok) throw validationFailed([{ path, message: parsed.error, code: 'edtf' }]);
  return {
    dateMade: parsed.value.input,
    dateDisplay: parsed.value.display,
    dateEarliest: parsed.value.earliest,
    dateLatest: parsed.value.latest,
  };
}

export interface StepFacts {
  type: string;
  tonerClass: string | null;
  agent: string | null;
  alkaline: boolean | null;
}

export function tonerClassesOf(steps: StepFacts[]): string[] {
  const out: string[] = [];
  for (const s of steps) if (s.type === 'toning' && s.tonerClass && !out.includes(s.tonerClass)) out.push(s.tonerClass);
  return out;
}

export interface EnclosureFacts {
  name: string;
  alkalineBuffered: boolean | null;
  patResult: 'passed' | 'failed' | 'not_tested';
}

export function warningsOf(process: string, steps: StepFacts[], enclosure: EnclosureFacts | null): CompatibilityWarning[] {
  const input: CompatibilityInput = {
    process: process as CompatibilityInput['process'],
    tonerClasses: tonerClassesOf(steps) as CompatibilityInput['tonerClasses'],
    afterBaths: steps.filter((s) => s.type === 'after_bath').map((s) => ({ solution: s.agent ?? '', alkaline: s.alkaline })),
    enclosure: enclosure ? { name: enclosure.name, alkalineBuffered: enclosure.alkalineBuffered, patResult: enclosure.patResult } : null,
  };
  return compatibilityWarnings(input);
}
