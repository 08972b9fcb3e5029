import { cumulativeSeries, periodExposure } from '@toneledger/common/domain/light-dose';
import { LIGHT_COST_ASSUMPTIONS } from '@toneledger/common/domain/light-cost';
import { LIGHT_BUDGET_SOURCE } from '@toneledger/common/domain/light-budget';
import type { PrintLight } from '@toneledger/common/schemas/light';

export const PRINT_ID = '3f2d9a40-6c1b-4e8f-9a7d-5b0c2e1f4a11';

/** Invented displays of an iron-blue-toned print; exposure from the common dose functions. */
const periods = [
  { id: 'a1c0d3e2-0000-4000-8000-000000000001', exhibitionId: 'e1000000-0000-4000-8000-000000000001', exhibitionTitle: 'Tidewater Rooms', start: '2023-05-01', end: '2023-05-20', lux: 40, hoursPerDay: 6 },
  { id: 'a1c0d3e2-0000-4000-8000-000000000002', exhibitionId: 'e1000000-0000-4000-8000-000000000002', exhibitionTitle: 'Blue Hours at Calder Reach', start: '2026-04-01', end: '2026-04-30', lux: 50, hoursPerDay: 8 },
  { id: 'a1c0d3e2-0000-4000-8000-000000000003', exhibitionId: 'e1000000-0000-4000-8000-000000000003', exhibitionTitle: 'Winter Rotation', start: '2026-12-10', end: '2026-12-31', lux: 50, hoursPerDay: 8 },
];

export function makePrintLight(overrides: Partial<PrintLight> = {}): PrintLight {
  return {
    printId: PRINT_ID,
    category: 'high',
    categorySource: 'default',
    defaultCategory: 'high',
    overrideReason: null,
    overriddenBy: null,
    budget: { maxLux: 50, annualLuxHours: 15_000 },
    budgetSource: LIGHT_BUDGET_SOURCE,
    asOf: '2026-12-02',
    // 2026: 30 days × 50 lx × 8 h = 12,000 lx·h; before it 20 days × 40 lx × 6 h = 4,800 lx·h.
    usedThisYear: 12_000,
    usedLast12Months: 12_000,
    total: 16_800,
    // 22 days × 50 lx × 8 h = 8,800 lx·h, from 10 December.
    planned: 8_800,
    byYear: [
      { year: 2023, luxHours: 4_800 },
      { year: 2026, luxHours: 20_800 },
    ],
    series: cumulativeSeries(periods).map((p) => ({ date: p.date, luxHours: p.luxHours })),
    displays: periods.map((p) => ({
      id: p.id,
      exhibitionId: p.exhibitionId,
      exhibitionTitle: p.exhibitionTitle,
      startsOn: p.start,
      endsOn: p.end,
      lux: p.lux,
      hoursPerDay: p.hoursPerDay,
      luxHours: periodExposure(p),
    })),
    rest: { owedUntil: null, explanation: 'Within its budget over the last 12 months; no rest is owed.' },
    warnings: [{ code: 'planned_exceeds_budget', message: 'The planned displays would take it to 20,800 lx·h in 12 months, past its budget of 15,000 lx·h.' }],
    cost: {
      status: 'ok',
      spotLabel: 'B (sky)',
      slopePerMlxh: 0.8,
      ci95: [0.7, 0.912],
      n: 5,
      points: [
        { date: '2019-03-02', megaLuxHours: 0, deltaE00: 0 },
        { date: '2023-06-01', megaLuxHours: 0.0048, deltaE00: 0.01 },
        { date: '2026-05-04', megaLuxHours: 0.0168, deltaE00: 0.014 },
      ],
      assumptions: [...LIGHT_COST_ASSUMPTIONS],
    },
    version: 3,
    ...overrides,
  };
}
