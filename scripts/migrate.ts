import { migrateUp } from '../backend/src/migrate';
import { db, closeDb } from '../backend/src/db';

// Runs pending migrations against DATABASE_URL (production or a database you name).
const done = await migrateUp(db(), (m) => console.log(m));
console.log(done.length ? `Applied: ${done.join(', ')}` : 'Nothing to migrate.');
await closeDb();
