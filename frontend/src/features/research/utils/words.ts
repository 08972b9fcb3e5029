import type { CI_METHODS, SURVIVAL_EVENTS, SURVIVAL_ORIGINS } from '@toneledger/common/schemas/research';

/** The words for the query's choices, as the builder offers them and the charts state them. */
export const EVENT_WORDS: Record<(typeof SURVIVAL_EVENTS)[number], string> = {
  fading: 'Fading past a ΔE00 threshold',
  observation: 'A deterioration observation',
  grade: 'A grade at or below',
};

export const ORIGIN_WORDS: Record<(typeof SURVIVAL_ORIGINS)[number], string> = {
  first_exam: 'The first examination',
  made: 'The date made (earliest year)',
};

export const CI_WORDS: Record<(typeof CI_METHODS)[number], string> = {
  'log-log': 'Log-log (stays within 0–1)',
  plain: 'Plain (Greenwood, clipped to 0–1)',
};

/** A p value as people read it: "p < 0.001" below a thousandth, else three decimals. */
export function formatP(p: number): string {
  return p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`;
}

/** A number with fixed decimals, or a dash when missing. */
export function fixed(n: number | null | undefined, digits = 2): string {
  return n === null || n === undefined || !Number.isFinite(n) ? '–' : n.toFixed(digits);
}
