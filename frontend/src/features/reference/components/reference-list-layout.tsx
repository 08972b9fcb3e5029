import type { ReactNode } from 'react';
import type { UseQueryResult } from '@tanstack/react-query';
import type { Pagination as PageCounts } from '@toneledger/common/schemas/envelope';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
import { ReferenceSearch } from '@/features/reference/components/reference-search';
import { SavedNotice } from '@/features/reference/components/saved-notice';

export interface ReferenceListQueryState {
  q?: string;
  page: number;
  pageSize: number;
}

export interface ReferenceListLayoutProps<T> {
  title: string;
  description: ReactNode;
  /** The accessible name of the create button, e.g. "New maker"; no button when undefined. */
  newLabel?: string;
  onNew?: () => void;
  searchWhat: string;
  searchLabel: string;
  query: ReferenceListQueryState;
  setQuery: (patch: Partial<ReferenceListQueryState>) => void;
  /** A page of the resource's list, as its contract answers it. */
  list: UseQueryResult<{ data: T[]; pagination: PageCounts }>;
  what: string;
  renderTable: (rows: T[], busy: boolean) => ReactNode;
  /** The create/edit panel, when open. */
  panel?: ReactNode;
  /** A short confirmation after a save. */
  saved?: string | null;
}

/** Header, search, table and (when open) the side panel of one reference list. */
export function ReferenceListLayout<T>(props: ReferenceListLayoutProps<T>) {
  const { title, description, newLabel, onNew, searchWhat, searchLabel, query, setQuery, list, what, renderTable, panel, saved } = props;
  return (
    <section>
      <PageHeader
        title={title}
        description={description}
        actions={
          newLabel && onNew ? (
            <Button variant="primary" onClick={onNew}>
              {newLabel}
            </Button>
          ) : null
        }
      />
      <SavedNotice saved={saved} />
      <div className={panel ? 'grid items-start gap-5 lg:grid-cols-[minmax(0,1fr)_26rem]' : undefined}>
        <div className="min-w-0">
          <ReferenceSearch what={searchWhat} label={searchLabel} q={query.q} onSearch={(q) => setQuery({ q })} />
          <PagedList list={list} query={query} setQuery={setQuery} errorTitle={`The list of ${what} could not be loaded.`} loadingLabel={`Loading ${what}…`}>
            {(page, busy) => renderTable(page.data, busy)}
          </PagedList>
        </div>
        {panel}
      </div>
    </section>
  );
}
