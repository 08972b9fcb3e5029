import { userListQuerySchema } from '@toneledger/common/schemas/users';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useUsers } from '@/features/users/api/get-users';
import { UsersFilters } from '@/features/users/components/users-filters';
import { UsersTable } from '@/features/users/components/users-table';

export function UsersPage() {
  useDocumentTitle('People and roles');
  const [query, setQuery] = useSearchQuery(userListQuerySchema);
  const users = useUsers(query);

  return (
    <section>
      <PageHeader
        title="People and roles"
        description="Everyone who has signed in, and the role each holds. A person appears here after their first sign-in. Every change of role is kept in the audit trail."
      />
      <UsersFilters query={query} onChange={setQuery} />
      {users.isError ? <ErrorNotice error={users.error} title="The list of people could not be loaded." /> : null}
      {users.isPending ? (
        <Loading label="Loading people…" />
      ) : users.data ? (
        <>
          <UsersTable
            users={users.data.data}
            query={query}
            total={users.data.pagination.total}
            busy={users.isPlaceholderData}
            onSortChange={(sort) => setQuery({ sort })}
          />
          <Pagination
            page={query.page}
            pageSize={query.pageSize}
            total={users.data.pagination.total}
            onPageChange={(page) => setQuery({ page })}
            onPageSizeChange={(pageSize) => setQuery({ pageSize })}
          />
        </>
      ) : null}
    </section>
  );
}
