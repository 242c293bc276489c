// Applies the committed migrations to DATABASE_URL.
import { createDatabase } from '@/db';
import { runMigrations } from '@/db/migrate';

async function main() {
  const { pool, db } = createDatabase(process.env.DATABASE_URL ?? '');
  await runMigrations(db);
  await pool.end();
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
