import type { QueryInterface } from 'sequelize';

/**
 * Undated prints and prints with no maker go last whichever way the list is sorted; a backward
 * scan of an ascending index would put them first, so the descending orders get indexes of their own.
 */
const INDEXES: [string, string][] = [
  ['prints_date_sort_desc_idx', 'CREATE INDEX prints_date_sort_desc_idx ON prints (date_earliest DESC NULLS LAST, accession_sort DESC) INCLUDE (id)'],
  ['prints_maker_sort_desc_idx', 'CREATE INDEX prints_maker_sort_desc_idx ON prints (maker_name DESC NULLS LAST, accession_sort DESC) INCLUDE (id)'],
  ['prints_process_date_desc_idx', 'CREATE INDEX prints_process_date_desc_idx ON prints (process, date_earliest DESC NULLS LAST, accession_sort DESC) INCLUDE (id, toner_classes)'],
];

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const [name, create] of INDEXES) {
    await qi.sequelize.query(`DROP INDEX IF EXISTS ${name}`);
    await qi.sequelize.query(create);
  }
  await qi.sequelize.query('ANALYZE prints');
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const [name] of INDEXES) await qi.sequelize.query(`DROP INDEX IF EXISTS ${name}`);
}
