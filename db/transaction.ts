/**
 * Transactions on a pool client of their own, released as broken when anything fails. Drizzle's
 * db.transaction() sends BEGIN outside its try block, so a connection that dies at BEGIN (a
 * database restart) is never released and the pool slowly runs dry; these cannot leak that way.
 * Notifications sent inside are delivered by PostgreSQL only if the transaction commits.
 */
import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';

import type { Db } from './index';
import * as schema from './schema';

/** `work` runs between BEGIN and COMMIT on one client; any failure rolls back. */
export async function inTransaction<T>(
  pool: pg.Pool,
  work: (client: pg.PoolClient) => Promise<T>,
): Promise<T> {
  const client = await pool.connect();
  let broken = false;
  try {
    await client.query('begin');
    const result = await work(client);
    await client.query('commit');
    return result;
  } catch (err) {
    broken = true;
    await client.query('rollback').catch(() => {});
    throw err;
  } finally {
    // A client whose transaction failed may hold a dead connection: drop it from the pool.
    client.release(broken);
  }
}

/**
 * One Drizzle instance per pool client, made on the client's first transaction: drizzle() walks
 * the whole schema to build its relational map (extractTablesRelationalConfig), which cost 1–2 %
 * of the server's CPU when it ran for every transaction. The instance holds nothing of a
 * transaction, only the client, and goes with it (a broken client is dropped, and its entry with it).
 */
const drizzleOfClient = new WeakMap<pg.PoolClient | pg.Client, Db>();

/** Drizzle over a transaction's client, for query files written with it. */
export function drizzleOn(client: pg.PoolClient | pg.Client): Db {
  let db = drizzleOfClient.get(client);
  if (!db) {
    db = drizzle(client, { schema, casing: 'snake_case' });
    drizzleOfClient.set(client, db);
  }
  return db;
}

/** The same, with Drizzle over the transaction's client. */
export function withTransaction<T>(pool: pg.Pool, work: (tx: Db) => Promise<T>): Promise<T> {
  return inTransaction(pool, (client) => work(drizzleOn(client)));
}

/**
 * A Drizzle transaction for the query files: on the pool's own client when `db` is the pool
 * (the leak-proof path above), or Drizzle's nested transaction when `db` is already one.
 */
export function transaction<T>(db: Db, work: (tx: Db) => Promise<T>): Promise<T> {
  const client = (db as { $client?: unknown }).$client;
  if (client instanceof pg.Pool) return withTransaction(client, work);
  return db.transaction((tx) => work(tx as unknown as Db));
}
