import type { QueryInterface } from 'sequelize';

/**
 * Preservation packages: each export of the collection or of a selection as a BagIt bag, and each
 * import of such a bag, with its progress, outcome and (for an export) the object that holds the bag.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE bag_jobs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      kind text NOT NULL CHECK (kind IN ('export', 'import')),
      scope text NOT NULL CHECK (scope IN ('collection', 'selection')),
      selection jsonb,
      with_images boolean NOT NULL DEFAULT true,
      status text NOT NULL DEFAULT 'queued' CHECK (status IN ('queued', 'running', 'done', 'failed')),
      stage text,
      done integer NOT NULL DEFAULT 0,
      total integer NOT NULL DEFAULT 0,
      object_key text,
      size_bytes bigint,
      payload_oxum text,
      file_count integer,
      problems jsonb NOT NULL DEFAULT '[]',
      error text,
      created_by uuid REFERENCES users(id),
      created_by_name text,
      created_at timestamptz NOT NULL DEFAULT now(),
      started_at timestamptz,
      finished_at timestamptz
    );
    CREATE INDEX bag_jobs_created_idx ON bag_jobs (created_at DESC);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP TABLE bag_jobs');
}
