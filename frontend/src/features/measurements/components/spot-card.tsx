import { useId, useMemo, type ReactNode } from 'react';
import { SPOT_PURPOSE_LABELS, type MeasurementSession, type SpotAnalysis } from '@toneledger/common/schemas/measurements';
import { Button } from '@/components/ui/button';
import { formatDateTime } from '@/lib/format';
import { BaselineControl } from '@/features/measurements/components/baseline-control';
import { ChangeChart, DensityChart } from '@/features/measurements/components/change-chart';
import { AbDriftChart } from '@/features/measurements/components/ab-drift-chart';
import { changeChartData } from '@/features/measurements/utils/chart-data';
import { formatDay, formatNumber, formatRange, formatSigned, projectionText, rateText, sentence } from '@/features/measurements/utils/format';

function Figure({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="border-b border-paper-200 py-1.5 last:border-b-0">
      <dt className="text-xs font-semibold tracking-wide text-ink-700 uppercase">{term}</dt>
      <dd className="num text-sm text-ink-900">{children}</dd>
    </div>
  );
}

/** The latest comparable point with a ΔE00, or null. */
export function latestPoint(analysis: SpotAnalysis) {
  const points = analysis.points.filter((p) => p.comparable && p.dE00 !== null);
  return points.sort((a, b) => a.measuredOn.localeCompare(b.measuredOn)).at(-1) ?? null;
}

/** One sentence for people who cannot see the chart: the latest change and the rate. */
export function chartSummary(analysis: SpotAnalysis): string {
  const latest = latestPoint(analysis);
  const first = latest
    ? `Latest ΔE00 ${formatNumber(latest.dE00!)} on ${formatDay(latest.measuredOn)}, against the baseline.`
    : 'No comparable measurement against a baseline yet.';
  const rate = analysis.rate?.ok ? `Rate ${rateText(analysis.rate)}.` : rateText(analysis.rate);
  return `${first} ${rate} Projection: ${projectionText(analysis.projection)}.`;
}

/**
 * The density's rate in both units: D per year (the change of density itself, negative while it
 * falls) and % of the baseline density lost per year. One refusal is said once.
 */
export function densityRateLines(analysis: Pick<SpotAnalysis, 'densityChangeRate' | 'densityLossRate'>): string[] {
  const change = analysis.densityChangeRate;
  if (!change) return [];
  if (!change.ok) return [rateText(change)];
  const lines = [`Change ${rateText(change, 'D/year', 3)}`];
  const loss = analysis.densityLossRate;
  if (loss?.ok) lines.push(`Loss ${formatNumber(loss.slopePerYear)} % of the baseline density per year (95 % CI ${formatRange(loss.ci95[0], loss.ci95[1])})`);
  return lines;
}

export interface SpotCardProps {
  analysis: SpotAnalysis;
  threshold: number;
  sessions: MeasurementSession[];
  mayWrite: boolean;
  onEdit: () => void;
}

/** One spot: its change over time as a chart, the figures beside it, what is not plotted and why, and its baseline. */
export function SpotCard({ analysis, threshold, sessions, mayWrite, onEdit }: SpotCardProps) {
  const { spot } = analysis;
  const headingId = useId();
  const summaryId = useId();
  const densityId = useId();
  const data = useMemo(() => changeChartData(analysis, threshold), [analysis, threshold]);
  const latest = latestPoint(analysis);
  const latestDensity =
    analysis.points
      .filter((p) => p.comparable && p.densityLossPercent !== null)
      .sort((a, b) => a.measuredOn.localeCompare(b.measuredOn))
      .at(-1) ?? null;
  const spotSessions = sessions.filter((s) => s.readings.some((r) => r.spotId === spot.id));
  const baselineSession = analysis.baseline ? sessions.find((s) => s.id === analysis.baseline!.sessionId) : null;

  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4 print:break-inside-avoid print:border-black">
      <header className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <div>
          <h2 id={headingId} className="text-lg">
            {spot.name}
          </h2>
          <p className="text-xs text-ink-700">
            {SPOT_PURPOSE_LABELS[spot.purpose]}
            {spot.notes ? ` · ${spot.notes}` : ''}
          </p>
        </div>
        {mayWrite ? (
          <Button size="sm" variant="quiet" onClick={onEdit} aria-label={`Edit spot ${spot.name}`} className="print:hidden">
            Edit spot
          </Button>
        ) : null}
      </header>

      <div className="grid gap-4 lg:grid-cols-[minmax(0,3fr)_minmax(16rem,2fr)]">
        <div className="min-w-0">
          {data.observed.length > 0 ? (
            <ChangeChart data={data} threshold={threshold} label={`Colour change (ΔE00) at ${spot.name} over time`} describedBy={summaryId} />
          ) : (
            <p className="rounded bg-paper-100 px-3 py-6 text-center text-sm text-ink-700">Nothing to plot yet: no comparable measurement at this spot.</p>
          )}
          <p id={summaryId} className="mt-1 text-xs text-ink-700">
            {chartSummary(analysis)}
          </p>
          {data.projectionCut ? <p className="text-xs text-ink-700">The projection runs beyond the right edge of the chart.</p> : null}
          {analysis.points.length > 0 ? (
            <div className="mt-3">
              <h3 className="font-sans text-sm font-semibold">Drift in a* and b*</h3>
              <AbDriftChart analysis={analysis} label={`Drift of a* and b* at ${spot.name}, session by session`} />
            </div>
          ) : null}
          {data.densityLoss.length > 0 ? (
            <div className="mt-3">
              <DensityChart points={data.densityLoss} timeAxis={data.timeAxis} valueAxis={data.densityAxis} label={`Density loss at ${spot.name} over time`} describedBy={densityId} />
              <p id={densityId} className="mt-1 text-xs text-ink-700">
                {latestDensity
                  ? `Latest density loss ${formatNumber(latestDensity.densityLossPercent!, 1)} % of the baseline density, on ${formatDay(latestDensity.measuredOn)}.`
                  : ''}
              </p>
            </div>
          ) : null}
        </div>

        <dl>
          <Figure term="Latest ΔE00">
            {latest ? (
              <>
                <span className="text-base font-semibold">{formatNumber(latest.dE00!)}</span> on {formatDay(latest.measuredOn)}
                {latest.dE00! >= threshold ? <span className="ml-1 font-medium text-danger-700">(at or beyond the threshold)</span> : null}
              </>
            ) : (
              'No comparable measurement yet'
            )}
          </Figure>
          {latest && latest.dLPrime !== null && latest.dCPrime !== null && latest.dHPrime !== null ? (
            <Figure term="ΔE00 components">
              ΔL′ {formatSigned(latest.dLPrime)} · ΔC′ {formatSigned(latest.dCPrime)} · ΔH′ {formatSigned(latest.dHPrime)}
              {latest.dominant ? <span className="block">Mainly {latest.dominant}</span> : null}
            </Figure>
          ) : null}
          <Figure term="Rate">{rateText(analysis.rate)}</Figure>
          <Figure term="Noticeable change">{sentence(projectionText(analysis.projection))}</Figure>
          {latestDensity || analysis.densityChangeRate ? (
            <Figure term="Density">
              {latestDensity ? (
                <span className="block">
                  {latestDensity.density !== null ? `D ${formatNumber(latestDensity.density)}, ` : ''}
                  {formatNumber(latestDensity.densityLossPercent!, 1)} % lost since the baseline
                </span>
              ) : null}
              {densityRateLines(analysis).map((line) => (
                <span key={line} className="block">
                  {line}
                </span>
              ))}
            </Figure>
          ) : null}
          <Figure term="Baseline">
            {analysis.baseline ? (
              <>
                {formatDay(analysis.baseline.measuredOn)}
                {baselineSession ? ` · ${baselineSession.illuminant}/${baselineSession.observer}° · ${baselineSession.geometry}` : ''}
                <span className="block text-xs text-ink-700">
                  {spot.baseline && analysis.baseline.chosen
                    ? `Chosen${spot.baseline.chosenBy ? ` by ${spot.baseline.chosenBy}` : ''} on ${formatDateTime(spot.baseline.chosenAt)}: ${spot.baseline.reason}`
                    : 'The first comparable session (automatic)'}
                </span>
              </>
            ) : (
              'None yet'
            )}
          </Figure>
        </dl>
      </div>

      {data.excluded.length > 0 ? (
        <div className="mt-3">
          <h3 className="font-sans text-sm font-semibold">Not plotted: not comparable with the baseline</h3>
          <ul className="mt-1 list-disc pl-5 text-sm">
            {data.excluded.map((p) => (
              <li key={p.sessionId}>
                <time dateTime={p.measuredOn}>{formatDay(p.measuredOn)}</time>: {p.reason}
              </li>
            ))}
          </ul>
        </div>
      ) : null}

      {mayWrite && spotSessions.length > 0 ? (
        <div className="mt-3">
          <BaselineControl spot={spot} sessions={spotSessions} />
        </div>
      ) : null}
    </section>
  );
}
