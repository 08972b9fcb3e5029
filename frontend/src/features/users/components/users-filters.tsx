import { useEffect, useState, type FormEvent } from 'react';
import { ROLE_LABELS, ROLES, type Role } from '@toneledger/common/domain/roles';
import { userListQuerySchema, type UserListQuery } from '@toneledger/common/schemas/users';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { limitsOf } from '@/lib/forms/limits';

export interface UsersFiltersProps {
  query: UserListQuery;
  onChange: (patch: Partial<UserListQuery>) => void;
}

export function UsersFilters({ query, onChange }: UsersFiltersProps) {
  const [text, setText] = useState(query.q ?? '');
  useEffect(() => setText(query.q ?? ''), [query.q]);

  function submit(event: FormEvent) {
    event.preventDefault();
    onChange({ q: text.trim() || undefined });
  }

  return (
    <form role="search" aria-label="Filter people" onSubmit={submit} className="mb-4 flex flex-wrap items-end gap-3">
      <TextField
        label="Name or e-mail"
        type="search"
        value={text}
        onChange={(event) => setText(event.target.value)}
        fieldClassName="w-64"
        maxLength={limitsOf(userListQuerySchema, 'q').maxLength}
      />
      <SelectField
        label="Role"
        value={query.role ?? ''}
        onChange={(event) => onChange({ role: (event.target.value || undefined) as Role | undefined })}
        fieldClassName="w-44"
      >
        <option value="">Any role</option>
        {ROLES.map((role) => (
          <option key={role} value={role}>
            {ROLE_LABELS[role]}
          </option>
        ))}
      </SelectField>
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
