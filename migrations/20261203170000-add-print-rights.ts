import type { QueryInterface } from 'sequelize';

/**
 * A print's rights statement: one URI of a Creative Commons licence or public-domain tool, or a
 * RightsStatements.org statement (the values IIIF Presentation 3.0 takes in a manifest's `rights`).
 * The contract checks and normalises the value (`common/src/domain/rights.ts`); the column is plain text.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`ALTER TABLE prints ADD COLUMN rights text;`);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`ALTER TABLE prints DROP COLUMN rights;`);
}
