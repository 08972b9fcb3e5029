import type { QueryInterface } from 'sequelize';

/**
 * The check and the commit of an import run as queued jobs that find their work on the import row.
 * The row keeps who asked for the commit and the request's id, so a commit interrupted by a stopped
 * server is run again for the same person (its audit rows name them) when the workers start.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE imports
      ADD COLUMN committed_by uuid REFERENCES users(id),
      ADD COLUMN commit_request_id text;
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('ALTER TABLE imports DROP COLUMN committed_by, DROP COLUMN commit_request_id;');
}
