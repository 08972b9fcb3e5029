import type { QueryInterface } from 'sequelize';

/**
 * The audit screen filters by action and lists the actions recorded in its picker: an index on
 * (action, at) serves both (the picker walks it one action at a time, see audit-read.service.ts).
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('CREATE INDEX IF NOT EXISTS audit_events_action_idx ON audit_events (action, at)');
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP INDEX IF EXISTS audit_events_action_idx');
}
