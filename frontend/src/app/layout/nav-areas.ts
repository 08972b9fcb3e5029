import { ADMIN_AREAS, AREAS, areasFor, type Area } from '@toneledger/common/domain/areas';
import { can } from '@toneledger/common/domain/roles';
import type { Me } from '@toneledger/common/schemas/users';

/** Areas that exist only on a developer's or a test machine. */
const NON_PRODUCTION_AREAS = new Set(['mail']);

function existsHere(area: Area, environment: Me['environment']): boolean {
  return environment !== 'production' || !NON_PRODUCTION_AREAS.has(area.id);
}

/** The areas a person's role opens, split into the main list and the administration group. */
export function navAreas(me: Pick<Me, 'role' | 'environment'>): { main: Area[]; admin: Area[] } {
  return {
    main: areasFor(me.role, AREAS),
    admin: areasFor(me.role, ADMIN_AREAS).filter((area) => existsHere(area, me.environment)),
  };
}

export type AreaAccess = 'open' | 'not_allowed' | 'absent';

export function areaAccess(area: Area, me: Pick<Me, 'role' | 'environment'>): AreaAccess {
  if (!existsHere(area, me.environment)) return 'absent';
  return can(me.role, area.permission) ? 'open' : 'not_allowed';
}
