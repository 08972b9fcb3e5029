import type { QueryInterface } from 'sequelize';

/**
 * The first answer to a create sent with an `Idempotency-Key` header, per user and key, so a retry
 * of the same request gets that answer again instead of a second record. `request` is the method and
 * path, `body_hash` the SHA-256 of the canonical JSON body; `status` and `response` are null while
 * the first request is still running. Rows older than 24 hours are never replayed and are swept.
 */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query(`
    CREATE TABLE idempotency_keys (
      user_id uuid NOT NULL REFERENCES users(id),
      key text NOT NULL,
      request text NOT NULL,
      body_hash text NOT NULL,
      status integer,
      response jsonb,
      created_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (user_id, key)
    );
    CREATE INDEX idempotency_keys_created_at_idx ON idempotency_keys (created_at);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('DROP TABLE idempotency_keys');
}
