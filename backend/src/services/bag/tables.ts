/**
 * The records of the collection that belong to no single print, written to
 * `data/records/<table>.jsonl` (one stored row per line) in this order, which is the order an import
 * writes them back: a table after the tables it refers to. Prints and their sections follow
 * (sections/index.ts), and the audit trail comes last (`data/audit/audit_events.jsonl`).
 */
export interface CollectionTable {
  table: string;
  description: string;
  /** Order of the rows (SQL over alias `t`); the primary key when absent. */
  orderBy?: string;
  /** A statement giving the rows (as text, column `j`) in a different order, when parents must come before children. */
  fromSql?: string;
  /** What an import does when the empty installation already holds a row with the same key. */
  onConflict?: 'update';
}

export const COLLECTION_TABLES: readonly CollectionTable[] = [
  { table: 'users', description: 'People who worked on the records: name, role, sign-in identity (issuer and subject), email. Matched to an installation\'s own accounts by identity or email on import.', orderBy: 't.created_at, t.id' },
  { table: 'settings', description: 'The institution\'s settings (catalogue, condition, measurement, light, climate), one JSON value per key.', orderBy: 't.key', onConflict: 'update' },
  { table: 'makers', description: 'Photographers and studios.' },
  { table: 'papers', description: 'Photographic papers: manufacturer, brand, surface, base, dates.' },
  { table: 'bath_recipes', description: 'Toning and processing recipes, with ingredients and cautions.' },
  { table: 'enclosure_types', description: 'Housing: sleeves, folders, boxes, with their materials and test results.' },
  {
    table: 'locations', description: 'Stores, cabinets, drawers, boxes: a tree (parent_id), parents first.',
    fromSql: `WITH RECURSIVE d AS (SELECT id, 0 AS depth FROM locations WHERE parent_id IS NULL
      UNION ALL SELECT l.id, d.depth + 1 FROM locations l JOIN d ON l.parent_id = d.id)
      SELECT to_jsonb(t)::text AS j FROM locations t JOIN d USING (id) ORDER BY d.depth, t.id`,
  },
  { table: 'condition_terms', description: 'The condition vocabulary: codes, labels, definitions.', orderBy: 't.code', onConflict: 'update' },
  { table: 'object_entries', description: 'Objects received (object entry): from whom, why, when, the entry number.' },
  { table: 'acquisitions', description: 'Acquisitions and accessioning: method, source, approval, credit line (the prints of each are in the prints\' files).' },
  { table: 'exhibitions', description: 'Exhibitions (the prints in each are in the prints\' files).' },
  { table: 'exhibition_venues', description: 'Each venue of an exhibition, with its dates.' },
  { table: 'loans', description: 'Loans in and out: borrower or lender, dates, conditions (the prints on each are in the prints\' files).' },
  { table: 'loan_status_changes', description: 'Every change of a loan\'s status, in order.' },
  { table: 'climate_files', description: 'Logger files loaded for a location: name, checksum, period, who loaded it.' },
  { table: 'climate_readings', description: 'Temperature and relative humidity readings per location and time.', orderBy: 't.location_id, t.taken_at' },
  { table: 'inspection_rounds', description: 'Planned inspection rounds (the prints in each are in the prints\' files).' },
  { table: 'research_queries', description: 'Saved longevity research queries.' },
  { table: 'saved_searches', description: 'Saved catalogue searches.' },
  { table: 'reminder_preferences', description: 'Each person\'s reminder and digest choices.', orderBy: 't.user_id' },
  { table: 'digest_sends', description: 'Every weekly digest sent or tried.' },
  { table: 'imports', description: 'CSV imports into the catalogue: files, checks, outcome.' },
  { table: 'import_rows', description: 'What each row of an import did.', orderBy: 't.import_id, t.row' },
];

/** The audit trail: every change to every record, append-only. */
export const AUDIT_TABLE = 'audit_events';

/**
 * Tables the bag leaves out: sessions, retry keys and job rows belong to a running server, and the
 * marks and caches below are recomputed from the records.
 */
export const LEFT_OUT_TABLES: Readonly<Record<string, string>> = {
  schema_migrations: 'the installation\'s own migration log',
  http_sessions: 'sign-in sessions of a running server',
  idempotency_keys: 'retry keys of a running server, kept 24 hours',
  bag_jobs: 'this installation\'s own exports and imports of bags',
  schedule_stale: 'marks of prints whose next inspection date a job recomputes',
  print_step_factors: 'a research cache recomputed from the process steps',
  print_cohort: 'a research cache of each print\'s factors and outcomes, recomputed from the records',
  iiif_cache: 'image tiles and sizes made from the originals',
};
