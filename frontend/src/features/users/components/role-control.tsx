import { useEffect, useState } from 'react';
import { ROLE_LABELS, ROLES, type Role } from '@toneledger/common/domain/roles';
import { roleChangeSchema, type User } from '@toneledger/common/schemas/users';
import { TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { fieldIssuesOf } from '@/lib/forms/field-errors';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useChangeRole } from '@/features/users/api/change-role';

/**
 * The role of one person, changeable in place. Picking a new role asks for confirmation (with an
 * optional reason for the audit trail); a refusal from the server is shown right here.
 */
export function RoleControl({ user }: { user: User }) {
  const change = useChangeRole();
  const [pending, setPending] = useState<Role | null>(null);
  const { reset } = change;
  const form = useSchemaForm({
    schema: roleChangeSchema,
    defaultValues: { reason: '' },
    // The body: the role chosen in the list above, and the reason only when one is given.
    toBody: (values: { reason: string }) => ({ role: pending, reason: values.reason.trim() === '' ? undefined : values.reason }),
  });

  // A fresh role from the server supersedes whatever this control last did.
  useEffect(() => {
    reset();
  }, [user.role, reset]);

  const saved = change.isSuccess && change.data.id === user.id ? change.data.role : user.role;
  const shown = pending ?? saved;
  const refused = change.isError && fieldIssuesOf(change.error).length === 0;

  function close() {
    setPending(null);
    form.reset({ reason: '' });
  }

  // The last-admin guard, shown before any demotion is offered (the server refuses it too).
  if (user.lastAdmin && !pending) {
    return (
      <div className="flex min-w-52 flex-col gap-1">
        <span className="text-sm font-medium text-ink-900">{ROLE_LABELS[saved]}</span>
        <span className="text-xs text-ink-700" id={`last-admin-${user.id}`}>
          The only administrator: make someone else an administrator before changing this role.
        </span>
      </div>
    );
  }

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
        <SchemaForm
          form={form}
          onValid={(body) =>
            change.mutate(
              { id: user.id, change: body },
              {
                onSuccess: close,
                // A problem with the reason stays in the form to be put right; any other refusal is said below.
                onError: (error) => (fieldIssuesOf(error).length > 0 ? form.serverError(error) : close()),
              },
            )
          }
          role="group"
          aria-label={`Confirm role change for ${user.name}`}
          className="gap-2 rounded border border-sepia-200 bg-sepia-50 p-2.5 text-sm"
        >
          <p className="text-ink-900">
            Change {user.name} from <strong>{ROLE_LABELS[saved]}</strong> to <strong>{ROLE_LABELS[pending]}</strong>?
          </p>
          <TextInput name="reason" label="Reason (optional, kept in the audit trail)" />
          <div className="flex gap-2">
            <Button type="submit" size="sm" variant="primary" disabled={change.isPending}>
              {change.isPending ? 'Changing…' : 'Change role'}
            </Button>
            <Button size="sm" onClick={close} disabled={change.isPending}>
              Cancel
            </Button>
          </div>
        </SchemaForm>
      ) : null}

      {refused ? (
        <div role="alert" className="rounded border border-danger-200 bg-danger-50 px-2.5 py-1.5 text-sm text-danger-700">
          <p>{change.error.message}</p>
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
