import { useMemo } from 'react';
import { createColumnHelper } from '@tanstack/react-table';
import { userListQuerySchema, type User, type UserListQuery } from '@toneledger/common/schemas/users';
import { DataTable } from '@/components/ui/data-table';
import { formatDate, formatDateTime } from '@/lib/format';
import { sortingToSort, sortToSorting, useServerTable } from '@/lib/server-table';
import { ActivationControl } from '@/features/users/components/activation-control';
import { RoleControl } from '@/features/users/components/role-control';

type Sort = UserListQuery['sort'];
const SORTS = userListQuerySchema.shape.sort.unwrap().options;

const column = createColumnHelper<User>();

const columns = [
  column.accessor('name', {
    header: 'Name',
    cell: (info) => <span className="font-medium whitespace-nowrap text-ink-900">{info.getValue()}</span>,
  }),
  column.accessor('email', {
    header: 'E-mail',
    cell: (info) => info.getValue() ?? <span className="text-ink-600">none</span>,
  }),
  column.accessor('role', {
    header: 'Role',
    cell: (info) => <RoleControl user={info.row.original} />,
  }),
  column.accessor('deactivatedAt', {
    header: 'Sign-in',
    enableSorting: false,
    cell: (info) => <ActivationControl user={info.row.original} />,
  }),
  column.accessor('lastSignInAt', {
    header: 'Last signed in',
    cell: (info) => {
      const value = info.getValue();
      return value ? <time dateTime={value} className="whitespace-nowrap">{formatDateTime(value)}</time> : <span className="text-ink-600">never</span>;
    },
  }),
  column.accessor('createdAt', {
    header: 'First seen',
    enableSorting: false,
    cell: (info) => <time dateTime={info.getValue()} className="whitespace-nowrap">{formatDate(info.getValue())}</time>,
  }),
];

export interface UsersTableProps {
  users: User[];
  query: UserListQuery;
  total: number;
  busy: boolean;
  onSortChange: (sort: Sort) => void;
}

/** People, sorted and paged by the server: the table only mirrors the query in the URL. */
export function UsersTable({ users, query, total, busy, onSortChange }: UsersTableProps) {
  const sorting = useMemo(() => sortToSorting(query.sort), [query.sort]);
  const table = useServerTable({
    data: users,
    columns,
    getRowId: (user) => user.id,
    query,
    total,
    sorting,
    onSortingChange: (next) => onSortChange(sortingToSort(next, query.sort, SORTS)),
  });
  return <DataTable table={table} caption="People who have signed in, with their roles" empty="No one matches these filters." busy={busy} />;
}
