import { useNavigate } from 'react-router-dom';
import { CartesianGrid, ComposedChart, ReferenceArea, ReferenceLine, Scatter, XAxis, YAxis } from 'recharts';
import type { CohortResult } from '@toneledger/common/schemas/research';
import { valueAxis } from '@/lib/chart-axis';
import { FigureLink, SERIES, type ShowPrints } from '@/features/research/components/figure-link';
import { fixed } from '@/features/research/utils/words';

type Metric = 'deltaEPerYear' | 'densityLossPerYear';
const METRICS: { key: Metric; title: string; unit: string; digits: number }[] = [
  { key: 'deltaEPerYear', title: 'ΔE00 per year', unit: 'ΔE00/yr', digits: 3 },
  // The loss is a share of the baseline density (as the measurement screens and the export's dictionary say), not density units.
  { key: 'densityLossPerYear', title: 'Density loss per year, % of the baseline density', unit: '%/yr', digits: 3 },
];

/** Fading rates per group: a box (quartiles, median) over every print's rate as a point, and the figures in a table. */
export function FadingPlots({ result, labelOf, onShow, width }: { result: CohortResult; labelOf: (key: string) => string; onShow: ShowPrints; width?: number }) {
  return (
    <section aria-labelledby="fading-heading" className="flex flex-col gap-4">
      <h2 id="fading-heading" className="text-lg">Fading rates</h2>
      <p className="text-sm text-ink-700">At the maximum-density spot, from the baseline through two or more sessions. Each point is a print (it opens the print); the box spans the quartiles, the bar is the median.</p>
      {METRICS.map((m) => (
        <Plot key={m.key} metric={m} result={result} labelOf={labelOf} onShow={onShow} width={width} />
      ))}
    </section>
  );
}

function Plot({ metric, result, labelOf, onShow, width }: { metric: (typeof METRICS)[number]; result: CohortResult; labelOf: (key: string) => string; onShow: ShowPrints; width?: number }) {
  const navigate = useNavigate();
  const rows = result.fading.map((f) => ({ key: f.key, d: f[metric.key] }));
  const all = rows.flatMap((r) => r.d.points.map((p) => p.value));
  const axis = valueAxis(Math.min(0, ...all), Math.max(0, ...all));
  const size = width ? { width, height: 240 } : { width: '100%', height: 240 };
  return (
    <div className="flex flex-col gap-2">
      <h3 className="text-base">{metric.title}</h3>
      {all.length ? (
        <div role="img" aria-label={`${metric.title} per group: points per print, boxes of the quartiles`} className="w-full">
          <ComposedChart responsive={!width} style={size} width={width} height={width ? 240 : undefined} margin={{ top: 8, right: 16, bottom: 4, left: 8 }} accessibilityLayer={false}>
            <CartesianGrid stroke="#ebe4d6" />
            <XAxis type="number" dataKey="x" domain={[-0.5, rows.length - 0.5]} ticks={rows.map((_, i) => i)} tickFormatter={(i: number) => labelOf(rows[i]?.key ?? '')} fontSize={12} allowDataOverflow />
            <YAxis type="number" dataKey="y" domain={axis.domain} ticks={axis.ticks} fontSize={12} width={64} label={{ value: metric.unit, angle: -90, position: 'insideLeft', fontSize: 12 }} />
            {rows.map((r, i) =>
              r.d.q1 !== null && r.d.q3 !== null ? <ReferenceArea key={`box-${r.key}`} x1={i - 0.28} x2={i + 0.28} y1={r.d.q1} y2={r.d.q3} fill={SERIES[i % SERIES.length]} fillOpacity={0.12} stroke={SERIES[i % SERIES.length]} /> : null,
            )}
            {rows.map((r, i) =>
              r.d.median !== null ? <ReferenceLine key={`med-${r.key}`} segment={[{ x: i - 0.28, y: r.d.median }, { x: i + 0.28, y: r.d.median }]} stroke={SERIES[i % SERIES.length]} strokeWidth={2.5} /> : null,
            )}
            {rows.map((r, i) => (
              <Scatter
                key={`pts-${r.key}`}
                data={r.d.points.map((p, j) => ({ x: i + (((j * 37) % 21) - 10) / 50, y: p.value, printId: p.printId }))}
                fill={SERIES[i % SERIES.length]}
                isAnimationActive={false}
                onClick={(point: { payload?: { printId?: string } }) => point.payload?.printId && navigate(`/catalogue/prints/${point.payload.printId}`)}
                cursor="pointer"
              />
            ))}
          </ComposedChart>
        </div>
      ) : (
        <p className="text-sm text-ink-600">No print in these groups has a fading rate yet.</p>
      )}
      {rows.some((r) => r.d.points.length < r.d.n) ? <p className="text-xs text-ink-600">Points: {rows.map((r) => `${labelOf(r.key)} ${r.d.points.length} of ${r.d.n.toLocaleString('en-GB')} shown`).join('; ')} (evenly spaced by rank; the figures count every print).</p> : null}
      <table className="w-full text-sm" aria-label={`${metric.title}: figures per group`}>
        <thead>
          <tr className="text-left text-xs text-ink-700 uppercase">
            <th className="py-1">Group</th><th className="text-right">n</th><th className="text-right">Median</th><th className="text-right">Quartiles</th><th className="text-right">Range</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.key} className="border-t border-paper-200">
              <th scope="row" className="py-1 text-left font-normal">{labelOf(r.key)}</th>
              <td className="text-right"><FigureLink onShow={onShow} ask={{ groupKey: r.key, which: 'with_rate' }} title={`${labelOf(r.key)}, with a fading rate`}>{r.d.n}</FigureLink></td>
              <td className="num text-right">{fixed(r.d.median, metric.digits)}</td>
              <td className="num text-right">{r.d.q1 === null ? '–' : `${fixed(r.d.q1, metric.digits)} – ${fixed(r.d.q3, metric.digits)}`}</td>
              <td className="num text-right">{r.d.min === null ? '–' : `${fixed(r.d.min, metric.digits)} – ${fixed(r.d.max, metric.digits)}`}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
