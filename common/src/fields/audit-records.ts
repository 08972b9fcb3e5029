/**
 * The kinds of record the audit trail is about, in words, and the page each kind opens on. The audit
 * events keep their record type as a code (`condition_report`) and the record's id; the screen and the
 * export show these labels instead ("Condition report"), and the server names each record (a print's
 * accession number, a loan's reference…) so no code or id is the visible text.
 *
 * Every record type the server writes has a line here (`audit-records.test.ts` reads the code for them).
 */
export const AUDIT_RECORD_KINDS = {
  acquisition: 'Acquisition',
  bag: 'Preservation package',
  climate_file: 'Climate logger file',
  condition_report: 'Condition report',
  condition_term: 'Condition term',
  deaccession: 'Deaccession',
  display: 'Display period',
  enclosure: 'Enclosure type',
  exhibition: 'Exhibition',
  image: 'Image',
  inspection_round: 'Inspection round',
  loan: 'Loan',
  location: 'Location',
  mail: 'Test mail',
  maker: 'Maker',
  measurement_session: 'Measurement session',
  measurement_spot: 'Measurement spot',
  object_entry: 'Object entry',
  paper: 'Paper',
  print: 'Print',
  print_schedule: 'Inspection date',
  recipe: 'Bath recipe',
  research_query: 'Research query',
  saved_search: 'Saved search',
  settings: 'Settings',
  treatment: 'Treatment',
  user: 'Person',
} as const satisfies Record<string, string>;
export type AuditRecordKind = keyof typeof AUDIT_RECORD_KINDS;

/** The kind of a record in words; a type this table does not know yet is still words, never its code. */
export function recordKindLabel(code: string): string {
  const known = (AUDIT_RECORD_KINDS as Record<string, string>)[code];
  if (known) return known;
  const words = code.replace(/[._]+/g, ' ').trim();
  return words ? words.charAt(0).toUpperCase() + words.slice(1) : 'Record';
}

/** The kinds, sorted by label: what the "Record type" picker offers. */
export function recordKindChoices(): { code: AuditRecordKind; label: string }[] {
  return (Object.entries(AUDIT_RECORD_KINDS) as [AuditRecordKind, string][])
    .map(([code, label]) => ({ code, label }))
    .sort((a, b) => a.label.localeCompare(b.label));
}

/** The settings sections by their key (a settings event's record is its section). */
export const SETTINGS_SECTION_NAMES: Record<string, string> = {
  catalogue: 'Catalogue',
  climate: 'Climate',
  condition: 'Condition',
  light: 'Light',
  measurements: 'Measurements',
};

/** The pages a record in the trail can open: the kind of page and where it lives. */
export const RECORD_PAGES = {
  print: '/catalogue/prints/:id',
  print_measurements: '/measurements/prints/:id',
  condition_report: '/condition/reports/:id',
  treatment: '/condition/treatments/:id',
  object_entry: '/catalogue/entries/:id',
  recipe: '/catalogue/recipes/:id',
  loan: '/loans/:id',
  exhibition: '/exhibitions/:id',
  inspection_round: '/inspections/rounds/:id',
  location: '/climate/locations/:id',
} as const;
export type RecordPage = keyof typeof RECORD_PAGES;
export const RECORD_PAGE_KINDS = Object.keys(RECORD_PAGES) as [RecordPage, ...RecordPage[]];

/** The address of a record's page. */
export function recordPagePath(link: { page: RecordPage; id: string }): string {
  return RECORD_PAGES[link.page].replace(':id', encodeURIComponent(link.id));
}

/** A record as a person names it: "Print 1987.14.3", or its kind alone when it has no name. */
export function recordLabel(record: { kind: string; name: string | null }): string {
  return record.name ? `${record.kind} ${record.name}` : record.kind;
}
