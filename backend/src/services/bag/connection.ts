import { db } from '../../db';

/** A raw pg connection of the app's pool: `query(text, values)` answers `{ rows }`. */
export interface RawConnection {
  query<T = Record<string, unknown>>(text: string, values?: unknown[]): Promise<{ rows: T[]; rowCount: number | null }>;
}

/** Runs `fn` on one connection of Sequelize's pool, held for its whole run (a bag's snapshot or transaction). */
export async function withConnection<T>(fn: (c: RawConnection) => Promise<T>): Promise<T> {
  const manager = db().connectionManager as unknown as {
    getConnection(): Promise<RawConnection>;
    releaseConnection(connection: unknown): Promise<void>;
  };
  const connection = await manager.getConnection();
  try {
    return await fn(connection);
  } finally {
    await manager.releaseConnection(connection);
  }
}

/** Tables of the public schema that exist here, with their columns (generated ones apart). */
export interface Schema {
  has(table: string): boolean;
  /** Columns a row is written with (no generated column), in table order. */
  columns(table: string): string[];
  /** Generated columns, left out of the bag. */
  generated(table: string): string[];
  /** Columns that refer to users(id), by table. */
  userColumns(table: string): string[];
  /** Primary key columns. */
  primaryKey(table: string): string[];
  /** Columns filled from a sequence. */
  serial(table: string): string[];
  tables(): string[];
  /** PostgreSQL's type of each written column. */
  types(table: string): Record<string, string>;
  /** Columns that may hold NULL. */
  nullable(table: string): Set<string>;
}

export async function readSchema(c: RawConnection): Promise<Schema> {
  const cols = (await c.query<{ table_name: string; column_name: string; generated: boolean; serial: boolean; data_type: string; nullable: boolean }>(
    `SELECT table_name, column_name, is_generated = 'ALWAYS' AS generated, coalesce(column_default LIKE 'nextval(%', false) AS serial,
       CASE WHEN data_type = 'ARRAY' THEN substr(udt_name, 2) || '[]' WHEN data_type = 'USER-DEFINED' THEN udt_name ELSE data_type END AS data_type,
       is_nullable = 'YES' AS nullable
     FROM information_schema.columns WHERE table_schema = 'public' ORDER BY table_name, ordinal_position`,
  )).rows;
  const fks = (await c.query<{ table_name: string; column_name: string }>(
    `SELECT c.conrelid::regclass::text AS table_name, a.attname AS column_name FROM pg_constraint c
     JOIN pg_attribute a ON a.attrelid = c.conrelid AND a.attnum = ANY (c.conkey)
     WHERE c.contype = 'f' AND c.confrelid = 'users'::regclass AND c.connamespace = 'public'::regnamespace`,
  )).rows;
  const pks = (await c.query<{ table_name: string; column_name: string }>(
    `SELECT c.conrelid::regclass::text AS table_name, a.attname AS column_name FROM pg_constraint c
     JOIN pg_attribute a ON a.attrelid = c.conrelid AND a.attnum = ANY (c.conkey)
     WHERE c.contype = 'p' AND c.connamespace = 'public'::regnamespace ORDER BY array_position(c.conkey, a.attnum)`,
  )).rows;
  const group = <R extends { table_name: string; column_name: string }>(rows: R[], keep: (r: R) => boolean) => {
    const m = new Map<string, string[]>();
    for (const r of rows) if (keep(r)) m.set(r.table_name, [...(m.get(r.table_name) ?? []), r.column_name]);
    return m;
  };
  const written = group(cols, (r) => !r.generated);
  const generated = group(cols, (r) => r.generated);
  const serial = group(cols, (r) => r.serial);
  const users = group(fks, () => true);
  const pk = group(pks, () => true);
  const tables = new Set(cols.map((r) => r.table_name));
  return {
    has: (t) => tables.has(t),
    columns: (t) => written.get(t) ?? [],
    generated: (t) => generated.get(t) ?? [],
    userColumns: (t) => users.get(t) ?? [],
    primaryKey: (t) => pk.get(t) ?? [],
    serial: (t) => serial.get(t) ?? [],
    tables: () => [...tables].sort(),
    types: (t) => Object.fromEntries(cols.filter((r) => r.table_name === t && !r.generated).map((r) => [r.column_name, r.data_type])),
    nullable: (t) => new Set(cols.filter((r) => r.table_name === t && r.nullable).map((r) => r.column_name)),
  };
}

/** `to_jsonb(alias)` without the table's generated columns (search vectors are rebuilt from the row). */
export function rowJson(schema: Schema, table: string, alias: string): string {
  const gen = schema.generated(table);
  return gen.length ? `(to_jsonb(${alias}) - ARRAY[${gen.map((g) => `'${g}'`).join(', ')}]::text[])` : `to_jsonb(${alias})`;
}
