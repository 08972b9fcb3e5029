import { NavLink } from 'react-router-dom';
import { can, type Permission, type Role } from '@toneledger/common/domain/roles';

interface Item {
  to: string;
  label: string;
  /** Only shown to roles with this permission. */
  permission?: Permission;
  end?: boolean;
}

/** The catalogue's sections, in order. Reference records (makers, papers, …) have their own screens. */
export const CATALOGUE_SECTIONS: Item[] = [
  { to: '/catalogue', label: 'Prints', end: true },
  { to: '/catalogue/import', label: 'Import', permission: 'catalogue.write' },
  { to: '/catalogue/entries', label: 'Entries and acquisitions', permission: 'catalogue.read_restricted' },
  { to: '/catalogue/makers', label: 'Makers' },
  { to: '/catalogue/papers', label: 'Papers' },
  { to: '/catalogue/recipes', label: 'Bath recipes' },
  { to: '/catalogue/locations', label: 'Locations', permission: 'catalogue.read_restricted' },
  { to: '/catalogue/enclosures', label: 'Enclosures' },
  { to: '/catalogue/fields', label: 'Data dictionary' },
  { to: '/catalogue/light-budgets', label: 'Light budgets', permission: 'light.read' },
  { to: '/catalogue/settings', label: 'Settings', permission: 'settings.manage' },
];

function classes({ isActive }: { isActive: boolean }) {
  return [
    'inline-block border-b-[3px] px-3 py-2 text-sm no-underline',
    isActive ? 'border-sepia-700 font-semibold text-iron-900' : 'border-transparent text-ink-800 hover:border-paper-400 hover:text-ink-900',
  ].join(' ');
}

export function CatalogueNav({ role, printsActive = false }: { role: Role; printsActive?: boolean }) {
  const items = CATALOGUE_SECTIONS.filter((item) => !item.permission || can(role, item.permission));
  return (
    <nav aria-label="Catalogue" className="mb-5 border-b border-paper-300 print:hidden">
      <ul className="-mb-px flex flex-wrap gap-1">
        {items.map((item) => (
          <li key={item.to}>
            <NavLink
              to={item.to}
              end={item.end}
              className={({ isActive }) => classes({ isActive: isActive || (printsActive && item.to === '/catalogue') })}
            >
              {item.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
