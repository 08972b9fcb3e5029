import { useEffect } from 'react';
import { useWatch } from 'react-hook-form';
import { COHORT_FACTORS, COHORT_FACTOR_CODES, type CohortFactorCode } from '@toneledger/common/fields/cohort';
import { GRADES, GRADE_LABELS } from '@toneledger/common/schemas/condition';
import { cohortQuerySchema, type CohortQuery } from '@toneledger/common/schemas/research';
import { NumberInput, SelectInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { CheckGroup } from '@/features/research/components/check-group';
import { FactorFilter } from '@/features/research/components/factor-filter';
import { useTerms } from '@/features/research/api/research';
import { fieldFor, filteredFactors, toBody, toValues, type BuilderValues } from '@/features/research/utils/builder-form';
import { EVENT_WORDS, ORIGIN_WORDS, CI_WORDS } from '@/features/research/utils/words';

const FACTOR_OPTIONS = COHORT_FACTOR_CODES.map((c) => ({ value: c, label: COHORT_FACTORS[c].label }));
const GROUP_OPTIONS = COHORT_FACTOR_CODES.map((c) => ({
  value: c,
  label: COHORT_FACTORS[c].kind === 'number' ? `${COHORT_FACTORS[c].label} (bands)` : COHORT_FACTORS[c].kind === 'year' ? `${COHORT_FACTORS[c].label} (decades)` : COHORT_FACTORS[c].label,
}));

export interface CohortBuilderProps {
  query: CohortQuery;
  /** A valid query: the page puts it in the URL, which runs it. */
  onRun: (query: CohortQuery) => void;
  /** The server refused the query in the URL: its field problems go on the controls. */
  refusal: unknown;
  busy: boolean;
}

/** Filters per factor (by kind), grouping, the event, origin, interval method and Cox factors, all from the factor table. */
export function CohortBuilder({ query, onRun, refusal, busy }: CohortBuilderProps) {
  const form = useSchemaForm({ schema: cohortQuerySchema, defaultValues: toValues(query), toBody, fieldFor });
  useEffect(() => {
    if (refusal) form.serverError(refusal);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [refusal]);
  return (
    <SchemaForm form={form} onValid={(body) => onRun(body)} failureTitle="The query was not run." aria-label="Cohort query" className="gap-4">
      <Filters />
      <Grouping />
      <EventControls />
      <fieldset className="rounded border border-paper-300 bg-white px-4 pt-2 pb-4">
        <legend className="px-1 text-sm font-semibold">Model</legend>
        <CheckGroup name="coxFactors" legend="Cox model factors (up to five)" options={FACTOR_OPTIONS.filter((o) => COHORT_FACTORS[o.value].kind !== 'place')} max={5} hint="None: no Cox model is fitted." />
      </fieldset>
      <div className="flex gap-2">
        <Button type="submit" variant="primary" disabled={busy}>
          {busy ? 'Running…' : 'Run query'}
        </Button>
        <Button variant="quiet" onClick={() => form.reset(toValues(cohortQuerySchema.parse({})))}>
          Clear the form
        </Button>
      </div>
    </SchemaForm>
  );
}

function Filters() {
  const values = useWatch() as BuilderValues;
  const active = new Set(filteredFactors(values));
  return (
    <fieldset className="rounded border border-paper-300 bg-white px-4 pt-2 pb-4">
      <legend className="px-1 text-sm font-semibold">Which prints</legend>
      <p className="mb-2 text-sm text-ink-700">Open a factor to filter by it; a factor left empty does not filter. {active.size ? `${active.size} filtering.` : 'Every print so far.'}</p>
      <div className="flex flex-col gap-1">
        {COHORT_FACTOR_CODES.map((code) => (
          <details key={code} open={active.has(code) || undefined} className="rounded border border-paper-200 px-3 py-1.5" data-factor={code}>
            <summary className="cursor-pointer text-sm">
              {COHORT_FACTORS[code].label}
              {active.has(code) ? <span className="ml-2 text-xs font-semibold text-iron-700">filtering</span> : null}
            </summary>
            <p className="my-1 text-xs text-ink-600">{COHORT_FACTORS[code].description}</p>
            <FactorFilter code={code} />
          </details>
        ))}
      </div>
    </fieldset>
  );
}

function Grouping() {
  const [g1, g2] = useWatch({ name: ['groupBy1', 'groupBy2'] }) as [string, string];
  const banded = [g1, g2].filter((g): g is CohortFactorCode => !!g && COHORT_FACTORS[g as CohortFactorCode].kind === 'number');
  return (
    <fieldset className="rounded border border-paper-300 bg-white px-4 pt-2 pb-4">
      <legend className="px-1 text-sm font-semibold">Groups</legend>
      <div className="flex flex-wrap gap-3">
        <SelectInput name="groupBy1" label="Group by" empty="No grouping (one cohort)" options={GROUP_OPTIONS} fieldClassName="w-64" />
        <SelectInput name="groupBy2" label="And by" empty="Nothing more" options={GROUP_OPTIONS} fieldClassName="w-64" />
        {banded.map((g) => (
          <TextInput
            key={g}
            name={`bands.${g}`}
            label={`${COHORT_FACTORS[g].label}: cut points (${'unit' in COHORT_FACTORS[g] ? COHORT_FACTORS[g].unit : ''})`}
            hint="Ascending, separated by commas; empty: split at the median."
            fieldClassName="w-72"
          />
        ))}
      </div>
    </fieldset>
  );
}

function EventControls() {
  const kind = useWatch({ name: 'eventKind' }) as string;
  const terms = useTerms();
  return (
    <fieldset className="rounded border border-paper-300 bg-white px-4 pt-2 pb-4">
      <legend className="px-1 text-sm font-semibold">Survival</legend>
      <div className="flex flex-wrap gap-3">
        <SelectInput name="eventKind" label="The event" options={Object.entries(EVENT_WORDS).map(([value, label]) => ({ value, label }))} fieldClassName="w-72" />
        {kind === 'fading' ? <NumberInput name="threshold" label="ΔE00 threshold" hint="Empty: the measurement settings' noticeable change." fieldClassName="w-48" /> : null}
        {kind === 'observation' ? (
          <SelectInput name="term" label="Observation" empty="Choose…" options={terms.data?.map((t) => ({ value: t.code, label: t.active ? t.label : `${t.label} (retired)` }))} fieldClassName="w-64" />
        ) : null}
        {kind === 'grade' ? <SelectInput name="grade" label="Graded at or below" empty="Choose…" options={GRADES.map((g) => ({ value: g, label: GRADE_LABELS[g] }))} fieldClassName="w-48" /> : null}
        <SelectInput name="origin" label="Time counted from" options={Object.entries(ORIGIN_WORDS).map(([value, label]) => ({ value, label }))} fieldClassName="w-64" />
        <SelectInput name="ci" label="95 % interval of the curves" options={Object.entries(CI_WORDS).map(([value, label]) => ({ value, label }))} fieldClassName="w-64" />
      </div>
    </fieldset>
  );
}
