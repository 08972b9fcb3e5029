import { DataTypes, type QueryInterface } from 'sequelize';

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query('CREATE EXTENSION IF NOT EXISTS pgcrypto');

  await qi.createTable('users', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal('gen_random_uuid()') },
    issuer: { type: DataTypes.TEXT, allowNull: true },
    subject: { type: DataTypes.TEXT, allowNull: true },
    email: { type: DataTypes.TEXT, allowNull: true },
    name: { type: DataTypes.TEXT, allowNull: false },
    role: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'viewer' },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('now()') },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('now()') },
    last_sign_in_at: { type: DataTypes.DATE, allowNull: true },
  });
  await qi.sequelize.query(
    `ALTER TABLE users ADD CONSTRAINT users_role_check
       CHECK (role IN ('admin','registrar','conservator','researcher','viewer'))`,
  );
  await qi.addIndex('users', ['issuer', 'subject'], { unique: true, name: 'users_issuer_subject_key' });
  await qi.sequelize.query('CREATE UNIQUE INDEX users_email_key ON users (lower(email)) WHERE email IS NOT NULL');

  await qi.createTable('audit_events', {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('now()') },
    actor_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    actor_name: { type: DataTypes.TEXT, allowNull: true },
    action: { type: DataTypes.TEXT, allowNull: false },
    entity_type: { type: DataTypes.TEXT, allowNull: false },
    entity_id: { type: DataTypes.TEXT, allowNull: true },
    before: { type: DataTypes.JSONB, allowNull: true },
    after: { type: DataTypes.JSONB, allowNull: true },
    request_id: { type: DataTypes.TEXT, allowNull: true },
    ip: { type: DataTypes.TEXT, allowNull: true },
  });
  await qi.addIndex('audit_events', ['entity_type', 'entity_id', 'at'], { name: 'audit_events_entity_idx' });
  await qi.addIndex('audit_events', ['at'], { name: 'audit_events_at_idx' });
  await qi.addIndex('audit_events', ['actor_id', 'at'], { name: 'audit_events_actor_idx' });
  // The audit trail is append-only: refuse UPDATE and DELETE at the database.
  await qi.sequelize.query(`
    CREATE FUNCTION audit_events_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN RAISE EXCEPTION 'audit_events is append-only'; END $$;
    CREATE TRIGGER audit_events_no_change BEFORE UPDATE OR DELETE ON audit_events
      FOR EACH ROW EXECUTE FUNCTION audit_events_append_only();
  `);

  // Server sessions (connect-pg-simple's layout).
  await qi.sequelize.query(`
    CREATE TABLE http_sessions (
      sid varchar NOT NULL PRIMARY KEY,
      sess json NOT NULL,
      expire timestamp(6) NOT NULL
    );
    CREATE INDEX http_sessions_expire_idx ON http_sessions (expire);
  `);
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.dropTable('http_sessions');
  await qi.sequelize.query('DROP TRIGGER IF EXISTS audit_events_no_change ON audit_events');
  await qi.dropTable('audit_events');
  await qi.sequelize.query('DROP FUNCTION IF EXISTS audit_events_append_only()');
  await qi.dropTable('users');
}
