import { useState, type ReactNode } from 'react';
import { CartesianGrid, ComposedChart, Line, ReferenceArea, ReferenceLine, XAxis, YAxis } from 'recharts';
import type { ChangeChartData, ChartPoint } from '@/features/measurements/utils/chart-data';
import { yearLabel, type Axis } from '@/lib/chart-axis';
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

const CHART_MARGIN = { top: 18, right: 24, bottom: 4, left: 4 };

const dayOf = (t: number) => new Date(t).toISOString().slice(0, 10);

/**
 * Values on hover and focus: pointing at a measured point shows its day and value under the chart;
 * focusing the chart (Tab) shows every plotted value there, so a keyboard reaches them too.
 */
function useReadout(points: readonly ChartPoint[], format: (p: ChartPoint) => string) {
  const [hovered, setHovered] = useState<ChartPoint | null>(null);
  const [focused, setFocused] = useState(false);
  const dot = (color: string, r: number) =>
    function Dot(props: { cx?: number; cy?: number; payload?: ChartPoint; index?: number }): ReactNode {
      if (props.cx === undefined || props.cy === undefined || !props.payload) return null;
      const point = props.payload;
      return (
        <circle
          key={`dot-${props.index}`}
          cx={props.cx}
          cy={props.cy}
          r={hovered === point ? r + 2 : r}
          fill={color}
          stroke={color}
          className="recharts-line-dot"
          onMouseEnter={() => setHovered(point)}
          onMouseLeave={() => setHovered(null)}
        />
      );
    };
  const text = hovered ? format(hovered) : focused ? points.map(format).join('; ') : '';
  const focusProps = { tabIndex: 0, onFocus: () => setFocused(true), onBlur: () => setFocused(false) };
  const readout = (
    <p aria-live="polite" className="min-h-4 pl-12 text-xs text-ink-800 print:hidden">
      {text}
    </p>
  );
  return { dot, focusProps, readout };
}

export interface ChangeChartProps {
  data: ChangeChartData;
  threshold: number;
  /** Accessible name of the chart. */
  label: string;
  /** Id of the element whose text describes the chart (latest ΔE00, rate). */
  describedBy: string;
}

/** ΔE00 against the baseline over time, with the noticeable-change threshold, the fitted trend and its projection. */
export function ChangeChart({ data, threshold, label, describedBy }: ChangeChartProps) {
  const { dot, focusProps, readout } = useReadout(data.observed, (p) => `${dayOf(p.t)}: ΔE00 ${p.value.toFixed(2)}`);
  return (
    <div role="img" aria-label={label} aria-describedby={describedBy} className="measure-chart w-full focus-visible:outline-2" {...focusProps}>
      <ComposedChart responsive style={{ width: '100%', height: 260 }} margin={CHART_MARGIN} accessibilityLayer={false}>
        <CartesianGrid stroke={GRID} />
        <XAxis
          type="number"
          dataKey="t"
          domain={data.timeAxis.domain}
          ticks={data.timeAxis.ticks}
          tickFormatter={yearLabel}
          allowDataOverflow
          stroke={INK}
          fontSize={12}
        />
        <YAxis
          type="number"
          dataKey="value"
          domain={data.changeAxis.domain}
          ticks={data.changeAxis.ticks}
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
          dot={dot(IRON, 3.5)}
          isAnimationActive={false}
        />
      </ComposedChart>
      {readout}
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
export function DensityChart({ points, timeAxis, valueAxis, label, describedBy }: { points: ChartPoint[]; timeAxis: Axis; valueAxis: Axis; label: string; describedBy: string }) {
  const { dot, focusProps, readout } = useReadout(points, (p) => `${dayOf(p.t)}: density loss ${p.value.toFixed(1)} %`);
  return (
    <div role="img" aria-label={label} aria-describedby={describedBy} className="measure-chart w-full focus-visible:outline-2" {...focusProps}>
      <ComposedChart responsive style={{ width: '100%', height: 150 }} margin={CHART_MARGIN} accessibilityLayer={false}>
        <CartesianGrid stroke={GRID} />
        <XAxis type="number" dataKey="t" domain={timeAxis.domain} ticks={timeAxis.ticks} tickFormatter={yearLabel} allowDataOverflow stroke={INK} fontSize={12} />
        <YAxis
          type="number"
          dataKey="value"
          domain={valueAxis.domain}
          ticks={valueAxis.ticks}
          allowDataOverflow
          stroke={INK}
          fontSize={12}
          width={44}
          label={{ value: 'Density loss %', angle: -90, position: 'insideLeft', fontSize: 11, fill: INK, dy: 40 }}
        />
        <ReferenceLine y={0} stroke={INK} />
        <Line data={points} dataKey="value" className="chart-density" stroke={INK} strokeWidth={1} dot={dot(INK, 3)} isAnimationActive={false} />
      </ComposedChart>
      {readout}
    </div>
  );
}
