import type { CohortQuery } from '@toneledger/common/schemas/research';

/** Query keys for research: a cohort's figures, the prints behind a figure, text factors' values, saved queries. */
export interface PrintsAsk { groupKey?: string; which: 'all' | 'with_rate' | 'events' | 'censored' | 'at_risk' | 'term'; time?: number; term?: string }

export const researchKeys = {
  all: ['research'] as const,
  cohort: (q: CohortQuery, part: string) => [...researchKeys.all, 'cohort', q, part] as const,
  prints: (q: CohortQuery, ask: PrintsAsk, page: number) => [...researchKeys.all, 'prints', q, ask, page] as const,
  factors: () => [...researchKeys.all, 'factors'] as const,
  terms: () => [...researchKeys.all, 'terms'] as const,
  saved: () => [...researchKeys.all, 'saved'] as const,
  savedList: (mine: boolean) => [...researchKeys.saved(), 'list', mine] as const,
};
