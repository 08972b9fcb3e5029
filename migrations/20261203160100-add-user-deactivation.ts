import type { QueryInterface } from 'sequelize';

/**
 * A person can be deactivated: kept in the record (their name stays on everything they did), unable
 * to sign in, their sessions ended. Reactivation clears the mark.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE users ADD COLUMN deactivated_at timestamptz;
    ALTER TABLE users ADD COLUMN deactivation_reason text;
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`ALTER TABLE users DROP COLUMN deactivation_reason; ALTER TABLE users DROP COLUMN deactivated_at;`);
}
