import { Link } from 'react-router-dom';
import { ROUND_STATUSES, roundListQuerySchema } from '@toneledger/common/schemas/inspections';
import { buttonClasses } from '@/components/ui/button';
import { ChoiceSelect } from '@/components/ui/choice-select';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useAssignees, useRounds } from '@/features/inspections/api/rounds';
import { ROUND_STATUS_LABELS, RoundsTable } from '@/features/inspections/components/rounds-table';

const STATUS_OPTIONS = ROUND_STATUSES.map((s) => ({ value: s, label: ROUND_STATUS_LABELS[s] }));

/** Every round of checks, soonest planned first. */
export function RoundsPage() {
  useDocumentTitle('Inspection rounds');
  const [query, setQuery] = useSearchQuery(roundListQuerySchema);
  const rounds = useRounds(query);
  const assignees = useAssignees();
  return (
    <section>
      <PageHeader
        title="Inspection rounds"
        description="Dated rounds of checks, each given to one conservator, with how many of its prints are checked."
        actions={
          <Link to="/inspections" className={buttonClasses('secondary')}>
            Work list
          </Link>
        }
      />
      <div role="group" aria-label="Filter rounds" className="mb-4 flex flex-wrap items-end gap-3">
        <ChoiceSelect label="Status" empty="Any status" options={STATUS_OPTIONS} value={query.status} onChoose={(status) => setQuery({ status: status as typeof query.status })} fieldClassName="w-40" />
        <ChoiceSelect
          label="Carried out by"
          empty="Anyone"
          options={(assignees.data ?? []).map((a) => ({ value: a.id, label: a.name }))}
          value={query.assigneeId}
          onChoose={(assigneeId) => setQuery({ assigneeId })}
          fieldClassName="w-52"
        />
      </div>
      <PagedList list={rounds} query={query} setQuery={setQuery} errorTitle="The rounds could not be loaded." loadingLabel="Loading rounds…">
        {(page, busy) => <RoundsTable rounds={page.data} query={query} total={page.pagination.total} busy={busy} />}
      </PagedList>
    </section>
  );
}
