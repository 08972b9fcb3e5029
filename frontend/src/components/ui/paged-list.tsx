import type { ReactNode } from 'react';
import type { UseQueryResult } from '@tanstack/react-query';
import type { Pagination as PageCounts } from '@toneledger/common/schemas/envelope';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { Pagination } from '@/components/ui/pagination';

export interface PagedListProps<P extends { data: unknown[]; pagination: PageCounts }> {
  /** A page of a list, as its contract answers it. */
  list: UseQueryResult<P>;
  /** The list's page and page size, from the URL. */
  query: { page: number; pageSize: number };
  setQuery: (patch: { page?: number; pageSize?: number }) => void;
  errorTitle: string;
  loadingLabel: string;
  /** The table of the page; `busy` while the next page is fetched and this one still shows. */
  children: (page: P, busy: boolean) => ReactNode;
}

/** One page of a list: its problem or loading state, then its table and the pagination under it. */
export function PagedList<P extends { data: unknown[]; pagination: PageCounts }>({ list, query, setQuery, errorTitle, loadingLabel, children }: PagedListProps<P>) {
  return (
    <>
      {list.isError ? <ErrorNotice error={list.error} title={errorTitle} /> : null}
      {list.isPending ? (
        <Loading label={loadingLabel} />
      ) : list.data ? (
        <>
          {children(list.data, list.isPlaceholderData)}
          <Pagination
            page={query.page}
            pageSize={query.pageSize}
            total={list.data.pagination.total}
            estimated={list.data.pagination.estimated ?? false}
            onPageChange={(page) => setQuery({ page })}
            onPageSizeChange={(pageSize) => setQuery({ pageSize })}
          />
        </>
      ) : null}
    </>
  );
}
