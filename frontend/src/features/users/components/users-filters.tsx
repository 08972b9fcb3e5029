import { useEffect, useState, type FormEvent } from 'react';
import { ROLE_LABELS, ROLES, type Role } from '@toneledger/common/domain/roles';
import { userListQuerySchema, type UserListQuery } from '@toneledger/common/schemas/users';
import { Button } from '@/components/ui/button';
import { ChoiceSelect } from '@/components/ui/choice-select';
import { SearchField } from '@/components/ui/search-field';

export interface UsersFiltersProps {
  query: UserListQuery;
  onChange: (patch: Partial<UserListQuery>) => void;
}

const ROLE_OPTIONS = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }));

export function UsersFilters({ query, onChange }: UsersFiltersProps) {
  const [text, setText] = useState(query.q ?? '');
  useEffect(() => setText(query.q ?? ''), [query.q]);

  function submit(event: FormEvent) {
    event.preventDefault();
    onChange({ q: text.trim() || undefined });
  }

  return (
    <form role="search" aria-label="Filter people" onSubmit={submit} className="mb-4 flex flex-wrap items-end gap-3">
      <SearchField label="Name or e-mail" value={text} onText={setText} querySchema={userListQuerySchema} fieldClassName="w-64" />
      <ChoiceSelect
        label="Role"
        empty="Any role"
        options={ROLE_OPTIONS}
        value={query.role}
        onChoose={(role) => onChange({ role: role as Role | undefined })}
        fieldClassName="w-44"
      />
      <Button type="submit" variant="primary">
        Search
      </Button>
      {query.q || query.role ? (
        <Button variant="quiet" onClick={() => onChange({ q: undefined, role: undefined })}>
          Clear filters
        </Button>
      ) : null}
    </form>
  );
}
