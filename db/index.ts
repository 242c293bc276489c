/** The database client: one pg pool and a Drizzle instance over it. */
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';

import * as schema from './schema';

export type Db = NodePgDatabase<typeof schema>;

export interface Database {
  pool: pg.Pool;
  db: Db;
}

/**
 * The server's defaults. A statement past 10 s is a lock or an overloaded database: cancelling it
 * frees the connection and lets the request answer 503 instead of hanging. The client-side limit
 * is longer, so normally the server cancels first; it still ends a wait for an answer that never
 * comes (a half-open connection), which no server-side limit can.
 */
export const DEFAULT_STATEMENT_TIMEOUT_MS = 10_000;
export const DEFAULT_QUERY_TIMEOUT_MS = 15_000;

export interface DatabaseOptions {
  max?: number;
  /** PostgreSQL's statement_timeout for every connection of the pool; none when omitted. */
  statementTimeoutMs?: number;
  /** node-postgres's query_timeout ("Query read timeout"); none when omitted. */
  queryTimeoutMs?: number;
  /** How long a caller waits for a free connection (or a new one) before failing; 3 s. */
  connectionTimeoutMs?: number;
  /** PostgreSQL's application_name: tells this pool's sessions apart in pg_stat_activity. */
  applicationName?: string;
  /** Settings for every session of the pool, as command-line options (`-c jit=off`). */
  sessionOptions?: string;
}

/**
 * Connections of the server's second pool, for long background work (roll-ups after an import
 * and every 5 min, partition maintenance): those jobs wait for one of these instead of taking
 * the request pool's, so however much of it runs, requests find their pool as they left it. Three:
 * two import workers and one scheduled job can each roll at once, and partition maintenance
 * (which holds one session while it asks for another) always finds a second.
 */
export const BACKGROUND_POOL_MAX = 3;
/**
 * Background work may queue for its pool: a roll-up statement lasts seconds at most (the
 * statement timeout), so a minute's wait means PostgreSQL itself is in trouble.
 */
export const BACKGROUND_CONNECTION_TIMEOUT_MS = 60_000;

// Migrations and the seed script call this without timeouts: a long migration is not a fault.
export function createDatabase(url: string, options: DatabaseOptions = {}): Database {
  const pool = new pg.Pool({
    connectionString: url,
    max: options.max ?? 10,
    // Fail fast when PostgreSQL is down, so requests answer 503 instead of hanging.
    connectionTimeoutMillis: options.connectionTimeoutMs ?? 3000,
    statement_timeout: options.statementTimeoutMs,
    query_timeout: options.queryTimeoutMs,
    application_name: options.applicationName,
    options: options.sessionOptions,
  });
  // A client losing its connection (database restart) must not crash the process: idle ones
  // report on the pool, checked-out ones on themselves. The query in flight still rejects.
  pool.on('error', () => {});
  pool.on('connect', (client) => client.on('error', () => {}));
  return { pool, db: drizzle(pool, { schema, casing: 'snake_case' }) };
}

export { schema };
