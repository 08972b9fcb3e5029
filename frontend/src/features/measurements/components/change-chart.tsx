import { CartesianGrid, ComposedChart, Line, ReferenceArea, ReferenceLine, XAxis, YAxis } from 'recharts';
import type { ChangeChartData, ChartPoint } from '@/features/measurements/utils/chart-data';
import { formatThreshold } from '@/features/measurements/utils/format';
import '@/features/measurements/components/change-chart.css';

/**
 * Colours on screen; the print stylesheet turns every series black or grey. Animation is off,
 * so a printed or reduced-motion page shows the finished chart.
 */
const INK = '#201d19';
const IRON = '#1f4b75';
const SEPIA = '#7b4d24';
const THRESHOLD = '#9a2b1d';
const BAND = '#f1e4d2';
const GRID = '#ebe4d6';

function yearTicks([start, end]: [number, number]): number[] {
  const first = new Date(start).getUTCFullYear();
  const last = new Date(end).getUTCFullYear() + 1;
  const span = Math.max(1, last - first);
  const step = [1, 2, 5, 10, 20, 25, 50].find((s) => span / s <= 8) ?? 100;
  const ticks: number[] = [];
  for (let y = Math.ceil(first / step) * step; y <= last; y += step) {
    const t = Date.UTC(y, 0, 1);
    if (t >= start && t <= end) ticks.push(t);
  }
  return ticks.length ? ticks : [start, end];
}

const yearOf = (t: number) => String(new Date(t).getUTCFullYear());

/** Round steps on the value axis: 0, 0.5, 1… or 0, 1, 2… or 0, 5, 10… */
function valueTicks(max: number): number[] {
  const step = [0.25, 0.5, 1, 2, 5, 10, 20, 50].find((s) => max / s <= 6) ?? 100;
  const ticks: number[] = [];
  for (let v = 0; v <= max + 1e-9; v += step) ticks.push(Math.round(v * 100) / 100);
  return ticks;
}

const CHART_MARGIN = { top: 18, right: 24, bottom: 4, left: 4 };

export interface ChangeChartProps {
  data: ChangeChartData;
  threshold: number;
  /** Accessible name of the chart. */
  label: string;
  /** Id of the element whose text describes the chart (latest ΔE00, rate). */
  describedBy: string;
}

/** ΔE00 against the baseline over time, with the noticeable-change threshold, the fitted trend and its projection. */
/** A little room at both ends of the time axis, so the first and last sessions are not drawn on the axes. */
export function padded([start, end]: [number, number]): [number, number] {
  const pad = (end - start) * 0.03;
  return [start - pad, end + pad];
}

export function ChangeChart({ data, threshold, label, describedBy }: ChangeChartProps) {
  const ticks = yearTicks(data.domain);
  return (
    <div role="img" aria-label={label} aria-describedby={describedBy} className="measure-chart w-full">
      <ComposedChart responsive style={{ width: '100%', height: 260 }} margin={CHART_MARGIN} accessibilityLayer={false}>
        <CartesianGrid stroke={GRID} />
        <XAxis
          type="number"
          dataKey="t"
          domain={padded(data.domain)}
          ticks={ticks}
          tickFormatter={yearOf}
          allowDataOverflow
          stroke={INK}
          fontSize={12}
        />
        <YAxis
          type="number"
          dataKey="value"
          domain={[0, data.yMax]}
          ticks={valueTicks(data.yMax)}
          allowDataOverflow
          stroke={INK}
          fontSize={12}
          width={44}
          label={{ value: 'ΔE00', angle: -90, position: 'insideLeft', fontSize: 12, fill: INK }}
        />
        {data.band ? (
          <ReferenceArea x1={data.band.from} x2={data.band.to} className="chart-band" fill={BAND} fillOpacity={0.9} ifOverflow="hidden" />
        ) : null}
        <ReferenceLine
          y={threshold}
          className="chart-threshold"
          stroke={THRESHOLD}
          strokeDasharray="2 3"
          label={{ value: `ΔE00 ${formatThreshold(threshold)}`, position: 'insideTopLeft', fontSize: 12, fill: THRESHOLD }}
        />
        {data.trend ? (
          <Line data={data.trend} dataKey="value" className="chart-trend" stroke={SEPIA} strokeWidth={1.5} dot={false} isAnimationActive={false} />
        ) : null}
        {data.projection ? (
          <Line
            data={data.projection}
            dataKey="value"
            className="chart-projection"
            stroke={SEPIA}
            strokeWidth={1.5}
            strokeDasharray="6 4"
            dot={false}
            isAnimationActive={false}
          />
        ) : null}
        <Line
          data={data.observed}
          dataKey="value"
          className="chart-observed"
          stroke="none"
          dot={{ r: 3.5, fill: IRON, stroke: IRON }}
          isAnimationActive={false}
        />
      </ComposedChart>
      <ul aria-hidden="true" className="flex flex-wrap gap-x-4 gap-y-1 pl-12 text-xs text-ink-700">
        <li>
          <span className="text-iron-700 print:text-black">●</span> measured
        </li>
        {data.trend ? <li>─ fitted trend</li> : null}
        {data.projection ? <li>╌ projection</li> : null}
        {data.band ? <li>shaded: projection interval (95 %)</li> : null}
        <li>┈ noticeable change</li>
      </ul>
    </div>
  );
}

/** Density lost since the baseline, in percent, over the same years. */
export function DensityChart({ points, domain, label, describedBy }: { points: ChartPoint[]; domain: [number, number]; label: string; describedBy: string }) {
  const highest = Math.max(1, ...points.map((p) => p.value));
  const lowest = Math.min(0, ...points.map((p) => p.value));
  return (
    <div role="img" aria-label={label} aria-describedby={describedBy} className="measure-chart w-full">
      <ComposedChart responsive style={{ width: '100%', height: 150 }} margin={CHART_MARGIN} accessibilityLayer={false}>
        <CartesianGrid stroke={GRID} />
        <XAxis type="number" dataKey="t" domain={padded(domain)} ticks={yearTicks(domain)} tickFormatter={yearOf} allowDataOverflow stroke={INK} fontSize={12} />
        <YAxis
          type="number"
          dataKey="value"
          domain={[Math.floor(lowest), Math.ceil(highest * 1.15)]}
          allowDecimals={false}
          stroke={INK}
          fontSize={12}
          width={44}
          label={{ value: 'Density loss %', angle: -90, position: 'insideLeft', fontSize: 11, fill: INK, dy: 40 }}
        />
        <ReferenceLine y={0} stroke={INK} />
        <Line data={points} dataKey="value" className="chart-density" stroke={INK} strokeWidth={1} dot={{ r: 3, fill: INK, stroke: INK }} isAnimationActive={false} />
      </ComposedChart>
    </div>
  );
}
