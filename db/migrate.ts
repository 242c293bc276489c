/** Applies the committed drizzle-kit migrations in db/migrations. */
import path from 'node:path';
import { fileURLToPath } from 'node:url';

import { migrate } from 'drizzle-orm/node-postgres/migrator';

import type { Db } from './index';

const migrationsFolder = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');

export async function runMigrations(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder });
}
