import type { QueryInterface } from 'sequelize';

/**
 * IIIF image answers kept in object storage, one row per stored object: the image it was made from
 * lets the purge of a withdrawn image delete its cached answers too.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE iiif_cache (
      key text PRIMARY KEY,
      image_id uuid NOT NULL,
      byte_size integer NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX iiif_cache_image ON iiif_cache (image_id);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP TABLE iiif_cache;');
}
