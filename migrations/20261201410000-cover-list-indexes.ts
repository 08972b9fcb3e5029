import type { QueryInterface } from 'sequelize';

/**
 * Deep pages of the catalogue list first find the page's ids in an index and only then read the
 * rows (see buildListSql). These versions of the sort indexes carry the id (and, for the process
 * + date order, the toner classes), so finding a page is an index-only scan however deep it is.
 */
const REPLACE: [string, string][] = [
  ['prints_accession_sort_idx', 'CREATE INDEX prints_accession_sort_idx ON prints (accession_sort) INCLUDE (id)'],
  ['prints_title_sort_idx', 'CREATE INDEX prints_title_sort_idx ON prints (lower(title), accession_sort) INCLUDE (id)'],
  ['prints_maker_sort_idx', 'CREATE INDEX prints_maker_sort_idx ON prints (maker_name, accession_sort) INCLUDE (id)'],
  ['prints_date_sort_idx', 'CREATE INDEX prints_date_sort_idx ON prints (date_earliest, accession_sort) INCLUDE (id)'],
  ['prints_status_sort_idx', 'CREATE INDEX prints_status_sort_idx ON prints (status, accession_sort) INCLUDE (id)'],
  ['prints_process_date_idx', 'CREATE INDEX prints_process_date_idx ON prints (process, date_earliest, accession_sort) INCLUDE (id, toner_classes)'],
];

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const [name, create] of REPLACE) {
    await qi.sequelize.query(`DROP INDEX IF EXISTS ${name}`);
    await qi.sequelize.query(create);
  }
  await qi.sequelize.query('ANALYZE prints');
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const [name, create] of REPLACE) {
    await qi.sequelize.query(`DROP INDEX IF EXISTS ${name}`);
    await qi.sequelize.query(create.replace(/ INCLUDE \([^)]*\)/, ''));
  }
}
