import { useId, useState, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { VIEW_TYPE_LABELS } from '@toneledger/common/schemas/images';
import { PROCESS } from '@toneledger/common/schemas/vocab';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { useMe } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useFindPrints } from '@/lib/prints-api';
import { useFixityAlerts, useRunFixityCheck } from '@/features/condition/api/fixity';
import { ConditionWork } from '@/features/condition/components/condition-work';

function PrintSearch() {
  const [params, setParams] = useSearchParams();
  const q = params.get('q') ?? '';
  const [text, setText] = useState(q);
  const found = useFindPrints({ q, pageSize: 20 });
  const resultsId = useId();

  function submit(event: FormEvent) {
    event.preventDefault();
    const next = new URLSearchParams(params);
    if (text.trim()) next.set('q', text.trim());
    else next.delete('q');
    setParams(next);
  }

  return (
    <section aria-labelledby={`${resultsId}-heading`} className="rounded border border-paper-300 bg-white p-4">
      <h2 id={`${resultsId}-heading`} className="text-lg">
        Find a print
      </h2>
      <form role="search" onSubmit={submit} className="mt-2 flex flex-wrap items-end gap-2">
        <TextField label="Accession number or words" value={text} onChange={(e) => setText(e.target.value)} fieldClassName="min-w-72 flex-1" autoComplete="off" />
        <Button type="submit" variant="primary">
          Search
        </Button>
      </form>
      <div id={resultsId} aria-live="polite" className="mt-3">
        {q === '' ? null : found.isPending ? (
          <Loading label="Searching…" />
        ) : found.isError ? (
          <ErrorNotice error={found.error} title="The search did not run." />
        ) : found.data.data.length === 0 ? (
          <p className="text-sm text-ink-700">No print matches “{q}”.</p>
        ) : (
          <>
            <p className="text-sm text-ink-700">
              {found.data.pagination.total > found.data.data.length
                ? `The first ${found.data.data.length} of ${found.data.pagination.total} prints; add words to narrow the search.`
                : `${found.data.data.length} ${found.data.data.length === 1 ? 'print' : 'prints'}`}
            </p>
            <ul className="mt-2 divide-y divide-paper-200">
              {found.data.data.map((p) => (
                <li key={p.id} className="py-1.5 text-sm">
                  <Link to={`/condition/prints/${p.id}`}>
                    <span className="mono">{p.accessionNumber}</span> {p.title}
                  </Link>
                  <span className="text-ink-700">
                    {' '}
                    · {p.makerName ?? 'maker not recorded'} · {PROCESS.labels[p.process]}
                  </span>
                </li>
              ))}
            </ul>
          </>
        )}
      </div>
    </section>
  );
}

function FixityAlertsPanel({ manage }: { manage: boolean }) {
  const headingId = useId();
  const alerts = useFixityAlerts(true);
  const run = useRunFixityCheck();
  return (
    <section aria-labelledby={headingId} className="rounded border border-paper-300 bg-white p-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id={headingId} className="text-lg">
          Fixity alerts
        </h2>
        {manage ? (
          <Button onClick={() => run.mutate()} disabled={run.isPending}>
            Check all images now
          </Button>
        ) : null}
      </div>
      <p className="mt-1 text-sm text-ink-700">Images whose latest check did not match the SHA-256 kept at upload, or whose file is missing.</p>
      {run.isSuccess ? (
        <Notice tone="success" role="status">
          <p>The check of every stored original has started in the background. Problems appear here as it finds them.</p>
        </Notice>
      ) : null}
      {run.isError ? <ErrorNotice error={run.error} title="The check did not start." /> : null}
      {alerts.isPending ? <Loading label="Loading alerts…" /> : null}
      {alerts.isError ? <ErrorNotice error={alerts.error} title="The alerts could not be loaded." /> : null}
      {alerts.data ? (
        alerts.data.length === 0 ? (
          <p className="mt-2 text-sm text-ink-700">No alerts: every checked image matches.</p>
        ) : (
          <ul className="mt-2 divide-y divide-paper-200">
            {alerts.data.map((a) => (
              <li key={a.imageId} className="py-1.5 text-sm">
                <Link to={`/condition/prints/${a.printId}`} className="mono">
                  {a.accessionNumber}
                </Link>{' '}
                · {VIEW_TYPE_LABELS[a.viewType]} · <strong className="text-danger-700">{a.result.outcome}</strong> · checked{' '}
                {formatDateTime(a.result.checkedAt)}
                {a.result.detail ? <span className="block text-xs text-ink-700">{a.result.detail}</span> : null}
              </li>
            ))}
          </ul>
        )
      ) : null}
    </section>
  );
}

/**
 * The condition area opens on the person's own work: their drafts to finish and recent reports, the
 * latest reports by anyone, and fixity alerts for those who may read them; then the print search.
 */
export function ConditionIndexPage() {
  const me = useMe();
  useDocumentTitle('Condition');
  return (
    <section>
      <PageHeader
        title="Condition"
        description="Condition reports, observations and images, print by print. Find a print to see its reports and images, write a report, or compare images across years."
      />
      <div className="flex flex-col gap-5">
        <ConditionWork writer={can(me.role, 'condition.write')} />
        {can(me.role, 'fixity.read') ? <FixityAlertsPanel manage={can(me.role, 'fixity.manage')} /> : null}
        <PrintSearch />
      </div>
    </section>
  );
}
