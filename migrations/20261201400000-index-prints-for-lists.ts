import type { QueryInterface } from 'sequelize';

/**
 * Indexes for the catalogue list at collection scale (hundreds of thousands of prints): one per
 * sort order (each ends with the accession sort key, so ties are stable and a backward scan
 * serves the descending order), the reference columns used as filters, GIN indexes for the
 * toner and warning arrays and the two full-text columns, and a pattern index for accession
 * number prefixes. The effect is measured by `npm run bench`.
 */
const INDEXES = [
  'CREATE INDEX IF NOT EXISTS prints_accession_sort_idx ON prints (accession_sort)',
  'CREATE INDEX IF NOT EXISTS prints_accession_prefix_idx ON prints (lower(accession_number) text_pattern_ops)',
  'CREATE INDEX IF NOT EXISTS prints_title_sort_idx ON prints (lower(title), accession_sort)',
  'CREATE INDEX IF NOT EXISTS prints_maker_sort_idx ON prints (maker_name, accession_sort)',
  'CREATE INDEX IF NOT EXISTS prints_date_sort_idx ON prints (date_earliest, accession_sort)',
  'CREATE INDEX IF NOT EXISTS prints_status_sort_idx ON prints (status, accession_sort)',
  'CREATE INDEX IF NOT EXISTS prints_updated_idx ON prints (updated_at, id)',
  'CREATE INDEX IF NOT EXISTS prints_process_date_idx ON prints (process, date_earliest, accession_sort)',
  'CREATE INDEX IF NOT EXISTS prints_maker_id_idx ON prints (maker_id)',
  'CREATE INDEX IF NOT EXISTS prints_paper_id_idx ON prints (paper_id)',
  'CREATE INDEX IF NOT EXISTS prints_enclosure_id_idx ON prints (enclosure_id)',
  'CREATE INDEX IF NOT EXISTS prints_location_id_idx ON prints (location_id)',
  'CREATE INDEX IF NOT EXISTS prints_toner_classes_idx ON prints USING gin (toner_classes)',
  'CREATE INDEX IF NOT EXISTS prints_warning_codes_idx ON prints USING gin (warning_codes)',
  'CREATE INDEX IF NOT EXISTS prints_search_idx ON prints USING gin (search)',
  'CREATE INDEX IF NOT EXISTS prints_search_notes_idx ON prints USING gin (search_notes)',
  'CREATE INDEX IF NOT EXISTS process_steps_print_idx ON process_steps (print_id, position)',
];

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const sql of INDEXES) await qi.sequelize.query(sql);
  await qi.sequelize.query('ANALYZE prints');
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const sql of INDEXES) {
    const name = sql.match(/EXISTS (\S+)/)![1];
    await qi.sequelize.query(`DROP INDEX IF EXISTS ${name}`);
  }
}
