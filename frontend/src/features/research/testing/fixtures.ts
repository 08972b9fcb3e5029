import { quantile } from 'd3-array';
import type { CohortQuery, CohortResult, SavedQuery } from '@toneledger/common/schemas/research';
import { cohortQuerySchema } from '@toneledger/common/schemas/research';

export const PRINT_A = '3b0e7c1a-52d4-4f1e-9a6b-0c1d2e3f4a01';
export const PRINT_B = '3b0e7c1a-52d4-4f1e-9a6b-0c1d2e3f4a02';

/** Iron blue on fibre, grouped by the alkaline after-bath, a Cox model on it. */
export const IRON_BLUE_QUERY: CohortQuery = cohortQuerySchema.parse({
  filters: [
    { factor: 'support', values: ['fibre_baryta'] },
    { factor: 'tonerClass', values: ['iron_blue'] },
  ],
  groupBy: ['alkalineAfterBath'],
  coxFactors: ['alkalineAfterBath'],
});

/**
 * A distribution as the server states it, its quartiles from d3-array's `quantile` (type 7, R's
 * default), not from our own code.
 */
function distribution(values: number[]) {
  const sorted = [...values].sort((a, b) => a - b);
  return {
    n: values.length,
    median: quantile(sorted, 0.5) ?? null,
    q1: quantile(sorted, 0.25) ?? null,
    q3: quantile(sorted, 0.75) ?? null,
    min: sorted[0] ?? null,
    max: sorted.at(-1) ?? null,
    points: values.map((value, i) => ({ printId: i % 2 ? PRINT_B : PRINT_A, accessionNumber: `2019.${i + 1}`, value })),
  };
}

/**
 * Kaplan–Meier worked by hand for the "without" group: times 2 (event), 3 (censored), 5 (event), 8 (event).
 * S(2) = 3/4 = 0.75; at 5, two at risk: S = 0.75 × 1/2 = 0.375; at 8, one at risk: S = 0. Median: 5 years,
 * the first time S ≤ 0.5. At risk at 0, 2.5, 5, 7.5: 4, 3, 2, 1.
 * The "with" group: times 4 (censored), 6 (event), 9 (censored): S(6) = 1 × 1/2 = 0.5; never below 0.5 after,
 * so the median is 6 with its upper bound not reached. At risk at 0, 2.5, 5, 7.5: 3, 3, 2, 1.
 * χ² = 3.84 on 1 df is p = 0.050 (the 5 % point of χ²₁ in any statistics table).
 * Hazard ratio exp(−0.9163) = 0.40.
 */
export function makeResult(over: Partial<CohortResult> = {}): CohortResult {
  const step = (t: number, atRisk: number, events: number, censored: number, s: number, lower: number | null, upper: number | null) => ({ t, atRisk, events, censored, s, se: null, lower, upper });
  return {
    query: IRON_BLUE_QUERY,
    figures: ['fading', 'survival', 'incidence', 'cox'],
    total: 9,
    groups: [
      { key: 'alkalineAfterBath=no', label: 'Alkaline after-bath: no', values: { alkalineAfterBath: 'no' }, size: 5, withRate: 5, withSurvival: 4 },
      { key: 'alkalineAfterBath=yes', label: 'Alkaline after-bath: yes', values: { alkalineAfterBath: 'yes' }, size: 4, withRate: 4, withSurvival: 3 },
    ],
    fading: [
      { key: 'alkalineAfterBath=no', deltaEPerYear: distribution([0.1, 0.2, 0.3, 0.4, 0.5]), densityLossPerYear: distribution([0.004, 0.002, 0.003, 0.001, 0.005]) },
      { key: 'alkalineAfterBath=yes', deltaEPerYear: distribution([0.05, 0.07, 0.12, 0.2]), densityLossPerYear: distribution([0.001, 0.002, 0.001, 0.0015]) },
    ],
    survival: {
      origin: 'first_exam', originLabel: 'years since the first examination', eventLabel: 'ΔE00 past 2.0', timeUnit: 'years', ci: 'log-log',
      groups: [
        {
          key: 'alkalineAfterBath=no', n: 4, events: 3, censored: 1, median: { value: 5, lower: 2, upper: null },
          steps: [step(2, 4, 1, 0, 0.75, 0.19, 0.96), step(3, 3, 0, 1, 0.75, 0.19, 0.96), step(5, 2, 1, 0, 0.375, 0.01, 0.78), step(8, 1, 1, 0, 0, null, null)],
          atRisk: [{ t: 0, n: 4 }, { t: 2.5, n: 3 }, { t: 5, n: 2 }, { t: 7.5, n: 1 }],
        },
        {
          key: 'alkalineAfterBath=yes', n: 3, events: 1, censored: 2, median: { value: 6, lower: 6, upper: null },
          steps: [step(4, 3, 0, 1, 1, null, null), step(6, 2, 1, 0, 0.5, 0.06, 0.85), step(9, 1, 0, 1, 0.5, 0.06, 0.85)],
          atRisk: [{ t: 0, n: 3 }, { t: 2.5, n: 3 }, { t: 5, n: 2 }, { t: 7.5, n: 1 }],
        },
      ],
      logRank: {
        chi2: 3.84, df: 1, p: 0.05,
        groups: [{ key: 'alkalineAfterBath=no', observed: 3, expected: 2.1 }, { key: 'alkalineAfterBath=yes', observed: 1, expected: 1.9 }],
        assumptions: ['Censoring is unrelated to the chance of the event.'],
        warnings: ['Group alkalineAfterBath=yes has 3 events (fewer than 5): the test has little power.'],
      },
    },
    cox: {
      n: 7, events: 4, ties: 'efron',
      terms: [{ label: 'Alkaline after-bath = yes (against no)', factor: 'alkalineAfterBath', level: 'yes', reference: 'no', beta: -0.9163, se: 0.8, hazardRatio: Math.exp(-0.9163), lower: 0.08, upper: 1.92, p: 0.252 }],
      likelihoodRatio: { chi2: 1.41, df: 1, p: 0.235 },
      proportionalHazards: [{ label: 'Alkaline after-bath = yes (against no)', rho: 0.12, p: 0.71, verdict: 'no sign that the hazard ratio changes over time' }],
      warnings: ['Only 4 events for 1 term.'],
    },
    incidence: [{ term: 'silvering', label: 'Silvering', groups: [{ key: 'alkalineAfterBath=no', n: 5, count: 2, share: 0.4, lower: 0.118, upper: 0.769 }, { key: 'alkalineAfterBath=yes', n: 4, count: 0, share: 0, lower: 0, upper: 0.49 }] }],
    outcomesAsOf: '2026-12-01T06:00:00.000Z',
    ...over,
  };
}

export function makeSaved(over: Partial<SavedQuery> = {}): SavedQuery {
  return {
    id: '9d8c7b6a-5f4e-4d3c-8b2a-1f0e9d8c7b01', name: 'Iron blue, after-bath', description: 'Fibre prints only.', query: IRON_BLUE_QUERY, shared: false,
    owner: { id: '5d0c0f5e-8a7b-4c2d-9e1f-112233445566', name: 'Iris Penhale' },
    createdAt: '2026-11-20T10:00:00.000Z', updatedAt: '2026-11-20T10:00:00.000Z', version: 1, ...over,
  };
}
