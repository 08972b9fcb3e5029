import type { QueryInterface } from 'sequelize';

/**
 * The work list's risk filter walks prints of one band in date order; open rounds are found by
 * status (the work list's assignee filter and each row's round look only at planned rounds).
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE INDEX print_schedules_risk_due_idx ON print_schedules (risk, due_on, print_id);
    CREATE INDEX inspection_rounds_open_idx ON inspection_rounds (id) INCLUDE (assignee_id, planned_on) WHERE status = 'planned';
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP INDEX IF EXISTS print_schedules_risk_due_idx; DROP INDEX IF EXISTS inspection_rounds_open_idx;');
}
