import { userListQuerySchema } from '@toneledger/common/schemas/users';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
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
      <PagedList list={users} query={query} setQuery={setQuery} errorTitle="The list of people could not be loaded." loadingLabel="Loading people…">
        {(page, busy) => (
          <UsersTable
            users={page.data}
            query={query}
            total={page.pagination.total}
            busy={busy}
            onSortChange={(sort) => setQuery({ sort })}
          />
        )}
      </PagedList>
    </section>
  );
}
