import type { Location } from '@toneledger/common/schemas/catalogue';
import { LOCATION_KIND } from '@toneledger/common/schemas/vocab';

export interface LocationNode extends Location {
  children: LocationNode[];
}

/**
 * The flat list (sorted by path) as a tree. A place whose parent is not in the list (e.g. when a
 * search leaves the parent out) becomes a root, so nothing is hidden.
 */
export function buildLocationTree(locations: Location[]): LocationNode[] {
  const nodes = new Map<string, LocationNode>(locations.map((l) => [l.id, { ...l, children: [] }]));
  const roots: LocationNode[] = [];
  for (const location of locations) {
    const node = nodes.get(location.id)!;
    const parent = location.parentId ? nodes.get(location.parentId) : undefined;
    if (parent) parent.children.push(node);
    else roots.push(node);
  }
  return roots;
}

/** The ids of a place and everything inside it (a place cannot move into any of them). */
export function selfAndDescendants(locations: Location[], id: string): Set<string> {
  const children = new Map<string, string[]>();
  for (const l of locations) {
    if (!l.parentId) continue;
    children.set(l.parentId, [...(children.get(l.parentId) ?? []), l.id]);
  }
  const out = new Set<string>();
  const stack = [id];
  while (stack.length > 0) {
    const next = stack.pop()!;
    if (out.has(next)) continue;
    out.add(next);
    stack.push(...(children.get(next) ?? []));
  }
  return out;
}

type Kind = (typeof LOCATION_KIND.codes)[number];

/** The kind a new place inside a parent usually is: a room in a building, a drawer in a cabinet… */
export function suggestedChildKind(parent: Kind | null | undefined): Kind {
  switch (parent) {
    case undefined:
    case null:
      return 'building';
    case 'building':
      return 'room';
    case 'room':
      return 'cabinet';
    case 'cabinet':
      return 'drawer';
    case 'shelf':
    case 'drawer':
      return 'box';
    default:
      return 'other';
  }
}
