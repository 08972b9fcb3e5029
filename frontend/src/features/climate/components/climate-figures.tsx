import type { ClimateSummary } from '@toneledger/common/schemas/climate';
import { excursionLabel, formatC, formatMinutes, formatPeak, formatPermanence, formatRh, formatShare, formatWhen } from '@/features/climate/utils/format';

function Figure({ label, value, hint }: { label: string; value: string; hint?: string }) {
  return (
    <div className="rounded border border-paper-300 bg-white p-3">
      <dt className="text-xs text-ink-700">{label}</dt>
      <dd className="text-lg font-semibold">{value}</dd>
      {hint ? <dd className="text-xs text-ink-700">{hint}</dd> : null}
    </div>
  );
}

/** The figures of a location over the period. */
export function ClimateFigures({ summary: s }: { summary: ClimateSummary }) {
  const t = s.settings.target;
  return (
    <section aria-labelledby="climate-figures">
      <h2 id="climate-figures" className="mb-2 font-serif text-lg">Figures, {s.from} to {s.to}</h2>
      {s.readings === 0 ? <p className="text-sm text-ink-700">No readings in this period.</p> : null}
      <dl className="grid grid-cols-2 gap-2 md:grid-cols-4">
        <Figure label="Relative permanence" value={formatPermanence(s.permanence)} hint={`against ${s.settings.reference.temperatureC} °C / ${s.settings.reference.rhPercent} % RH`} />
        <Figure label="Temperature (min / mean / max)" value={formatC(s.temperature.mean)} hint={`${formatC(s.temperature.min)} to ${formatC(s.temperature.max)}`} />
        <Figure label="RH (min / mean / max)" value={formatRh(s.rh.mean)} hint={`${formatRh(s.rh.min)} to ${formatRh(s.rh.max)}`} />
        <Figure label="Time outside the targets" value={formatShare(s.outsideEither)}
          hint={`temperature ${formatShare(s.outsideTemperature)} (target ${t.temperatureMinC}–${t.temperatureMaxC} °C), RH ${formatShare(s.outsideRh)} (target ${t.rhMinPercent}–${t.rhMaxPercent} %)`} />
      </dl>
      <p className="mt-2 text-xs text-ink-700">
        {s.readings.toLocaleString('en-GB')} readings covering {formatMinutes(s.coveredMinutes)}; each reading stands for the time until the next.
        {s.gaps.length ? ` ${s.gaps.length} gap${s.gaps.length === 1 ? '' : 's'} in the record left out (${formatMinutes(s.gaps.reduce((a, g) => a + g.minutes, 0))}).` : ''}
      </p>
    </section>
  );
}

/** Where the targets and the model come from, shown beside the figures. */
export function ClimateSources({ settings }: { settings: ClimateSummary['settings'] }) {
  return (
    <aside aria-labelledby="climate-sources" className="rounded border border-paper-300 bg-paper-50 p-3 text-sm">
      <h2 id="climate-sources" className="mb-2 font-serif text-base">Settings and sources</h2>
      <dl className="flex flex-col gap-2">
        <div><dt className="text-xs text-ink-700">Targets</dt><dd>{settings.target.temperatureMinC}–{settings.target.temperatureMaxC} °C, {settings.target.rhMinPercent}–{settings.target.rhMaxPercent} % RH</dd></div>
        <div><dt className="text-xs text-ink-700">Source of the targets</dt><dd>{settings.targetSource}</dd></div>
        <div><dt className="text-xs text-ink-700">Reference climate</dt><dd>{settings.reference.temperatureC} °C, {settings.reference.rhPercent} % RH (permanence 1×)</dd></div>
        <div><dt className="text-xs text-ink-700">Activation energy (Ea)</dt><dd>{settings.activationEnergyKjMol} kJ/mol</dd></div>
        <div><dt className="text-xs text-ink-700">RH exponent</dt><dd>{settings.rhExponent}</dd></div>
        <div><dt className="text-xs text-ink-700">Model</dt><dd>{settings.permanenceSource}</dd></div>
      </dl>
    </aside>
  );
}

export function ExcursionsTable({ summary }: { summary: ClimateSummary }) {
  const list = summary.excursions;
  if (!list.length) return <p className="text-sm text-ink-700">No excursions in this period.</p>;
  const shown = list.slice(0, 200);
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm">
        <caption className="mb-1 text-left font-serif text-lg">Excursions ({list.length})</caption>
        <thead>
          <tr className="border-b border-paper-300 text-left">
            <th scope="col" className="py-1 pr-3">What</th>
            <th scope="col" className="py-1 pr-3">Start</th>
            <th scope="col" className="py-1 pr-3">End</th>
            <th scope="col" className="py-1 pr-3 text-right">Length</th>
            <th scope="col" className="py-1 pr-3 text-right">Peak</th>
          </tr>
        </thead>
        <tbody>
          {shown.map((e) => (
            <tr key={`${e.quantity}-${e.direction}-${e.start}`} className="border-b border-paper-200">
              <td className="py-1 pr-3">{excursionLabel(e)}{e.brief ? <span className="ml-2 rounded bg-paper-200 px-1 text-xs">brief</span> : null}</td>
              <td className="py-1 pr-3">{formatWhen(e.start)}</td>
              <td className="py-1 pr-3">{formatWhen(e.end)}</td>
              <td className="py-1 pr-3 text-right">{formatMinutes(e.minutes)}</td>
              <td className="py-1 pr-3 text-right">{formatPeak(e)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {list.length > shown.length ? <p className="text-xs text-ink-700">The first {shown.length} are listed.</p> : null}
    </div>
  );
}
