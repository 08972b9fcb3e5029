import { useCallback, useEffect, useMemo, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import type { BulkAction, PrintSelection } from '@toneledger/common/schemas/bulk';
import { printListQuerySchema, type PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { Button, buttonClasses } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
import { useMe } from '@/lib/auth';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { usePrints } from '@/lib/prints-api';
import { printsCsvHref, stepsCsvHref } from '@/features/catalogue/api/exports';
import { BagSearchButton } from '@/features/catalogue/components/bag-search-button';
import { BulkPanel } from '@/features/catalogue/components/bulk-panel';
import { CatalogueTable } from '@/features/catalogue/components/catalogue-table';
import { ColumnChooser, useColumnVisibility } from '@/features/catalogue/components/column-chooser';
import { PrintsFilters } from '@/features/catalogue/components/prints-filters';
import { CHOOSABLE_COLUMNS, DEFAULT_HIDDEN_COLUMNS } from '@/features/catalogue/components/prints-table';
import { SavedSearches } from '@/features/catalogue/components/saved-searches';
import { SelectionBar, selectionLabel } from '@/features/catalogue/components/selection-bar';
import { EMPTY_SELECTION, filtersKey, isSelected, selectAllMatching, toPrintSelection, type ListSelection } from '@/features/catalogue/utils/selection';

const COMPACT_KEY = 'toneledger.catalogue.compact';

/** Compact rows, remembered in this browser. */
function useCompact(): [boolean, (on: boolean) => void] {
  const [compact, setCompact] = useState(() => (typeof localStorage !== 'undefined' ? localStorage.getItem(COMPACT_KEY) === 'on' : false));
  const set = useCallback((on: boolean) => {
    setCompact(on);
    try {
      localStorage.setItem(COMPACT_KEY, on ? 'on' : 'off');
    } catch {
      // Storage refused (private mode): the choice lasts for this page only.
    }
  }, []);
  return [compact, set];
}

/** `/` anywhere on the page but in a text box focuses the catalogue search. */
function useSlashToSearch() {
  useEffect(() => {
    function onKey(event: KeyboardEvent) {
      if (event.key !== '/' || event.ctrlKey || event.metaKey || event.altKey) return;
      const target = event.target as HTMLElement | null;
      if (target && (target.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(target.tagName))) return;
      const box = document.querySelector<HTMLInputElement>('form[role="search"] input[type="search"]');
      if (!box) return;
      event.preventDefault();
      box.focus();
      box.select();
    }
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, []);
}

interface OpenAction { action: BulkAction; selection: PrintSelection; label: string }

export function PrintsPage() {
  useDocumentTitle('Prints');
  useSlashToSearch();
  const me = useMe();
  const navigate = useNavigate();
  const mayWrite = can(me.role, 'catalogue.write');
  const showLocation = can(me.role, 'catalogue.read_restricted');
  const [urlQuery, setQuery] = useSearchQuery(printListQuerySchema);
  // A role that may not see locations cannot filter by them either.
  const query = useMemo(() => (showLocation || !urlQuery.locationId ? urlQuery : { ...urlQuery, locationId: undefined }), [urlQuery, showLocation]);
  const prints = usePrints(query);
  const [visibility, setVisibility] = useColumnVisibility(DEFAULT_HIDDEN_COLUMNS);
  const choosable = showLocation ? CHOOSABLE_COLUMNS : CHOOSABLE_COLUMNS.filter((c) => c.id !== 'location');
  const [compact, setCompact] = useCompact();
  const [selection, setSelection] = useState<ListSelection>(EMPTY_SELECTION);
  const [open, setOpen] = useState<OpenAction | null>(null);

  // "All matching" is the search itself: another search ends it (ticked ids stay across pages and searches).
  const filters = filtersKey(query);
  useEffect(() => {
    setSelection((s) => (s.kind === 'query' && filtersKey(s.query) !== filters ? EMPTY_SELECTION : s));
  }, [filters]);

  const page = prints.data;
  const pageAllTicked = !!page && page.data.length > 0 && page.data.every((p) => isSelected(selection, p.id));
  const estimated = page?.pagination.estimated ?? false;

  return (
    <section>
      <PageHeader
        title="Prints"
        description="Every print in the collection. Search, filter and sort here; the address of this page keeps the search, so it can be bookmarked or shared. Press / to search; arrow keys move through the rows and Enter opens one."
        actions={
          <>
            <a href={printsCsvHref(query)} download className={buttonClasses('secondary', 'md', 'no-underline')}>
              Export CSV
            </a>
            <a
              href={stepsCsvHref(query)}
              download
              title="The process histories of these prints, one row per step: the steps file of an import"
              className={buttonClasses('secondary', 'md', 'no-underline')}
            >
              Export steps CSV
            </a>
            {can(me.role, 'selection.export') ? <BagSearchButton query={query} /> : null}
            {mayWrite ? (
              <Button variant="primary" onClick={() => navigate('/catalogue/prints/new')}>
                New print
              </Button>
            ) : null}
          </>
        }
      />
      <PrintsFilters query={query} onChange={setQuery} showLocation={showLocation} />
      <div className="mb-2 flex flex-wrap items-start justify-between gap-2">
        <SavedSearches query={query} onOpen={(saved) => setQuery({ ...Object.fromEntries(Object.keys(query).map((k) => [k, undefined])), ...saved } as Partial<PrintListQuery>)} />
        <div className="flex items-center gap-3">
          <label className="inline-flex items-center gap-1.5 text-sm">
            <input type="checkbox" checked={compact} onChange={(e) => setCompact(e.target.checked)} /> Compact rows
          </label>
          <ColumnChooser columns={choosable} visibility={visibility} onChange={setVisibility} />
        </div>
      </div>
      <SelectionBar
        role={me.role}
        selection={selection}
        pageAllTicked={pageAllTicked}
        total={page?.pagination.total ?? 0}
        estimated={estimated}
        onSelectAllMatching={() => setSelection(selectAllMatching(query, page?.pagination.total ?? 0))}
        onClear={() => setSelection(EMPTY_SELECTION)}
        onAction={(action) => setOpen({ action, selection: toPrintSelection(selection), label: selectionLabel(selection, estimated) })}
      />
      {open ? (
        <div className="mb-3">
          <BulkPanel
            key={`${open.action}:${JSON.stringify(open.selection)}`}
            action={open.action}
            selection={open.selection}
            selectionLabel={open.label}
            onClose={() => setOpen(null)}
            onDone={() => setSelection(EMPTY_SELECTION)}
            onRehouse={(ids) => setOpen({ action: 'rehouse', selection: { kind: 'ids', ids }, label: `${ids.length.toLocaleString('en-GB')} ${ids.length === 1 ? 'print' : 'prints'} from the warning` })}
          />
        </div>
      ) : null}
      <PagedList list={prints} query={query} setQuery={setQuery} errorTitle="The prints could not be loaded." loadingLabel="Loading prints…">
        {(data, busy) => (
          <CatalogueTable
            prints={data.data}
            query={query}
            total={data.pagination.total}
            busy={busy}
            columnVisibility={visibility}
            showLocation={showLocation}
            compact={compact}
            selection={selection}
            onSelectionChange={setSelection}
            onSortChange={(sort) => setQuery({ sort })}
          />
        )}
      </PagedList>
    </section>
  );
}
