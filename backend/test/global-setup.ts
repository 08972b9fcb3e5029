// Runs once before the backend tests: the database named by DATABASE_URL is migrated.
// `npm test` starts a private PostgreSQL and the local fakes and sets the environment.
export default async function setup() {
  if (!process.env.DATABASE_URL || !process.env.OIDC_ISSUER) {
    throw new Error('The backend tests need the local services: run them with `npm test` (or `npm test -- --project backend`).');
  }
  const { migrateUp } = await import('../src/migrate');
  const { db, closeDb } = await import('../src/db');
  await migrateUp(db());
  await closeDb();
}
