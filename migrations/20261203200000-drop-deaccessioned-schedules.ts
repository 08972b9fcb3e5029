import type { QueryInterface } from 'sequelize';

/**
 * A deaccessioned print is no longer inspected: the next-inspection rows of prints deaccessioned
 * before the schedule learnt this go (the schedule job drops them from now on).
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`DELETE FROM print_schedules s USING prints p WHERE p.id = s.print_id AND p.status = 'deaccessioned';`);
}

export async function down(): Promise<void> {
  // Nothing to restore: the rows are recomputed from the records if the rule is ever undone.
}
