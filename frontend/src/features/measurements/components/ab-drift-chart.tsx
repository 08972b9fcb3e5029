import { useId, useState } from 'react';
import type { SpotAnalysis } from '@toneledger/common/schemas/measurements';
import { valueAxis, type Axis } from '@/lib/chart-axis';
import { formatDay, formatNumber } from '@/features/measurements/utils/format';
import '@/features/measurements/components/change-chart.css';

/** The colours and grid of the other measurement charts (change-chart.tsx). */
const INK = '#201d19';
const IRON = '#1f4b75';
const SEPIA = '#7b4d24';
const GRID = '#ebe4d6';

const WIDTH = 320;
const HEIGHT = 300;
const M = { top: 12, right: 16, bottom: 40, left: 48 };

export interface DriftPoint {
  sessionId: string;
  measuredOn: string;
  a: number;
  b: number;
  dE00: number | null;
  baseline: boolean;
  comparable: boolean;
}

/** Each session's mean a*, b* at the spot, oldest first, the baseline marked. */
export function driftPoints(analysis: SpotAnalysis): DriftPoint[] {
  return [...analysis.points]
    .sort((x, y) => x.measuredOn.localeCompare(y.measuredOn))
    .map((p) => ({
      sessionId: p.sessionId, measuredOn: p.measuredOn, a: p.lab.a, b: p.lab.b, dE00: p.dE00,
      baseline: analysis.baseline?.sessionId === p.sessionId, comparable: p.comparable,
    }));
}

/**
 * The two axes with the same length per unit, so a shift of 1 in a* looks as long as 1 in b*: each
 * axis is centred on its points and spans the larger of the two ranges (at least 2 units), then
 * rounded by `valueAxis` (chart-axis.ts).
 */
export function driftAxes(points: readonly DriftPoint[]): { a: Axis; b: Axis } {
  const as = points.map((p) => p.a);
  const bs = points.map((p) => p.b);
  const span = Math.max(2, Math.max(...as) - Math.min(...as), Math.max(...bs) - Math.min(...bs)) * 1.2;
  const around = (xs: number[]) => {
    const mid = (Math.max(...xs) + Math.min(...xs)) / 2;
    return valueAxis(mid - span / 2, mid + span / 2, 4);
  };
  return { a: around(as), b: around(bs) };
}

function describe(p: DriftPoint): string {
  const change = p.baseline ? 'baseline' : p.dE00 !== null ? `ΔE00 ${formatNumber(p.dE00)} from the baseline` : 'not comparable with the baseline';
  return `${formatDay(p.measuredOn)}: a* ${formatNumber(p.a)}, b* ${formatNumber(p.b)}, ${change}`;
}

/**
 * Where a spot's colour has drifted in the a*–b* plane, session by session: each session's mean as a
 * point, joined in time order, the baseline ringed, sessions not comparable with the baseline hollow.
 * Hovering or focusing a point (Tab moves through them) shows its date and values below the plot.
 */
export function AbDriftChart({ analysis, label }: { analysis: SpotAnalysis; label: string }) {
  const points = driftPoints(analysis);
  const [active, setActive] = useState<number | null>(null);
  const readoutId = useId();
  if (points.length === 0) return null;
  const axes = driftAxes(points);
  const w = WIDTH - M.left - M.right;
  const h = HEIGHT - M.top - M.bottom;
  const x = (a: number) => M.left + ((a - axes.a.domain[0]) / (axes.a.domain[1] - axes.a.domain[0])) * w;
  const y = (b: number) => M.top + h - ((b - axes.b.domain[0]) / (axes.b.domain[1] - axes.b.domain[0])) * h;
  const path = points.map((p, i) => `${i ? 'L' : 'M'}${x(p.a).toFixed(1)},${y(p.b).toFixed(1)}`).join(' ');
  const shown = active === null ? null : points[active];

  return (
    <figure role="group" aria-label={label} aria-describedby={readoutId} className="measure-chart">
      <svg viewBox={`0 0 ${WIDTH} ${HEIGHT}`} width="100%" style={{ maxWidth: WIDTH }} onMouseLeave={() => setActive(null)}>
        <g className="recharts-cartesian-grid" aria-hidden="true">
          {axes.a.ticks.map((t) => (
            <line key={`a${t}`} x1={x(t)} x2={x(t)} y1={M.top} y2={M.top + h} stroke={GRID} />
          ))}
          {axes.b.ticks.map((t) => (
            <line key={`b${t}`} x1={M.left} x2={M.left + w} y1={y(t)} y2={y(t)} stroke={GRID} />
          ))}
        </g>
        <g aria-hidden="true" fontSize={12} fill={INK}>
          <line className="recharts-cartesian-axis-line" x1={M.left} x2={M.left + w} y1={M.top + h} y2={M.top + h} stroke={INK} />
          <line className="recharts-cartesian-axis-line" x1={M.left} x2={M.left} y1={M.top} y2={M.top + h} stroke={INK} />
          {axes.a.ticks.map((t) => (
            <text key={`a${t}`} x={x(t)} y={M.top + h + 16} textAnchor="middle">
              {formatNumber(t, Number.isInteger(t) ? 0 : 1)}
            </text>
          ))}
          {axes.b.ticks.map((t) => (
            <text key={`b${t}`} x={M.left - 6} y={y(t) + 4} textAnchor="end">
              {formatNumber(t, Number.isInteger(t) ? 0 : 1)}
            </text>
          ))}
          <text x={M.left + w / 2} y={HEIGHT - 4} textAnchor="middle">
            a* (green − / red +)
          </text>
          <text transform={`translate(12 ${M.top + h / 2}) rotate(-90)`} textAnchor="middle">
            b* (blue − / yellow +)
          </text>
        </g>
        <path d={path} className="chart-trend recharts-line-curve" fill="none" stroke={SEPIA} strokeWidth={1.25} aria-hidden="true" />
        {points.map((p, i) => (
          <g key={p.sessionId}>
            {p.baseline ? <circle cx={x(p.a)} cy={y(p.b)} r={7.5} fill="none" stroke={INK} strokeWidth={1.25} aria-hidden="true" /> : null}
            <circle
              data-testid="drift-point"
              cx={x(p.a)}
              cy={y(p.b)}
              r={active === i ? 5.5 : 4}
              className="recharts-line-dot"
              fill={p.comparable ? IRON : '#fff'}
              stroke={IRON}
              strokeWidth={1.5}
              tabIndex={0}
              role="img"
              aria-label={describe(p)}
              onMouseEnter={() => setActive(i)}
              onFocus={() => setActive(i)}
              onBlur={() => setActive(null)}
              style={{ outlineOffset: 2 }}
            />
          </g>
        ))}
      </svg>
      <figcaption id={readoutId} aria-live="polite" className="min-h-5 text-xs text-ink-800">
        {shown ? describe(shown) : `${points.length} ${points.length === 1 ? 'session' : 'sessions'}, oldest to newest along the line; point at or focus a point for its values.`}
      </figcaption>
    </figure>
  );
}
