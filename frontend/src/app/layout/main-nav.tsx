import { NavLink } from 'react-router-dom';
import type { Area } from '@toneledger/common/domain/areas';
import type { Me } from '@toneledger/common/schemas/users';
import { navAreas } from '@/app/layout/nav-areas';

function linkClasses({ isActive }: { isActive: boolean }): string {
  return [
    'block rounded px-3 py-1.5 text-sm no-underline border-l-[3px]',
    isActive
      ? 'border-sepia-700 bg-iron-100 font-semibold text-iron-900'
      : 'border-transparent text-ink-800 hover:bg-paper-200 hover:text-ink-900',
  ].join(' ');
}

function AreaLinks({ areas, labelledBy }: { areas: Area[]; labelledBy?: string }) {
  return (
    <ul className="flex flex-col gap-0.5" aria-labelledby={labelledBy}>
      {areas.map((area) => (
        <li key={area.id}>
          <NavLink to={area.path} className={linkClasses}>
            {area.label}
          </NavLink>
        </li>
      ))}
    </ul>
  );
}

/** The main navigation: only the areas the person's role opens. */
export function MainNav({ me }: { me: Pick<Me, 'role' | 'environment'> }) {
  const { main, admin } = navAreas(me);
  return (
    <nav aria-label="Main" className="flex flex-col gap-5">
      <AreaLinks areas={main} />
      {admin.length > 0 ? (
        <div>
          <h2 id="nav-administration" className="mb-1 px-3 font-sans text-xs font-semibold tracking-wider text-ink-600 uppercase">
            Administration
          </h2>
          <AreaLinks areas={admin} labelledBy="nav-administration" />
        </div>
      ) : null}
    </nav>
  );
}
