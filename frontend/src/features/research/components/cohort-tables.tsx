import { COHORT_FACTORS } from '@toneledger/common/fields/cohort';
import type { CohortResult } from '@toneledger/common/schemas/research';
import { FigureLink, type ShowPrints } from '@/features/research/components/figure-link';
import { Words } from '@/features/research/components/survival-section';
import { fixed, formatP } from '@/features/research/utils/words';

const pct = (x: number) => `${(x * 100).toFixed(1)} %`;

/** Each group's size, how many have a fading rate and how many count for survival; each count opens its prints. */
export function GroupsTable({ result, onShow }: { result: CohortResult; onShow: ShowPrints }) {
  return (
    <table className="w-full text-sm" aria-label="Groups">
      <thead>
        <tr className="text-left text-xs text-ink-700 uppercase">
          <th className="py-1">Group</th><th className="text-right">Prints</th><th className="text-right">With a fading rate</th><th className="text-right">Counting for survival</th>
        </tr>
      </thead>
      <tbody>
        {result.groups.map((g) => (
          <tr key={g.key} className="border-t border-paper-200">
            <th scope="row" className="py-1 text-left font-normal">{g.label}</th>
            <td className="text-right"><FigureLink onShow={onShow} ask={{ groupKey: g.key, which: 'all' }} title={g.label}>{g.size}</FigureLink></td>
            <td className="text-right"><FigureLink onShow={onShow} ask={{ groupKey: g.key, which: 'with_rate' }} title={`${g.label}, with a fading rate`}>{g.withRate}</FigureLink></td>
            <td className="num text-right">{g.withSurvival}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

type CoxTerm = NonNullable<CohortResult['cox']>['terms'][number];

/** A term in people's words from the factor table: "Alkaline after-bath: Yes (against No)", "Toning time (per min)". */
export function termLabel(t: CoxTerm): string {
  const f = COHORT_FACTORS[t.factor] as { label: string; unit?: string; choices?: { labels: Record<string, string> } };
  const word = (v: string) => f.choices?.labels[v] ?? (['yes', 'no', 'unknown'].includes(v) ? v[0]!.toUpperCase() + v.slice(1) : v);
  if (t.level === null) return f.unit ? `${f.label} (per ${f.unit})` : f.label;
  return `${f.label}: ${word(t.level)}${t.reference !== null ? ` (against ${word(t.reference)})` : ''}`;
}

/** The Cox model: hazard ratio per term with its interval and p, the likelihood-ratio test, the proportional-hazards check, warnings. */
export function CoxTable({ cox, onShow }: { cox: NonNullable<CohortResult['cox']>; onShow: ShowPrints }) {
  return (
    <section aria-labelledby="cox-heading" className="flex flex-col gap-2">
      <h2 id="cox-heading" className="text-lg">Cox proportional-hazards model</h2>
      <p className="text-sm text-ink-700">
        <FigureLink onShow={onShow} ask={{ which: 'all' }} title="every print of the query">{cox.n}</FigureLink> prints, {cox.events} events; ties by Efron&apos;s method. A hazard ratio above 1: the event comes sooner than in the reference.
      </p>
      <table className="w-full text-sm" aria-label="Hazard ratios">
        <thead>
          <tr className="text-left text-xs text-ink-700 uppercase"><th className="py-1">Term</th><th className="text-right">Hazard ratio</th><th className="text-right">95 % interval</th><th className="text-right">p</th></tr>
        </thead>
        <tbody>
          {cox.terms.map((t) => (
            <tr key={t.label} className="border-t border-paper-200">
              <th scope="row" className="py-1 text-left font-normal">{termLabel(t)}</th>
              <td className="num text-right">{fixed(t.hazardRatio, 2)}</td>
              <td className="num text-right">{fixed(t.lower, 2)} – {fixed(t.upper, 2)}</td>
              <td className="num text-right">{formatP(t.p)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="num text-sm" data-testid="cox-lr">Likelihood-ratio test: χ² = {cox.likelihoodRatio.chi2.toFixed(2)}, df = {cox.likelihoodRatio.df}, {formatP(cox.likelihoodRatio.p)}</p>
      <div>
        <h3 className="text-base">Do the hazards stay proportional?</h3>
        <ul className="list-disc pl-5 text-sm">
          {cox.proportionalHazards.map((ph) => (
            <li key={ph.label}>
              {(() => { const term = cox.terms.find((t) => t.label === ph.label); return term ? termLabel(term) : ph.label; })()}: {ph.verdict}
              {ph.rho !== null && ph.p !== null ? <span className="num text-ink-600"> (ρ = {ph.rho.toFixed(2)}, {formatP(ph.p)})</span> : null}
            </li>
          ))}
        </ul>
      </div>
      <Words title="Warnings" items={cox.warnings} tone="warn" />
    </section>
  );
}

/** How many prints of each group show each deterioration term, with the share's 95 % interval. */
export function IncidenceTables({ incidence, labelOf, onShow }: { incidence: CohortResult['incidence']; labelOf: (key: string) => string; onShow: ShowPrints }) {
  if (!incidence.length) return null;
  return (
    <section aria-labelledby="incidence-heading" className="flex flex-col gap-2">
      <h2 id="incidence-heading" className="text-lg">Deterioration observed</h2>
      <table className="w-full text-sm" aria-label="Incidence per term">
        <thead>
          <tr className="text-left text-xs text-ink-700 uppercase"><th className="py-1">Observation</th><th>Group</th><th className="text-right">Prints showing it</th><th className="text-right">Share (95 % interval)</th></tr>
        </thead>
        <tbody>
          {incidence.flatMap((inc) =>
            inc.groups.map((g, i) => (
              <tr key={`${inc.term}-${g.key}`} className={i === 0 ? 'border-t border-paper-300' : ''}>
                <th scope="row" className="py-1 text-left font-normal">{i === 0 ? inc.label : ''}</th>
                <td>{labelOf(g.key)}</td>
                <td className="text-right">
                  <FigureLink onShow={onShow} ask={{ groupKey: g.key, which: 'term', term: inc.term }} title={`${labelOf(g.key)}, showing ${inc.label}`}>{g.count}</FigureLink> of {g.n}
                </td>
                <td className="num text-right">{pct(g.share)} ({pct(g.lower)} – {pct(g.upper)})</td>
              </tr>
            )),
          )}
        </tbody>
      </table>
    </section>
  );
}
