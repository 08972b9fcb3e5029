import type { QueryInterface } from 'sequelize';

/**
 * An import can carry a second file (the process histories, one step per row), can update prints
 * matched by accession number, and keeps what each row of the checked file would do (create,
 * update with its changes, or nothing) so the preview can page through it. `plan_hash` fingerprints
 * that plan: a commit refuses to write when the catalogue has changed since the check.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    ALTER TABLE imports
      ADD COLUMN steps_file_name text,
      ADD COLUMN steps_source text,
      ADD COLUMN step_rows integer NOT NULL DEFAULT 0,
      ADD COLUMN to_create integer NOT NULL DEFAULT 0,
      ADD COLUMN to_update integer NOT NULL DEFAULT 0,
      ADD COLUMN unchanged_rows integer NOT NULL DEFAULT 0,
      ADD COLUMN ignored_columns jsonb NOT NULL DEFAULT '[]',
      ADD COLUMN plan_hash text,
      ADD COLUMN mode text CHECK (mode IN ('create_only', 'create_or_update')),
      ADD COLUMN updated_prints integer NOT NULL DEFAULT 0;

    CREATE TABLE import_rows (
      import_id uuid NOT NULL REFERENCES imports(id) ON DELETE CASCADE,
      row integer NOT NULL,
      accession_number text NOT NULL,
      action text NOT NULL CHECK (action IN ('create', 'update', 'unchanged')),
      changes jsonb NOT NULL DEFAULT '[]',
      PRIMARY KEY (import_id, row)
    );
    CREATE INDEX import_rows_action_idx ON import_rows (import_id, action, row);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    DROP TABLE import_rows;
    ALTER TABLE imports
      DROP COLUMN steps_file_name, DROP COLUMN steps_source, DROP COLUMN step_rows, DROP COLUMN to_create, DROP COLUMN to_update,
      DROP COLUMN unchanged_rows, DROP COLUMN ignored_columns, DROP COLUMN plan_hash, DROP COLUMN mode, DROP COLUMN updated_prints;
  `);
}
