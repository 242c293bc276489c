// Vitest global setup for tests that need PostgreSQL: scripts/test.sh starts the test server
// and sets DATABASE_URL; this applies the committed migrations once per run.
import { createDatabase } from '@/db';
import { runMigrations } from '@/db/migrate';

export default async function setup() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: run the tests with `npm test`.');
  const { pool, db } = createDatabase(url, { max: 1 });
  try {
    await runMigrations(db);
  } finally {
    await pool.end();
  }
}
