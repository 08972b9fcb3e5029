import { describe, expect, it } from 'vitest';
import { render } from '@testing-library/react';
import { cumulativeSeries } from '@toneledger/common/domain/light-dose';
import { ExposureChart } from '@/features/light/components/exposure-chart';
import { exposureChartData } from '@/features/light/utils/chart-data';

// 46 days × 50 lx × 8 h = 18,400 lx·h (1 March to 15 April 2025).
const period = { start: '2025-03-01', end: '2025-04-15', lux: 50, hoursPerDay: 8 };

describe('ExposureChart', () => {
  it('labels the exposure axis on round ticks with thousands separators', () => {
    const data = exposureChartData({
      series: cumulativeSeries([period]),
      displays: [{ id: 'd1', exhibitionId: 'e1', exhibitionTitle: 'Harbour Prints', startsOn: period.start, endsOn: period.end, lux: 50, hoursPerDay: 8, luxHours: 18_400 }],
      budget: { maxLux: 50, annualLuxHours: null },
      asOf: '2026-01-10',
    })!;
    const { container } = render(<ExposureChart data={data} annualBudget={null} label="Cumulative exposure" width={640} />);
    const labels = [...container.querySelectorAll('.recharts-yAxis-tick-labels .recharts-cartesian-axis-tick-value')].map((t) => t.textContent);
    // d3-array's step for 18,400 over 5 ticks is 5,000 (see chart-data.test.ts).
    expect(labels).toEqual(['0', '5,000', '10,000', '15,000', '20,000']);
    expect(container.querySelectorAll('.chart-band').length).toBe(1);
  });
});
