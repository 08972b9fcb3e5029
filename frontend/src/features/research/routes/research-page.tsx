import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import type { CohortQuery } from '@toneledger/common/schemas/research';
import { Button } from '@/components/ui/button';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { isApiError } from '@/lib/api-client';
import { useMe } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { useDocumentTitle } from '@/lib/use-document-title';
import type { PrintsAsk } from '@/features/research/api/keys';
import { useCohort, useExportPackage } from '@/features/research/api/research';
import { CohortBuilder } from '@/features/research/components/cohort-builder';
import { CoxTable, GroupsTable, IncidenceTables } from '@/features/research/components/cohort-tables';
import { FadingPlots } from '@/features/research/components/fading-plot';
import { PrintsPanel } from '@/features/research/components/prints-panel';
import { SavedQueries, SaveQueryForm } from '@/features/research/components/saved-queries';
import { SurvivalSection } from '@/features/research/components/survival-section';
import { decodeQuery, EMPTY_QUERY, encodeQuery, QUERY_PARAM } from '@/features/research/utils/query-url';

/**
 * `/research`: the cohort builder and its answer. The query lives in the URL's `q` (compact JSON),
 * so a link reproduces it and back and forward move between queries; running puts it there.
 */
export function ResearchPage() {
  useDocumentTitle('Research');
  const me = useMe();
  const [params, setParams] = useSearchParams();
  const text = params.get(QUERY_PARAM);
  const decoded = decodeQuery(text);
  const query = decoded?.query ?? null;
  const fading = useCohort(query, 'fading');
  const survival = useCohort(query, 'survival');
  const cox = useCohort(query, 'cox');
  const parts = [fading, survival, cox];
  const exporting = useExportPackage();
  const [saving, setSaving] = useState(false);
  const [savedNote, setSavedNote] = useState<string | null>(null);
  const [shown, setShown] = useState<{ ask: PrintsAsk; title: string } | null>(null);

  const run = (q: CohortQuery) => {
    setShown(null);
    setSavedNote(null);
    setParams({ [QUERY_PARAM]: encodeQuery(q) });
  };
  // The parts answer the same query, so one refusal or failure stands for all; the groups and sizes come with every part.
  const error = parts.find((p) => p.error)?.error ?? null;
  const refused = isApiError(error) && error.fieldIssues.length > 0 ? error : null;
  const result = fading.data ?? survival.data ?? cox.data;
  const labelOf = (key: string) => result?.groups.find((g) => g.key === key)?.label ?? key;
  const waiting = (label: string) => <Loading label={label} />;
  const show = (ask: PrintsAsk, title: string) => setShown({ ask, title });

  return (
    <div className="flex flex-col gap-4">
      <PageHeader
        title="Research"
        description="Cohorts of prints by process, toner, paper and treatment: fading rates, survival curves and a Cox model, each figure with the prints behind it."
        actions={
          query ? (
            <div className="flex gap-2">
              <Button onClick={() => setSaving(true)}>Save the query</Button>
              {can(me.role, 'research.export') ? (
                <Button variant="primary" disabled={exporting.isPending} onClick={() => exporting.mutate(query)}>
                  {exporting.isPending ? 'Preparing the package…' : 'Export the data package'}
                </Button>
              ) : null}
            </div>
          ) : null
        }
      />
      {exporting.error ? <ErrorNotice error={exporting.error} title="The data package was not made." /> : null}
      {decoded?.problem ? <Notice tone="error" role="alert" title="This link's query cannot be run.">{decoded.problem}</Notice> : null}
      {savedNote ? <Notice tone="success" role="status">{savedNote}</Notice> : null}
      {saving && query ? (
        <SaveQueryForm
          query={query}
          onCancel={() => setSaving(false)}
          onSaved={(saved) => {
            setSaving(false);
            setSavedNote(`Saved as “${saved.name}”.`);
          }}
        />
      ) : null}
      <div className="grid gap-6 lg:grid-cols-[minmax(0,26rem)_minmax(0,1fr)]">
        <div className="flex flex-col gap-6">
          <CohortBuilder key={text ?? ''} query={query ?? EMPTY_QUERY} onRun={run} refusal={refused} busy={parts.some((p) => p.isFetching)} />
          <SavedQueries onOpen={run} />
        </div>
        <div className="flex min-w-0 flex-col gap-6">
          {shown && query ? <PrintsPanel key={JSON.stringify(shown.ask)} query={query} ask={shown.ask} title={shown.title} onClose={() => setShown(null)} /> : null}
          {!query && !decoded?.problem ? <p className="text-sm text-ink-700">Choose the prints, how to group them and the event, then run the query.</p> : null}
          {!result && !error && query ? <Loading label="Running the query…" /> : null}
          {error && !refused ? <ErrorNotice error={error} title="The query was not run." /> : null}
          {refused ? <Notice tone="error" role="alert" title="The query was refused.">The problems are marked on the query form.</Notice> : null}
          {result && !error ? (
            <>
              <section aria-labelledby="groups-heading" className="flex flex-col gap-2">
                <h2 id="groups-heading" className="text-lg">Groups</h2>
                <p className="text-sm text-ink-700">
                  {result.total} prints in the cohort.{' '}
                  {result.outcomesAsOf ? `Outcomes brought up to date ${formatDateTime(result.outcomesAsOf)}.` : 'Outcomes not yet brought up to date.'}
                </p>
                <GroupsTable result={result} onShow={show} />
              </section>
              {fading.data ? <FadingPlots result={fading.data} labelOf={labelOf} onShow={show} /> : waiting('Working out the fading rates…')}
              {survival.data ? <SurvivalSection survival={survival.data.survival} labelOf={labelOf} onShow={show} /> : waiting('Working out the survival curves…')}
              {!query?.coxFactors.length ? <p className="text-sm text-ink-600">No Cox model: choose its factors in the query.</p>
                : cox.data?.cox ? <CoxTable cox={cox.data.cox} onShow={show} /> : waiting('Fitting the Cox model…')}
              {survival.data ? <IncidenceTables incidence={survival.data.incidence} labelOf={labelOf} onShow={show} /> : null}
            </>
          ) : null}
        </div>
      </div>
    </div>
  );
}
