import type { QueryInterface } from 'sequelize';

/**
 * Each stale mark carries a number from a sequence, renewed whenever its print is marked again. The
 * schedule work reads the marks and their numbers without locking them, and at the end deletes only
 * the marks whose number is still the one it read: a print marked again while its batch was being
 * computed (from inputs read before that change) keeps its mark and is computed again, and the
 * change that marks it never waits for the batch.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE SEQUENCE schedule_stale_seq;
    ALTER TABLE schedule_stale ADD COLUMN seq bigint NOT NULL DEFAULT nextval('schedule_stale_seq');
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`ALTER TABLE schedule_stale DROP COLUMN seq; DROP SEQUENCE schedule_stale_seq;`);
}
