/** The database client: one pg pool and a Drizzle instance over it. */
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';

import * as schema from './schema';

export type Db = NodePgDatabase<typeof schema>;

export interface Database {
  pool: pg.Pool;
  db: Db;
}

export function createDatabase(url: string, options: { max?: number } = {}): Database {
  const pool = new pg.Pool({
    connectionString: url,
    max: options.max ?? 10,
    // Fail fast when PostgreSQL is down, so requests answer 503 instead of hanging.
    connectionTimeoutMillis: 3000,
  });
  // A client losing its connection (database restart) must not crash the process: idle ones
  // report on the pool, checked-out ones on themselves. The query in flight still rejects.
  pool.on('error', () => {});
  pool.on('connect', (client) => client.on('error', () => {}));
  return { pool, db: drizzle(pool, { schema, casing: 'snake_case' }) };
}

export { schema };
