import { describe, expect, it } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import type { SpotAnalysis } from '@toneledger/common/schemas/measurements';
import { AbDriftChart, driftAxes, driftPoints } from '@/features/measurements/components/ab-drift-chart';

const id = (n: number) => `00000000-0000-4000-8000-00000000000${n}`;
const point = (n: number, measuredOn: string, a: number, b: number, dE00: number | null, comparable = true) => ({
  sessionId: id(n), measuredOn, lab: { L: 50, a, b }, comparable, reason: comparable ? null : 'Measured under D65, the baseline under D50',
  dE00, dE76: null, dL: null, dC: null, dH: null, dLPrime: null, dCPrime: null, dHPrime: null, dominant: null, density: null, dD: null, densityLossPercent: null,
});

// Sharma, Wu & Dalal (2005) Table 1 pairs 1 and 2 share the second colour (50, 0, −82.7485): as a baseline,
// (50, 2.6772, −79.7751) is ΔE00 2.0425 from it and (50, 3.1571, −77.2803) is 2.8615.
const analysis = {
  spot: { id: id(9), printId: id(8), name: 'Sky', purpose: 'dmax', point: null, notes: null, baseline: null, version: 1 },
  baseline: { sessionId: id(1), measuredOn: '2010-04-01', lab: { L: 50, a: 0, b: -82.7485 }, density: null, chosen: false },
  // Listed out of order on purpose: the plot joins them oldest first.
  points: [point(3, '2020-04-01', 3.1571, -77.2803, 2.8615), point(1, '2010-04-01', 0, -82.7485, 0), point(2, '2015-04-01', 2.6772, -79.7751, 2.0425), point(4, '2022-04-01', 9, -70, null, false)],
  rate: null, densityChangeRate: null, densityLossRate: null, projection: null,
} as unknown as SpotAnalysis;

describe('AbDriftChart', () => {
  it('puts the sessions in time order with the baseline marked', () => {
    const pts = driftPoints(analysis);
    expect(pts.map((p) => p.measuredOn)).toEqual(['2010-04-01', '2015-04-01', '2020-04-01', '2022-04-01']);
    expect(pts.map((p) => p.baseline)).toEqual([true, false, false, false]);
  });

  it('draws both axes to the same scale around the points, with round ticks', () => {
    const { a, b } = driftAxes(driftPoints(analysis));
    const spanA = a.domain[1] - a.domain[0];
    const spanB = b.domain[1] - b.domain[0];
    expect(Math.abs(spanA - spanB)).toBeLessThanOrEqual(Math.max(spanA, spanB) * 0.5);
    for (const p of driftPoints(analysis)) {
      expect(p.a).toBeGreaterThanOrEqual(a.domain[0]);
      expect(p.a).toBeLessThanOrEqual(a.domain[1]);
      expect(p.b).toBeGreaterThanOrEqual(b.domain[0]);
      expect(p.b).toBeLessThanOrEqual(b.domain[1]);
    }
    expect(a.ticks[0]).toBe(a.domain[0]);
    expect(b.ticks.at(-1)).toBe(b.domain[1]);
  });

  it('joins the points in time order, left to right as a* grows here, and shows a point\'s values on hover and on focus', () => {
    render(<AbDriftChart analysis={analysis} label="Drift of a* and b* at Sky" />);
    const group = screen.getByRole('group', { name: 'Drift of a* and b* at Sky' });
    const dots = screen.getAllByTestId('drift-point');
    expect(dots).toHaveLength(4);
    const xs = dots.map((d) => Number(d.getAttribute('cx')));
    expect([...xs].sort((p, q) => p - q)).toEqual(xs);
    // b* grows upward: a larger b* is drawn higher (smaller y).
    const ys = dots.map((d) => Number(d.getAttribute('cy')));
    expect(ys[1]).toBeLessThan(ys[0]);
    expect(dots[3].getAttribute('fill')).toBe('#fff');

    const readout = group.querySelector('figcaption')!;
    expect(readout.textContent).toContain('4 sessions');
    fireEvent.mouseEnter(dots[1]);
    expect(readout.textContent).toMatch(/a\* 2\.68, b\* −?-?79\.78, ΔE00 2\.04 from the baseline/);
    fireEvent.focus(dots[0]);
    expect(readout.textContent).toMatch(/baseline$/);
    fireEvent.focus(dots[3]);
    expect(readout.textContent).toContain('not comparable with the baseline');
    expect(dots[2].getAttribute('aria-label')).toMatch(/ΔE00 2\.86 from the baseline/);
    expect(dots.every((d) => d.getAttribute('tabindex') === '0')).toBe(true);
  });

  it('draws nothing for a spot without sessions', () => {
    const { container } = render(<AbDriftChart analysis={{ ...analysis, points: [], baseline: null }} label="Empty" />);
    expect(container.innerHTML).toBe('');
  });
});
