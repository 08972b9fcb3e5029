import type { ReactNode } from 'react';
import { can, type Permission } from '@toneledger/common/domain/roles';
import { useMe } from '@/lib/auth';
import { NotAllowedPage } from '@/app/routes/not-allowed-page';

/** Shows a page inside an area only to roles with the permission. The server enforces the same rule. */
export function RequirePermission({ permission, what, children }: { permission: Permission; what: string; children: ReactNode }) {
  const me = useMe();
  if (!can(me.role, permission)) return <NotAllowedPage what={what} />;
  return <>{children}</>;
}
