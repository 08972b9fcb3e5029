import { useId } from 'react';
import { CartesianGrid, ComposedChart, Line, XAxis, YAxis } from 'recharts';
import type { z } from 'zod';
import type { lightCostSchema } from '@toneledger/common/schemas/light';
import { predictDisplayCost } from '@toneledger/common/domain/light-cost';
import { valueAxis } from '@/lib/chart-axis';
import { formatDeltaE, formatLuxHours } from '@/features/light/utils/format';

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

/** A small change with the digits it needs: 0.00704 → "0.007", 0.8 → "0.80". */
const formatChange = (n: number) => (Math.abs(n) < 0.1 ? n.toFixed(3) : n.toFixed(2));

/**
 * What the planned displays are expected to add (the fitted rate times their lux-hours), from the
 * last measured ΔE00, and whether that reaches the noticeable change (when the threshold is known).
 */
export function plannedCostSentence(cost: CostFit, plannedLuxHours: number, threshold: number | null): string {
  const last = cost.points.at(-1);
  const current = last?.deltaE00 ?? 0;
  const p = predictDisplayCost(cost, plannedLuxHours, current, threshold ?? undefined);
  const added = `The planned displays (${formatLuxHours(plannedLuxHours)}) are expected to add ΔE00 ${formatChange(p.addedDeltaE)} (95 % interval ${formatChange(p.addedInterval[0])}–${formatChange(p.addedInterval[1])})`;
  const from = last ? `; from ΔE00 ${formatChange(current)} measured on ${last.date}, that makes ${formatChange(p.expectedDeltaE)}` : '';
  if (threshold === null) return `${added}${from}.`;
  const limit = `the noticeable change of ΔE00 ${formatDeltaE(threshold)}`;
  const verdict = p.alreadyOver
    ? `already at or past ${limit}`
    : p.crosses
      ? `reaching ${limit}`
      : p.mayCross
        ? `below ${limit}, though the upper end of the interval reaches it`
        : `below ${limit}`;
  return `${added}${from}: ${verdict}.`;
}

/** What light has cost the print, from its measurements; or, honestly, why that cannot be said yet. */
export function LightCostSection({ cost, planned, threshold }: { cost: LightCost; planned: number; threshold: number | null }) {
  const sentenceId = useId();
  return (
    <div className="flex flex-col gap-2">
      <h3 className="font-sans text-xs font-semibold tracking-wider text-ink-700 uppercase">Light cost</h3>
      {cost.status === 'not_enough_data' ? (
        <p className="text-sm text-ink-800">
          {/* The reason may already say so; the words are not repeated. */}
          {/^not enough data/i.test(cost.reason) ? null : <span className="font-medium">Not enough data. </span>}
          {cost.reason}
        </p>
      ) : (
        <>
          <p id={sentenceId} className="num text-sm text-ink-900">
            {costSentence(cost)}
          </p>
          {planned > 0 ? <p className="num text-sm text-ink-900">{plannedCostSentence(cost, planned, threshold)}</p> : null}
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
