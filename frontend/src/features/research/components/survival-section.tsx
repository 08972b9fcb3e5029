import { Area, CartesianGrid, ComposedChart, Line, XAxis, YAxis } from 'recharts';
import type { CohortResult } from '@toneledger/common/schemas/research';
import { valueAxis } from '@/lib/chart-axis';
import { FigureLink, SERIES, type ShowPrints } from '@/features/research/components/figure-link';
import { CI_WORDS, fixed, formatP } from '@/features/research/utils/words';

type Survival = CohortResult['survival'];

/** A curve's points for recharts: from S = 1 at 0, then each step with its 95 % band as [lower, upper]. */
export function curvePoints(g: Survival['groups'][number]) {
  const start = { t: 0, s: 1, band: [1, 1] as [number, number] };
  return [start, ...g.steps.map((st) => ({ t: st.t, s: st.s, band: [st.lower ?? st.s, st.upper ?? st.s] as [number, number] }))];
}

/** Kaplan–Meier curves per group with their bands, the number at risk at the ticks, medians, and the log-rank test. */
export function SurvivalSection({ survival, labelOf, onShow, width }: { survival: Survival; labelOf: (key: string) => string; onShow: ShowPrints; width?: number }) {
  const ticks = survival.groups[0]?.atRisk.map((a) => a.t) ?? [];
  const lastT = Math.max(0, ...survival.groups.flatMap((g) => g.steps.map((s) => s.t)), ...ticks);
  const axis = valueAxis(0, lastT || 1, 6);
  const xTicks = ticks.length ? ticks : axis.ticks;
  const size = width ? { width, height: 300 } : { width: '100%', height: 300 };
  return (
    <section aria-labelledby="survival-heading" className="flex flex-col gap-3">
      <h2 id="survival-heading" className="text-lg">Survival: {survival.eventLabel}</h2>
      <p className="text-sm text-ink-700" data-testid="survival-basis">
        Time on the axis: {survival.originLabel}. Shaded: the 95 % interval of each curve, {CI_WORDS[survival.ci].toLowerCase()}.
      </p>
      {survival.groups.some((g) => g.steps.length) ? (
        <div role="img" aria-label={`Kaplan–Meier curves: share without ${survival.eventLabel} over ${survival.originLabel}`} className="w-full">
          <ComposedChart responsive={!width} style={size} width={width} height={width ? 300 : undefined} margin={{ top: 8, right: 24, bottom: 16, left: 8 }} accessibilityLayer={false}>
            <CartesianGrid stroke="#ebe4d6" />
            <XAxis type="number" dataKey="t" domain={[0, Math.max(lastT, xTicks[xTicks.length - 1] ?? axis.domain[1])]} ticks={xTicks} fontSize={12} allowDataOverflow label={{ value: survival.originLabel, position: 'insideBottom', offset: -10, fontSize: 12 }} />
            <YAxis type="number" domain={[0, 1]} ticks={[0, 0.25, 0.5, 0.75, 1]} fontSize={12} width={48} label={{ value: 'share without the event', angle: -90, position: 'insideLeft', fontSize: 11 }} />
            {survival.groups.map((g, i) => (
              <Area key={`band-${g.key}`} data={curvePoints(g)} dataKey="band" type="stepAfter" stroke="none" fill={SERIES[i % SERIES.length]} fillOpacity={0.15} isAnimationActive={false} />
            ))}
            {survival.groups.map((g, i) => (
              <Line key={`km-${g.key}`} data={curvePoints(g)} dataKey="s" type="stepAfter" stroke={SERIES[i % SERIES.length]} strokeWidth={2} dot={false} isAnimationActive={false} name={labelOf(g.key)} />
            ))}
          </ComposedChart>
          <ul className="flex flex-wrap gap-x-4 pl-12 text-xs">
            {survival.groups.map((g, i) => (
              <li key={g.key}>
                <span className="mr-1 inline-block h-0.5 w-4 align-middle" style={{ background: SERIES[i % SERIES.length] }} />
                {labelOf(g.key)}
              </li>
            ))}
          </ul>
        </div>
      ) : (
        <p className="text-sm text-ink-600">No print counts for survival with this origin and event.</p>
      )}
      <table className="text-sm" aria-label="Number at risk">
        <caption className="text-left text-xs font-semibold text-ink-700 uppercase">Number at risk</caption>
        <thead>
          <tr>
            <th className="pr-3 text-left text-xs font-normal text-ink-600">years</th>
            {xTicks.map((t) => <th key={t} className="num px-2 text-right text-xs font-normal text-ink-600">{t}</th>)}
          </tr>
        </thead>
        <tbody>
          {survival.groups.map((g) => (
            <tr key={g.key}>
              <th scope="row" className="pr-3 text-left font-normal">{labelOf(g.key)}</th>
              {xTicks.map((t) => {
                const n = g.atRisk.find((a) => a.t === t)?.n;
                return (
                  <td key={t} className="px-2 text-right">
                    {n === undefined ? '–' : <FigureLink onShow={onShow} ask={{ groupKey: g.key, which: 'at_risk', time: t }} title={`${labelOf(g.key)}, at risk at ${t} years`}>{n}</FigureLink>}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
      <table className="w-full text-sm" aria-label="Curves per group">
        <thead>
          <tr className="text-left text-xs text-ink-700 uppercase">
            <th className="py-1">Group</th><th className="text-right">n</th><th className="text-right">Events</th><th className="text-right">Censored</th><th className="text-right">Median (95 % interval), years</th>
          </tr>
        </thead>
        <tbody>
          {survival.groups.map((g) => (
            <tr key={g.key} className="border-t border-paper-200">
              <th scope="row" className="py-1 text-left font-normal">{labelOf(g.key)}</th>
              <td className="num text-right">{g.n}</td>
              <td className="text-right"><FigureLink onShow={onShow} ask={{ groupKey: g.key, which: 'events' }} title={`${labelOf(g.key)}, with the event`}>{g.events}</FigureLink></td>
              <td className="text-right"><FigureLink onShow={onShow} ask={{ groupKey: g.key, which: 'censored' }} title={`${labelOf(g.key)}, censored`}>{g.censored}</FigureLink></td>
              <td className="num text-right">
                {g.median ? `${fixed(g.median.value, 1)} (${g.median.lower === null ? '–' : fixed(g.median.lower, 1)} to ${g.median.upper === null ? 'not reached' : fixed(g.median.upper, 1)})` : 'not reached'}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <LogRank survival={survival} labelOf={labelOf} onShow={onShow} />
    </section>
  );
}

function LogRank({ survival, labelOf, onShow }: { survival: Survival; labelOf: (key: string) => string; onShow: ShowPrints }) {
  const lr = survival.logRank;
  if (!lr) return <p className="text-sm text-ink-600">No log-rank test: it needs two groups or more with prints that count for survival.</p>;
  return (
    <section aria-labelledby="logrank-heading" className="rounded border border-paper-300 bg-white p-3">
      <h3 id="logrank-heading" className="text-base">Log-rank test</h3>
      <p className="num text-sm" data-testid="logrank-figures">
        χ² = {lr.chi2.toFixed(2)}, df = {lr.df}, {formatP(lr.p)}
      </p>
      <table className="mt-1 text-sm" aria-label="Observed and expected events">
        <thead>
          <tr className="text-left text-xs text-ink-700 uppercase"><th className="pr-4">Group</th><th className="pr-4 text-right">Observed</th><th className="text-right">Expected</th></tr>
        </thead>
        <tbody>
          {lr.groups.map((g) => (
            <tr key={g.key}>
              <th scope="row" className="pr-4 text-left font-normal">{labelOf(g.key)}</th>
              <td className="pr-4 text-right"><FigureLink onShow={onShow} ask={{ groupKey: g.key, which: 'events' }} title={`${labelOf(g.key)}, with the event`}>{g.observed}</FigureLink></td>
              <td className="num text-right">{g.expected.toFixed(2)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <Words title="What the test assumes" items={lr.assumptions} />
      <Words title="Warnings" items={lr.warnings.map((w) => withLabels(w, survival.groups.map((g) => g.key), labelOf))} tone="warn" />
    </section>
  );
}

/** A sentence naming groups by their keys ("alkalineAfterBath=no"), with their labels instead (keys of the factor=value form only, never a plain word). */
export function withLabels(text: string, keys: string[], labelOf: (key: string) => string): string {
  return keys.filter((k) => k.includes('=')).sort((a, b) => b.length - a.length).reduce((t, k) => t.replaceAll(k, labelOf(k)), text);
}

export function Words({ title, items, tone }: { title: string; items: string[]; tone?: 'warn' }) {
  if (!items.length) return null;
  return (
    <div className="mt-2">
      <h4 className={`text-xs font-semibold uppercase ${tone === 'warn' ? 'text-danger-700' : 'text-ink-700'}`}>{title}</h4>
      <ul className="list-disc pl-5 text-sm">
        {items.map((w) => <li key={w}>{w}</li>)}
      </ul>
    </div>
  );
}
