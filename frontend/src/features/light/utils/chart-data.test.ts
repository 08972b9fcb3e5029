import { describe, expect, it } from 'vitest';
import { ticks } from 'd3-array';
import { cumulativeSeries, periodExposure } from '@toneledger/common/domain/light-dose';
import { dayMs, exposureChartData } from '@/features/light/utils/chart-data';

// One display: 1 March to 15 April 2025 is 31 + 15 = 46 days; 46 × 50 lx × 8 h = 18,400 lx·h.
const period = { start: '2025-03-01', end: '2025-04-15', lux: 50, hoursPerDay: 8 };
const display = { id: 'd1', exhibitionId: 'e1', exhibitionTitle: 'Harbour Prints', startsOn: period.start, endsOn: period.end, lux: 50, hoursPerDay: 8, luxHours: periodExposure(period) };

function chart(annualLuxHours: number | null, asOf = '2026-01-10') {
  return exposureChartData({ series: cumulativeSeries([period]), displays: [display], budget: { maxLux: 50, annualLuxHours }, asOf })!;
}

describe('exposureChartData', () => {
  it('gives a maximum of 18,400 lx·h the ticks 0, 5,000, 10,000, 15,000, 20,000', () => {
    expect(periodExposure(period)).toBe(18_400);
    const { valueAxis } = chart(null);
    // Hand arithmetic with d3-array's tick rule: 18,400 / 5 = 3,680 = 3.68 × 10^3, between √10 ≈ 3.16 and
    // √50 ≈ 7.07, so the step is 5,000 and 18,400 rounds up to 20,000.
    expect(valueAxis).toEqual({ domain: [0, 20_000], ticks: [0, 5_000, 10_000, 15_000, 20_000] });
    // The same ticks as d3-array's own `ticks` over that domain (the reference library).
    expect(valueAxis.ticks).toEqual(ticks(0, 20_000, 5));
  });

  it('draws the budget as the annual figure accumulated from the first display, to the end of the time axis', () => {
    const data = chart(15_000);
    const [from, to] = data.budgetLine!;
    expect(from).toEqual({ t: dayMs('2025-03-01'), value: 0 });
    expect(to!.t).toBe(data.timeAxis.domain[1]);
    // 1 March 2025 to 1 January 2027 is 671 days; 15,000 × 671 / 365 = 27,575.3… lx·h.
    expect(to!.t).toBe(dayMs('2027-01-01'));
    expect(to!.value).toBeCloseTo((15_000 * 671) / 365, 6);
    // The axis follows the exposure (18,400) and the budget as far as the exposure goes (46 days: 1,890 lx·h), not the budget's far end.
    expect(data.valueAxis.domain).toEqual([0, 20_000]);
  });

  it('has no budget line without an annual budget, and shades each display, planned ones apart', () => {
    expect(chart(null).budgetLine).toBeNull();
    const past = chart(null).bands[0]!;
    expect(past).toEqual({ id: 'd1', from: dayMs('2025-03-01'), to: dayMs('2025-04-16'), title: 'Harbour Prints', planned: false });
    expect(chart(null, '2025-04-01').bands[0]!.planned).toBe(true);
  });

  it('rises across the display and is flat after it', () => {
    expect(chart(null).cumulative).toEqual([
      { t: dayMs('2025-03-01'), value: 0 },
      { t: dayMs('2025-04-16'), value: 18_400 },
    ]);
  });

  it('is null for a print never on display', () => {
    expect(exposureChartData({ series: [], displays: [], budget: { maxLux: null, annualLuxHours: null }, asOf: '2026-01-10' })).toBeNull();
  });
});
