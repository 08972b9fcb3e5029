import { describe, expect, it, vi } from 'vitest';
import { renderPage } from '@/test/render';
import { makeMe } from '@/test/fixtures';
import { FadingPlots } from '@/features/research/components/fading-plot';
import { curvePoints, SurvivalSection } from '@/features/research/components/survival-section';
import { makeResult } from '@/features/research/testing/fixtures';

const result = makeResult();
const labelOf = (k: string) => result.groups.find((g) => g.key === k)!.label;

describe('research charts', () => {
  it('draws a step curve and a band per group, on the ticks where the numbers at risk are given', () => {
    const { container } = renderPage(<SurvivalSection survival={result.survival} labelOf={labelOf} onShow={vi.fn()} width={640} />, { me: makeMe('researcher') });
    expect(container.querySelectorAll('.recharts-line').length).toBe(2);
    expect(container.querySelectorAll('.recharts-area').length).toBe(2);
    const xTicks = [...container.querySelectorAll('.recharts-xAxis-tick-labels .recharts-cartesian-axis-tick-value')].map((t) => t.textContent);
    expect(xTicks).toEqual(['0', '2.5', '5', '7.5']);
  });

  it('starts every curve at S = 1 at time 0 and keeps each step’s band', () => {
    const [start, first] = curvePoints(result.survival.groups[0]!);
    expect(start).toEqual({ t: 0, s: 1, band: [1, 1] });
    expect(first).toEqual({ t: 2, s: 0.75, band: [0.19, 0.96] });
  });

  it('draws a quartile box and a median bar per group over the points', () => {
    const { container } = renderPage(<FadingPlots result={result} labelOf={labelOf} onShow={vi.fn()} width={640} />, { me: makeMe('researcher') });
    // Two plots (ΔE00/yr and density loss/yr), two groups each.
    expect(container.querySelectorAll('.recharts-reference-area').length).toBe(4);
    expect(container.querySelectorAll('.recharts-reference-line').length).toBe(4);
    expect(container.querySelectorAll('.recharts-scatter-symbol').length).toBe(2 * (5 + 4));
  });

  it('gives the density loss as a share of the baseline density per year, not density units', () => {
    // The outcome is the slope of the percentage of the baseline density lost (spot-analysis.ts, densityLossRate),
    // as the export's dictionary says (%/year).
    const view = renderPage(<FadingPlots result={result} labelOf={labelOf} onShow={vi.fn()} width={640} />, { me: makeMe('researcher') });
    expect(view.getByRole('heading', { name: 'Density loss per year, % of the baseline density' })).toBeTruthy();
    expect(view.container.textContent).toContain('%/yr');
    expect(view.container.textContent).not.toContain('D/yr');
  });

  it('says how many points are shown when the answer carries fewer points than prints', () => {
    // Every point is shown in the fixture: no note.
    const full = renderPage(<FadingPlots result={result} labelOf={labelOf} onShow={vi.fn()} width={640} />, { me: makeMe('researcher') });
    expect(full.queryAllByText(/shown/)).toHaveLength(0);
    full.unmount();
    // The server caps the points per group (evenly spaced by rank); n still counts every print.
    const capped = { ...result, fading: result.fading.map((f, i) => (i === 0 ? { ...f, deltaEPerYear: { ...f.deltaEPerYear, n: 1200, points: f.deltaEPerYear.points.slice(0, 3) } } : f)) };
    const view = renderPage(<FadingPlots result={capped} labelOf={labelOf} onShow={vi.fn()} width={640} />, { me: makeMe('researcher') });
    expect(view.getByText(new RegExp(`${labelOf(result.fading[0]!.key)} 3 of 1,200 shown`))).toBeTruthy();
  });
});
