import type { QueryInterface } from 'sequelize';

/**
 * The day a print's deaccession was completed, read by the deaccession guard
 * (`backend/src/services/print-lock.ts`) for its message. Prints already marked deaccessioned before
 * the deaccession record existed take the day their row last changed.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE prints ADD COLUMN deaccessioned_on date;
    UPDATE prints SET deaccessioned_on = updated_at::date WHERE status = 'deaccessioned';
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`ALTER TABLE prints DROP COLUMN deaccessioned_on;`);
}
