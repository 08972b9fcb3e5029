import type { ReactNode } from 'react';
import type { Area } from '@toneledger/common/domain/areas';
import { useMe } from '@/lib/auth';
import { areaAccess } from '@/app/layout/nav-areas';
import { NotAllowedPage } from '@/app/routes/not-allowed-page';
import { NotFoundPage } from '@/app/routes/not-found-page';

/** Shows an area's page only to roles it opens. The server enforces the same rule on every request. */
export function RequireArea({ area, children }: { area: Area; children: ReactNode }) {
  const me = useMe();
  const access = areaAccess(area, me);
  if (access === 'absent') return <NotFoundPage />;
  if (access === 'not_allowed') return <NotAllowedPage what={`“${area.label}”`} />;
  return <>{children}</>;
}
