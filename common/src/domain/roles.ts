/**
 * Roles and what each may do. One table, read by the server (which enforces it on every
 * route) and by the client (which only hides what a role cannot use).
 */
export const ROLES = ['admin', 'registrar', 'conservator', 'researcher', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  registrar: 'Registrar',
  conservator: 'Conservator',
  researcher: 'Researcher',
  viewer: 'Viewer',
};

export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  admin: 'Users and roles, vocabularies and settings; everything a registrar can do.',
  registrar: 'Catalogues prints, process history, recipes, papers, locations, movements and loans.',
  conservator: 'Condition checks, measurements, images, treatments, light and climate; owns the inspection schedule. Does not see valuations.',
  researcher: 'Reads everything but valuations, runs longevity queries and exports datasets; edits nothing.',
  viewer: 'Reads the catalogue, without locations, valuations or staff notes.',
};

/** Permissions name an action, never a screen. */
export const PERMISSIONS = {
  'catalogue.read': ['admin', 'registrar', 'conservator', 'researcher', 'viewer'],
  'catalogue.read_restricted': ['admin', 'registrar', 'conservator', 'researcher'],
  'catalogue.write': ['admin', 'registrar'],
  /** Moving prints and rehousing them (location and enclosure only): conservators too; every other catalogue field stays the registrar's. */
  'prints.move': ['admin', 'registrar', 'conservator'],
  /** Insurance valuations of prints (amount and currency): on screen, in every export and in the history. */
  'valuation.read': ['admin', 'registrar'],
  'condition.read': ['admin', 'registrar', 'conservator', 'researcher'],
  'condition.write': ['conservator'],
  /** Treatments: proposing, recording the work and signing (read with `condition.read`). */
  'treatments.write': ['conservator'],
  /** Object entries, acquisitions and accessioning (read with `catalogue.read_restricted`). */
  'acquisitions.write': ['admin', 'registrar'],
  /** Deaccession proposals, their approval and completion (read with `catalogue.read_restricted`). */
  'deaccessions.write': ['admin', 'registrar'],
  'images.read': ['admin', 'registrar', 'conservator', 'researcher', 'viewer'],
  'images.write': ['admin', 'registrar', 'conservator'],
  'images.original': ['admin', 'registrar', 'conservator', 'researcher'],
  /** Reading fixity alerts (images whose check failed): conservators care for the images too. */
  'fixity.read': ['admin', 'conservator'],
  'fixity.manage': ['admin'],
  'measurements.read': ['admin', 'registrar', 'conservator', 'researcher'],
  'measurements.write': ['conservator'],
  /** Loans and exhibitions: everyone reads them (values need `valuation.read`); registrars manage them. */
  'loans.read': ['admin', 'registrar', 'conservator', 'researcher', 'viewer'],
  'loans.write': ['admin', 'registrar'],
  /** Display periods (dates, illuminance, hours): registrars plan them, conservators record the conditions. */
  'displays.write': ['admin', 'registrar', 'conservator'],
  /** Approving or refusing a print for display, with a reason. */
  'displays.approve': ['conservator'],
  'light.read': ['admin', 'registrar', 'conservator', 'researcher'],
  /** Overriding a print's light responsivity category, with a reason. */
  'light.write': ['conservator'],
  /** Storage climate: logger readings and their figures; conservators load the logger files. */
  'climate.read': ['admin', 'registrar', 'conservator', 'researcher'],
  'climate.write': ['conservator'],
  'schedule.read': ['admin', 'registrar', 'conservator', 'researcher'],
  /** The inspection schedule: overriding a print's date with a reason, planning and changing rounds, a full recompute. */
  'schedule.write': ['conservator'],
  /** Every weekly digest sent or tried, with failures. */
  'digests.read': ['admin'],
  'research.run': ['admin', 'conservator', 'researcher'],
  /** Cohort datasets out (Frictionless Data Packages); audited. */
  'research.export': ['admin', 'conservator', 'researcher'],
  /** The whole collection out as a BagIt bag (records, images, audit trail); audited. */
  'collection.export': ['admin'],
  /** A selection of prints (a catalogue search or a list) out as a BagIt bag; audited. */
  'selection.export': ['admin', 'registrar'],
  /** A bag brought into an installation that holds no prints; audited. */
  'collection.import': ['admin'],
  'users.manage': ['admin'],
  'audit.read': ['admin'],
  'settings.manage': ['admin'],
  'dev_mail.read': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function can(role: Role | null | undefined, permission: Permission): boolean {
  if (!role) return false;
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

export function rolesWith(permission: Permission): Role[] {
  return [...PERMISSIONS[permission]];
}
