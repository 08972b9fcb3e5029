import pg from 'pg';

/** The test run's own database, as the run's setup gave it, before a test points DATABASE_URL at a database of its own. */
const SHARED = process.env.DATABASE_URL!;

/**
 * Runs one statement on the test cluster outside any app (CREATE or DROP DATABASE for a test that
 * seeds a database of its own, so the shared test database never holds the demo).
 */
export async function onServer(sql: string): Promise<void> {
  const client = new pg.Client({ connectionString: SHARED });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}
