import { Link } from 'react-router-dom';
import { can, ROLE_LABELS } from '@toneledger/common/domain/roles';
import type { Me } from '@toneledger/common/schemas/users';
import { useSignOut } from '@/lib/auth';

export function UserBlock({ me }: { me: Pick<Me, 'name' | 'email' | 'role'> }) {
  const signOut = useSignOut();
  return (
    <div className="flex items-center gap-3">
      <div className="text-right leading-tight">
        <p className="text-sm font-medium text-paper-50" title={me.email ?? undefined}>
          {me.name}
        </p>
        <p className="text-xs text-iron-200">
          <span className="sr-only">Role: </span>
          <span data-testid="user-role">{ROLE_LABELS[me.role]}</span>
        </p>
      </div>
      {can(me.role, 'schedule.read') ? (
        <Link to="/inspections/reminders" className="on-dark text-sm text-paper-50 underline-offset-2 hover:underline">
          Reminders
        </Link>
      ) : null}
      <button
        type="button"
        onClick={() => signOut.mutate()}
        disabled={signOut.isPending}
        aria-describedby={signOut.isError ? 'sign-out-error' : undefined}
        className="on-dark h-8 rounded border border-iron-200/60 px-3 text-sm font-medium text-paper-50 hover:bg-iron-800 disabled:opacity-60"
      >
        Sign out
      </button>
      {signOut.isError ? (
        <p id="sign-out-error" role="alert" className="max-w-48 text-xs text-sepia-200">
          Could not sign out: {signOut.error.message}
        </p>
      ) : null}
    </div>
  );
}
