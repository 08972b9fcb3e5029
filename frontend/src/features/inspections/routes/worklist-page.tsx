import { useState } from 'react';
import type { RowSelectionState } from '@tanstack/react-table';
import { Link, useNavigate } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import { worklistQuerySchema, type WorklistItem } from '@toneledger/common/schemas/inspections';
import { Button, buttonClasses } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
import { todayIso } from '@/lib/format';
import { useMe } from '@/lib/auth';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useWorklist } from '@/features/inspections/api/rounds';
import { RoundPlanForm } from '@/features/inspections/components/round-plan-form';
import { WorklistCounts } from '@/features/inspections/components/worklist-counts';
import { WorklistFilters } from '@/features/inspections/components/worklist-filters';
import { WorklistTable } from '@/features/inspections/components/worklist-table';

/** The deepest place holding every chosen print (the last common part of their places), for a round's suggested title. */
function sharedPlace(items: WorklistItem[]): string | null {
  if (!items.length || items.some((i) => !i.locationLabel)) return null;
  const parts = items.map((i) => i.locationLabel!.split(' › '));
  let depth = 0;
  while (depth < parts[0]!.length && parts.every((p) => p[depth] === parts[0]![depth])) depth += 1;
  return depth ? parts[0]![depth - 1]! : null;
}

/** The conservators' work list: prints by the date their next check is due, with the counts of each window. */
export function WorklistPage() {
  useDocumentTitle('Inspections');
  const me = useMe();
  const navigate = useNavigate();
  const [query, setQuery] = useSearchQuery(worklistQuerySchema);
  const list = useWorklist(query);
  const planner = can(me.role, 'schedule.write');
  const [selection, setSelection] = useState<RowSelectionState>({});
  // The rows chosen, as last seen on any page (the ids are the selection's keys).
  const [seen, setSeen] = useState<Record<string, WorklistItem>>({});
  const [planning, setPlanning] = useState(false);
  const chosen = Object.keys(selection).filter((id) => selection[id]);

  function choose(next: RowSelectionState) {
    setSelection(next);
    const rows = { ...seen };
    for (const item of list.data?.data ?? []) rows[item.printId] = item;
    setSeen(rows);
  }

  const place = sharedPlace(chosen.map((id) => seen[id]).filter((x): x is WorklistItem => !!x));
  return (
    <section>
      <PageHeader
        title="Inspections"
        description="Prints by the day their next check is due, from the risk of each. Choose prints and plan a round of checks; a signed condition report checks a print off."
        actions={
          <Link to="/inspections/rounds" className={buttonClasses('secondary')}>
            Rounds
          </Link>
        }
      />
      <WorklistCounts counts={list.data?.counts} window={query.window} onWindow={(window) => setQuery({ window })} />
      <WorklistFilters query={query} onChange={setQuery} />
      {planner ? (
        <div className="mb-3 flex flex-wrap items-center gap-3 print:hidden">
          <Button variant="primary" disabled={chosen.length === 0 || planning} onClick={() => setPlanning(true)}>
            Plan these checks{chosen.length ? ` (${chosen.length})` : ''}
          </Button>
          {chosen.length ? (
            <Button variant="quiet" onClick={() => setSelection({})}>
              Clear the choice
            </Button>
          ) : null}
        </div>
      ) : null}
      {planning ? (
        <div className="mb-4">
          <RoundPlanForm
            key={chosen.join(',')}
            printIds={chosen}
            defaultTitle={place ? `Checks in ${place}` : 'Checks'}
            defaultAssigneeId={me.role === 'conservator' ? me.id : ''}
            defaultDate={todayIso()}
            onPlanned={(round) => navigate(`/inspections/rounds/${round.id}`)}
            onCancel={() => setPlanning(false)}
          />
        </div>
      ) : null}
      <PagedList list={list} query={query} setQuery={setQuery} errorTitle="The work list could not be loaded." loadingLabel="Loading the work list…">
        {(page, busy) => (
          <WorklistTable
            items={page.data}
            query={query}
            total={page.pagination.total}
            busy={busy}
            onSort={(sort) => setQuery({ sort })}
            {...(planner ? { selection, onSelection: choose } : {})}
          />
        )}
      </PagedList>
    </section>
  );
}
