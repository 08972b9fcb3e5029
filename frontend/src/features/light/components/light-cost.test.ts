import { describe, expect, it } from 'vitest';
import { plannedCostSentence } from '@/features/light/components/light-cost';

const fit = {
  status: 'ok' as const,
  spotLabel: 'A',
  slopePerMlxh: 0.8,
  ci95: [0.7, 0.912] as [number, number],
  n: 5,
  points: [
    { date: '2020-01-01', megaLuxHours: 0, deltaE00: 0 },
    { date: '2026-05-04', megaLuxHours: 0.5, deltaE00: 0.4 },
  ],
  assumptions: [],
};

describe('plannedCostSentence', () => {
  // Hand arithmetic: 100,000 lx·h = 0.1 Mlx·h; × 0.8 = 0.08, × 0.7 = 0.07, × 0.912 = 0.0912; from 0.40 that makes 0.48.
  it('says when the planned displays are expected to reach the noticeable change', () => {
    expect(plannedCostSentence(fit, 100_000, 0.45)).toBe(
      'The planned displays (100,000 lx·h) are expected to add ΔE00 0.080 (95 % interval 0.070–0.091); from ΔE00 0.40 measured on 2026-05-04, that makes 0.48: reaching the noticeable change of ΔE00 0.45.',
    );
  });

  it('says when only the upper end of the interval reaches it', () => {
    // 0.40 + 0.08 = 0.48 < 0.49 ≤ 0.40 + 0.0912 = 0.4912.
    expect(plannedCostSentence(fit, 100_000, 0.49)).toMatch(/that makes 0\.48: below the noticeable change of ΔE00 0\.49, though the upper end of the interval reaches it\.$/);
  });

  it('says when the print is already past it', () => {
    expect(plannedCostSentence(fit, 100_000, 0.4)).toMatch(/: already at or past the noticeable change of ΔE00 0\.40\.$/);
  });

  it('leaves the threshold out when it is not known', () => {
    expect(plannedCostSentence(fit, 100_000, null)).toBe(
      'The planned displays (100,000 lx·h) are expected to add ΔE00 0.080 (95 % interval 0.070–0.091); from ΔE00 0.40 measured on 2026-05-04, that makes 0.48.',
    );
  });
});
