import { CartesianGrid, ComposedChart, Line, ReferenceArea, ReferenceLine, XAxis, YAxis } from 'recharts';
import { yearLabel } from '@/lib/chart-axis';
import type { ExposureChartData } from '@/features/light/utils/chart-data';
import { formatAxisNumber, formatLuxHours } from '@/features/light/utils/format';
import '@/features/light/components/light-charts.css';

/** Colours on screen; the print stylesheet turns them black and grey. Animation is off. */
const INK = '#201d19';
const IRON = '#1f4b75';
const BUDGET = '#9a2b1d';
const PAST = '#f1e4d2';
const PLANNED = '#dfe8f1';
const GRID = '#ebe4d6';

const MARGIN = { top: 18, right: 24, bottom: 4, left: 12 };

export interface ExposureChartProps {
  data: ExposureChartData;
  annualBudget: number | null;
  label: string;
  describedBy?: string;
  /** A fixed width in px; the chart fills its box when absent. */
  width?: number;
}

/** Cumulative lux-hours over time against the budget line, with each display as a shaded band. */
export function ExposureChart({ data, annualBudget, label, describedBy, width }: ExposureChartProps) {
  const size = width ? { width, height: 260 } : { width: '100%', height: 260 };
  return (
    <div role="img" aria-label={label} aria-describedby={describedBy} className="light-chart w-full">
      <ComposedChart responsive={!width} style={size} width={width} height={width ? 260 : undefined} margin={MARGIN} accessibilityLayer={false}>
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
          domain={data.valueAxis.domain}
          ticks={data.valueAxis.ticks}
          tickFormatter={formatAxisNumber}
          allowDataOverflow
          stroke={INK}
          fontSize={12}
          width={64}
          label={{ value: 'lx·h', angle: -90, position: 'insideLeft', fontSize: 12, fill: INK }}
        />
        {data.bands.map((band) => (
          <ReferenceArea
            key={band.id}
            x1={band.from}
            x2={band.to}
            className={band.planned ? 'chart-band-planned' : 'chart-band'}
            fill={band.planned ? PLANNED : PAST}
            fillOpacity={0.9}
            ifOverflow="hidden"
          />
        ))}
        <ReferenceLine x={data.asOf} stroke={INK} strokeDasharray="1 3" label={{ value: 'today', position: 'insideTopRight', fontSize: 11, fill: INK }} />
        {data.budgetLine ? (
          <Line data={data.budgetLine} dataKey="value" className="chart-budget" stroke={BUDGET} strokeDasharray="2 3" strokeWidth={1.5} dot={false} isAnimationActive={false} />
        ) : null}
        <Line data={data.cumulative} dataKey="value" className="chart-exposure" stroke={IRON} strokeWidth={2} dot={false} isAnimationActive={false} />
      </ComposedChart>
      <ul aria-hidden="true" className="flex flex-wrap gap-x-4 gap-y-1 pl-16 text-xs text-ink-700">
        <li>─ cumulative exposure</li>
        {data.budgetLine && annualBudget !== null ? <li>┈ budget, {formatLuxHours(annualBudget)} a year from the first display</li> : null}
        <li>
          <span className="inline-block h-2 w-3 bg-[#f1e4d2] align-middle print:bg-neutral-300" /> past display
        </li>
        <li>
          <span className="inline-block h-2 w-3 bg-[#dfe8f1] align-middle print:border print:border-black" /> planned display
        </li>
      </ul>
    </div>
  );
}
