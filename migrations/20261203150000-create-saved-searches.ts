import type { QueryInterface } from 'sequelize';

/** Named catalogue searches, one person's own unless shared (then everyone who reads the catalogue sees them). */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE saved_searches (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      query jsonb NOT NULL,
      shared boolean NOT NULL DEFAULT false,
      owner_id uuid NOT NULL REFERENCES users(id),
      owner_name text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      version integer NOT NULL DEFAULT 1
    );
    CREATE INDEX saved_searches_owner ON saved_searches (owner_id);
    CREATE INDEX saved_searches_shared ON saved_searches (shared) WHERE shared;
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP TABLE saved_searches;');
}
