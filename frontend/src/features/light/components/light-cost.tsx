import { useId } from 'react';
import { CartesianGrid, ComposedChart, Line, XAxis, YAxis } from 'recharts';
import type { z } from 'zod';
import type { lightCostSchema } from '@toneledger/common/schemas/light';
import { valueAxis } from '@/lib/chart-axis';
import { formatDeltaE } from '@/features/light/utils/format';

type LightCost = z.infer<typeof lightCostSchema>;
type CostFit = Extract<LightCost, { status: 'ok' }>;

const INK = '#201d19';
const IRON = '#1f4b75';
const SEPIA = '#7b4d24';
const GRID = '#ebe4d6';

/** The cost as one sentence: "ΔE00 per million lux-hours: 0.80 (95 % interval 0.70–0.91, n = 5, spot B)". */
export function costSentence(cost: CostFit): string {
  return `ΔE00 per million lux-hours: ${formatDeltaE(cost.slopePerMlxh)} (95 % interval ${formatDeltaE(cost.ci95[0])}–${formatDeltaE(cost.ci95[1])}, n = ${cost.n}, spot ${cost.spotLabel})`;
}

/** ΔE00 against cumulative exposure in million lux-hours, with the fitted line through the baseline. */
function CostScatter({ cost, describedBy }: { cost: CostFit; describedBy: string }) {
  const x = valueAxis(0, Math.max(...cost.points.map((p) => p.megaLuxHours), 0), 4);
  const y = valueAxis(0, Math.max(...cost.points.map((p) => p.deltaE00), cost.slopePerMlxh * x.domain[1], 0), 4);
  const points = cost.points.map((p) => ({ t: p.megaLuxHours, value: p.deltaE00 }));
  const fit = [
    { t: 0, value: 0 },
    { t: x.domain[1], value: cost.slopePerMlxh * x.domain[1] },
  ];
  return (
    <div role="img" aria-label="ΔE00 against exposure in million lux-hours, with the fitted line" aria-describedby={describedBy} className="light-chart w-full max-w-md">
      <ComposedChart responsive style={{ width: '100%', height: 180 }} margin={{ top: 12, right: 16, bottom: 14, left: 4 }} accessibilityLayer={false}>
        <CartesianGrid stroke={GRID} />
        <XAxis
          type="number"
          dataKey="t"
          domain={x.domain}
          ticks={x.ticks}
          allowDataOverflow
          stroke={INK}
          fontSize={11}
          label={{ value: 'million lx·h', position: 'insideBottom', offset: -10, fontSize: 11, fill: INK }}
        />
        <YAxis type="number" dataKey="value" domain={y.domain} ticks={y.ticks} allowDataOverflow stroke={INK} fontSize={11} width={40} label={{ value: 'ΔE00', angle: -90, position: 'insideLeft', fontSize: 11, fill: INK }} />
        <Line data={fit} dataKey="value" className="chart-budget" stroke={SEPIA} strokeWidth={1.5} dot={false} isAnimationActive={false} />
        <Line data={points} dataKey="value" stroke="none" dot={{ r: 3.5, fill: IRON, stroke: IRON }} isAnimationActive={false} />
      </ComposedChart>
    </div>
  );
}

/** What light has cost the print, from its measurements; or, honestly, why that cannot be said yet. */
export function LightCostSection({ cost }: { cost: LightCost }) {
  const sentenceId = useId();
  return (
    <div className="flex flex-col gap-2">
      <h3 className="font-sans text-xs font-semibold tracking-wider text-ink-700 uppercase">Light cost</h3>
      {cost.status === 'not_enough_data' ? (
        <p className="text-sm text-ink-800">
          <span className="font-medium">Not enough data.</span> {cost.reason}
        </p>
      ) : (
        <>
          <p id={sentenceId} className="num text-sm text-ink-900">
            {costSentence(cost)}
          </p>
          <CostScatter cost={cost} describedBy={sentenceId} />
          <div className="text-xs text-ink-700">
            <p className="font-medium">Assumptions</p>
            <ul className="list-disc pl-5">
              {cost.assumptions.map((a) => (
                <li key={a}>{a}</li>
              ))}
            </ul>
          </div>
        </>
      )}
    </div>
  );
}
