import { can, type Permission, type Role } from './roles';

/** The product's areas, in navigation order, each opened by one permission. */
export interface Area {
  id: string;
  label: string;
  path: string;
  permission: Permission;
  summary: string;
  /** false while the area's screens are still being built. */
  ready: boolean;
}

export const AREAS: Area[] = [
  { id: 'catalogue', label: 'Catalogue', path: '/catalogue', permission: 'catalogue.read', ready: true,
    summary: 'Print records with their process history, papers, bath recipes, locations and enclosures.' },
  { id: 'condition', label: 'Condition', path: '/condition', permission: 'condition.read', ready: true,
    summary: 'Signed condition reports, observations and images, with addenda instead of edits.' },
  { id: 'measurements', label: 'Measurements', path: '/measurements', permission: 'measurements.read', ready: true,
    summary: 'Colour and density at registered spots, ΔE00 against baseline, fading rates and projections.' },
  { id: 'loans', label: 'Loans', path: '/loans', permission: 'loans.read', ready: true,
    summary: 'Loans out and in: the other institution, dates, conditions asked for, objects with their condition reports, and a status that moves in order.' },
  { id: 'exhibitions', label: 'Exhibitions', path: '/exhibitions', permission: 'loans.read', ready: true,
    summary: 'Exhibitions with their venues, object lists, approval for display and the display periods each print spends in the light.' },
  { id: 'climate', label: 'Climate', path: '/climate', permission: 'climate.read', ready: true,
    summary: 'Temperature and RH from loggers in each store room: excursions, time outside the targets, relative permanence.' },
  { id: 'schedule', label: 'Inspections', path: '/inspections', permission: 'schedule.read', ready: true,
    summary: 'Next-inspection dates from an explainable risk model; overdue and due-soon prints.' },
  { id: 'research', label: 'Research', path: '/research', permission: 'research.run', ready: true,
    summary: 'Cohorts by process, toner, paper and treatment; fading distributions and survival curves.' },
];

export const ADMIN_AREAS: Area[] = [
  { id: 'users', label: 'People and roles', path: '/admin/users', permission: 'users.manage', ready: true,
    summary: 'Everyone who has signed in, and the role each holds.' },
  { id: 'audit', label: 'Audit trail', path: '/admin/audit', permission: 'audit.read', ready: true,
    summary: 'Every sign-in, sign-out and change: who, when, before and after.' },
  { id: 'mail', label: 'Outgoing mail', path: '/admin/mail', permission: 'dev_mail.read', ready: true,
    summary: 'Messages caught by the local mail sink (development only).' },
  { id: 'digests', label: 'Weekly digests', path: '/admin/digests', permission: 'digests.read', ready: true,
    summary: 'The weekly e-mail of prints due for inspection: each one sent or tried, with failures and their error.' },
  { id: 'preservation', label: 'Preservation package', path: '/admin/preservation', permission: 'collection.export', ready: true,
    summary: 'The whole collection out as a BagIt bag (records, CSVs, images, audit trail, data dictionary), and a bag brought into a new installation.' },
];

export function areasFor(role: Role | null | undefined, areas: Area[] = AREAS): Area[] {
  return areas.filter((a) => can(role, a.permission));
}
