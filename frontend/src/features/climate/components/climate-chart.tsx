import { CartesianGrid, ComposedChart, Line, ReferenceArea, XAxis, YAxis } from 'recharts';
import type { ClimateSeries, ClimateSummary } from '@toneledger/common/schemas/climate';

/** Colours on screen; animation is off. */
const INK = '#201d19';
const TEMP = '#9a2b1d';
const RH = '#1f4b75';
const BAND = '#e3eedf';
const EXCURSION = '#f4d9cf';
const GRID = '#ebe4d6';

const dayLabel = (t: number) => new Date(t).toISOString().slice(0, 10);
/** Times of day (UTC) when the period is a few days, dates otherwise. */
const timeLabel = (t: number) => new Date(t).toISOString().slice(11, 16);

export interface ClimateChartProps {
  series: ClimateSeries;
  summary: Pick<ClimateSummary, 'excursions' | 'settings'>;
  quantity: 'temperature' | 'rh';
  /** A fixed width in px; the chart fills its box when absent. */
  width?: number;
}

/** Bucket means with their min–max range, the target band shaded, excursions (not brief) marked as bands across the time axis. */
export function ClimateChart({ series, summary, quantity, width }: ClimateChartProps) {
  const t = quantity === 'temperature';
  const target = summary.settings.target;
  const [lo, hi] = t ? [target.temperatureMinC, target.temperatureMaxC] : [target.rhMinPercent, target.rhMaxPercent];
  const data = series.points.map((p) => ({
    t: Date.parse(p.at), value: t ? p.temperatureC : p.rhPercent, min: t ? p.temperatureMinC : p.rhMin, max: t ? p.temperatureMaxC : p.rhMax,
  }));
  const start = Date.parse(`${series.from}T00:00:00Z`);
  const end = Date.parse(`${series.to}T00:00:00Z`) + 86_400_000;
  const excursions = summary.excursions.filter((e) => e.quantity === quantity && !e.brief);
  const size = width ? { width, height: 220 } : { width: '100%', height: 220 };
  const label = `${t ? 'Temperature' : 'Relative humidity'} from ${series.from} to ${series.to}: ${data.length} points, target ${lo}–${hi} ${t ? '°C' : '%'}, ${excursions.length} excursions marked`;
  return (
    <figure className="w-full">
      <figcaption className="mb-1 text-sm font-semibold">{t ? 'Temperature (°C)' : 'Relative humidity (%)'}</figcaption>
      <div role="img" aria-label={label}>
        <ComposedChart responsive={!width} style={size} width={width} height={width ? 220 : undefined} data={data} margin={{ top: 8, right: 16, bottom: 4, left: 4 }} accessibilityLayer={false}>
          <CartesianGrid stroke={GRID} />
          <XAxis type="number" dataKey="t" domain={[start, end]} tickFormatter={end - start <= 3 * 86_400_000 ? timeLabel : dayLabel} stroke={INK} fontSize={11} allowDataOverflow />
          <YAxis type="number" stroke={INK} fontSize={11} width={40} domain={['auto', 'auto']} />
          <ReferenceArea y1={lo} y2={hi} fill={BAND} fillOpacity={0.7} ifOverflow="extendDomain" className="chart-target" />
          {excursions.map((e) => (
            <ReferenceArea key={`${e.quantity}-${e.direction}-${e.start}`} x1={Date.parse(e.start)} x2={Date.parse(e.end)} fill={EXCURSION} fillOpacity={0.9} ifOverflow="hidden" className="chart-excursion" />
          ))}
          <Line dataKey="max" stroke={t ? TEMP : RH} strokeOpacity={0.3} dot={false} isAnimationActive={false} />
          <Line dataKey="min" stroke={t ? TEMP : RH} strokeOpacity={0.3} dot={false} isAnimationActive={false} />
          <Line dataKey="value" stroke={t ? TEMP : RH} strokeWidth={1.5} dot={false} isAnimationActive={false} />
        </ComposedChart>
      </div>
      <ul aria-hidden="true" className="flex flex-wrap gap-x-4 text-xs text-ink-700">
        <li>─ mean of each {series.bucketMinutes >= 60 ? `${Math.round(series.bucketMinutes / 60)} h` : `${series.bucketMinutes} min`}, faint lines its min and max</li>
        <li><span className="inline-block h-2 w-3 bg-[#e3eedf] align-middle" /> target</li>
        <li><span className="inline-block h-2 w-3 bg-[#f4d9cf] align-middle" /> excursion</li>
      </ul>
    </figure>
  );
}
