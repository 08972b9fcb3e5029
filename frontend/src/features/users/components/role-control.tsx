import { useEffect, useId, useState } from 'react';
import { ROLE_LABELS, ROLES, type Role } from '@toneledger/common/domain/roles';
import type { User } from '@toneledger/common/schemas/users';
import { isApiError } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { useChangeRole } from '@/features/users/api/change-role';

/**
 * The role of one person, changeable in place. Picking a new role asks for confirmation (with an
 * optional reason for the audit trail); a refusal from the server is shown right here.
 */
export function RoleControl({ user }: { user: User }) {
  const change = useChangeRole();
  const [pending, setPending] = useState<Role | null>(null);
  const [reason, setReason] = useState('');
  const reasonId = useId();
  const { reset } = change;

  // A fresh role from the server supersedes whatever this control last did.
  useEffect(() => {
    reset();
  }, [user.role, reset]);

  const saved = change.isSuccess && change.data.id === user.id ? change.data.role : user.role;
  const shown = pending ?? saved;

  function confirm() {
    if (!pending) return;
    const trimmed = reason.trim();
    change.mutate(
      { id: user.id, change: { role: pending, ...(trimmed ? { reason: trimmed } : {}) } },
      { onSettled: () => { setPending(null); setReason(''); } },
    );
  }

  function cancel() {
    setPending(null);
    setReason('');
  }

  const issues = isApiError(change.error) ? change.error.fieldIssues : [];

  return (
    <div className="flex min-w-52 flex-col gap-2">
      <select
        aria-label={`Role of ${user.name}`}
        className="h-8 w-44 rounded border border-paper-400 bg-white px-2 text-sm"
        value={shown}
        disabled={change.isPending}
        onChange={(event) => {
          const next = event.target.value as Role;
          change.reset();
          setPending(next === saved ? null : next);
        }}
      >
        {ROLES.map((role) => (
          <option key={role} value={role}>
            {ROLE_LABELS[role]}
          </option>
        ))}
      </select>

      {pending ? (
        <div
          role="group"
          aria-label={`Confirm role change for ${user.name}`}
          className="flex flex-col gap-2 rounded border border-sepia-200 bg-sepia-50 p-2.5 text-sm"
        >
          <p className="text-ink-900">
            Change {user.name} from <strong>{ROLE_LABELS[saved]}</strong> to <strong>{ROLE_LABELS[pending]}</strong>?
          </p>
          <label htmlFor={reasonId} className="text-xs font-semibold text-ink-700">
            Reason (optional, kept in the audit trail)
          </label>
          <input
            id={reasonId}
            value={reason}
            maxLength={500}
            onChange={(event) => setReason(event.target.value)}
            className="h-8 rounded border border-paper-400 bg-white px-2 text-sm"
          />
          <div className="flex gap-2">
            <Button size="sm" variant="primary" onClick={confirm} disabled={change.isPending}>
              {change.isPending ? 'Changing…' : 'Change role'}
            </Button>
            <Button size="sm" onClick={cancel} disabled={change.isPending}>
              Cancel
            </Button>
          </div>
        </div>
      ) : null}

      {change.isError ? (
        <div role="alert" className="rounded border border-danger-200 bg-danger-50 px-2.5 py-1.5 text-sm text-danger-700">
          <p>{change.error.message}</p>
          {issues.length > 0 ? (
            <ul className="mt-1 list-disc pl-4 text-xs">
              {issues.map((issue) => (
                <li key={`${issue.path}-${issue.code}`}>
                  {issue.path ? `${issue.path}: ` : ''}
                  {issue.message}
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
      {change.isSuccess && !pending ? (
        <p role="status" className="text-xs text-ok-700">
          Role changed to {ROLE_LABELS[change.data.role]}.
        </p>
      ) : null}
    </div>
  );
}
