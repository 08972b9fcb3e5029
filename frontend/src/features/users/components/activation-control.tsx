import { useState } from 'react';
import { deactivationSchema, type User } from '@toneledger/common/schemas/users';
import { TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { useMe } from '@/lib/auth';
import { fieldIssuesOf } from '@/lib/forms/field-errors';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { formatDate } from '@/lib/format';
import { useActivation } from '@/features/users/api/deactivate';

/**
 * Whether a person can sign in, and the command to change it. A deactivated person stays in the
 * record; their sessions end at once. Nobody deactivates themselves, and the one active
 * administrator cannot be deactivated: both are said here before anything is offered.
 */
export function ActivationControl({ user }: { user: User }) {
  const me = useMe();
  const activation = useActivation();
  const [confirming, setConfirming] = useState(false);
  const form = useSchemaForm({
    schema: deactivationSchema,
    defaultValues: { reason: '' },
    toBody: (values: { reason: string }) => ({ reason: values.reason.trim() === '' ? undefined : values.reason }),
  });
  const refused = activation.isError && fieldIssuesOf(activation.error).length === 0;

  if (user.deactivatedAt) {
    return (
      <div className="flex min-w-44 flex-col gap-1 text-sm">
        <span className="font-medium text-danger-700">Deactivated {formatDate(user.deactivatedAt)}</span>
        <Button size="sm" onClick={() => activation.mutate({ id: user.id, deactivate: false })} disabled={activation.isPending} aria-label={`Reactivate ${user.name}`}>
          {activation.isPending ? 'Reactivating…' : 'Reactivate'}
        </Button>
        {refused ? <p role="alert" className="text-danger-700">{activation.error.message}</p> : null}
      </div>
    );
  }

  const why = user.id === me.id ? 'You cannot deactivate yourself.' : user.lastAdmin ? 'The only administrator: make someone else an administrator first.' : null;
  return (
    <div className="flex min-w-44 flex-col gap-1 text-sm">
      <span className="text-ok-700">Active</span>
      {why ? (
        <span className="text-xs text-ink-700">{why}</span>
      ) : confirming ? (
        <SchemaForm
          form={form}
          onValid={(body) =>
            activation.mutate(
              { id: user.id, deactivate: true, body },
              { onSuccess: () => setConfirming(false), onError: (error) => (fieldIssuesOf(error).length > 0 ? form.serverError(error) : setConfirming(false)) },
            )
          }
          role="group"
          aria-label={`Confirm deactivation of ${user.name}`}
          className="gap-2 rounded border border-danger-200 bg-danger-50 p-2.5"
        >
          <p className="text-ink-900">
            Deactivate {user.name}? They stay in the record, cannot sign in, and any session of theirs ends now.
          </p>
          <TextInput name="reason" label="Reason (optional, kept in the audit trail)" />
          <div className="flex gap-2">
            <Button type="submit" size="sm" variant="primary" disabled={activation.isPending}>
              {activation.isPending ? 'Deactivating…' : 'Deactivate'}
            </Button>
            <Button size="sm" onClick={() => setConfirming(false)} disabled={activation.isPending}>
              Cancel
            </Button>
          </div>
        </SchemaForm>
      ) : (
        <Button size="sm" onClick={() => setConfirming(true)} aria-label={`Deactivate ${user.name}`}>
          Deactivate…
        </Button>
      )}
      {refused ? <p role="alert" className="text-danger-700">{activation.error.message}</p> : null}
    </div>
  );
}
