import { Outlet, useLocation } from 'react-router-dom';
import { useMe } from '@/lib/auth';
import { CatalogueNav } from '@/features/catalogue/components/catalogue-nav';

/** The catalogue area: its sub-navigation above whichever catalogue screen is open. */
export function CatalogueLayout() {
  const me = useMe();
  const { pathname } = useLocation();
  // "Prints" stays marked while a print, its form or its process history is open.
  const inPrints = pathname.startsWith('/catalogue/prints');
  return (
    <div>
      <CatalogueNav role={me.role} printsActive={inPrints} />
      <Outlet />
    </div>
  );
}
