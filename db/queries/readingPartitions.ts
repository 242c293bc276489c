/**
 * The month partitions of `readings` (migration 0014: native range partitions on `at`, one per
 * UTC month, made and dropped by pg_partman 4.x in schema `partman`, plus a default partition).
 *
 * A reading whose month has no partition lands in the default partition, and pg_partman cannot
 * make that month's partition while the default holds rows of it (its maintenance then fails
 * until they are moved). So everything that writes readings of any month makes sure first:
 * `ensureReadingPartitions` for a range (a CSV import of 2019, a sensor's buffered backlog), and
 * the ingest writer through `createReadingPartitionGuard`, which remembers the covered span and
 * asks the database only for a group outside it.
 *
 * The partitions are kept contiguous (the premade months ahead, retention dropping from the
 * oldest end, and every gap filled here), so what is covered is one span [from, to).
 */
import { DrizzleQueryError, sql } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';

import type { Db } from '../index';
import * as schema from '../schema';
import { transaction } from '../transaction';

export const READINGS_PARENT = 'public.readings';

/** Serializes partition making between instances (and against the maintenance job). */
const LOCK_KEY = sql`hashtext('drybench reading partitions')`;

/** Months of UTC, the partitions' unit. */
const monthStartMs = (ms: number) => {
  const d = new Date(ms);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), 1);
};
const addMonthsMs = (monthMs: number, months: number) => {
  const d = new Date(monthMs);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + months, 1);
};

/** The span [fromMs, toMs) that month partitions cover. */
export interface ReadingPartitionSpan {
  fromMs: number;
  toMs: number;
}

interface Partition {
  name: string;
  startMs: number;
  endMs: number;
}

/** The month partitions, oldest first (the default partition has no bounds and is left out). */
export async function readingPartitions(db: Pick<Db, 'execute'>): Promise<Partition[]> {
  const result = await db.execute<{ name: string; start_at: Date | string; end_at: Date | string }>(
    sql`
    select name, b[1]::timestamptz as start_at, b[2]::timestamptz as end_at
    from (
      select c.relname as name,
             regexp_match(pg_get_expr(c.relpartbound, c.oid), 'FROM \\(''([^'']+)''\\) TO \\(''([^'']+)''\\)') as b
      from pg_inherits i
      join pg_class c on c.oid = i.inhrelid
      where i.inhparent = ${READINGS_PARENT}::regclass
    ) p
    where b is not null
    order by start_at`,
  );
  return result.rows.map((r) => ({
    name: r.name,
    startMs: new Date(r.start_at).getTime(),
    endMs: new Date(r.end_at).getTime(),
  }));
}

/** How many rows sit in the default partition (0 is the healthy answer). */
export async function readingsInDefaultPartition(db: Pick<Db, 'execute'>): Promise<number> {
  const result = await db.execute<{ n: number }>(
    sql`select count(*)::int as n from readings_default`,
  );
  return result.rows[0]?.n ?? 0;
}

/** The months in [lo, hi) without a partition of their own. */
function missingMonths(parts: Partition[], fromMs: number, toMs: number) {
  const starts = new Set(parts.map((p) => p.startMs));
  const lo = Math.min(monthStartMs(fromMs), parts[0]?.startMs ?? Infinity);
  const hi = Math.max(addMonthsMs(monthStartMs(toMs), 1), parts.at(-1)?.endMs ?? -Infinity);
  const missing: number[] = [];
  for (let m = lo; m < hi; m = addMonthsMs(m, 1)) if (!starts.has(m)) missing.push(m);
  return { missing, span: { fromMs: lo, toMs: hi } };
}

/**
 * Makes sure every month from `fromAt` to `toAt` has its partition, and every month between
 * them and the partitions already there (so the set stays one span), then answers the span
 * covered. Idempotent; when nothing is missing it costs one catalog query and takes no lock.
 * Rows found in the default partition are moved into their months first (pg_partman's
 * partition_data_time), since a month's partition cannot be attached while the default holds
 * rows of it.
 */
export async function ensureReadingPartitions(
  db: Db,
  fromAt: Date,
  toAt: Date,
): Promise<ReadingPartitionSpan> {
  const fromMs = Math.min(fromAt.getTime(), toAt.getTime());
  const toMs = Math.max(fromAt.getTime(), toAt.getTime());
  const first = missingMonths(await readingPartitions(db), fromMs, toMs);
  if (first.missing.length === 0) return first.span;
  return makePartitions(db, fromMs, toMs);
}

/** Under the caller's transaction: the months made in it commit with the caller's rows. */
async function fillMonths(tx: Db, fromMs: number, toMs: number, settleDefault: boolean) {
  // pg_partman truncates and names months in the session's zone: UTC months, as migration 0014.
  await tx.execute(sql`set local time zone 'UTC'`);
  await tx.execute(sql`select pg_advisory_xact_lock(${LOCK_KEY})`);
  if (settleDefault || (await readingsInDefaultPartition(tx)) > 0) {
    await tx.execute(
      sql`select partman.partition_data_time(${READINGS_PARENT}, p_batch_count => 100000)`,
    );
  }
  // Read again under the lock: another instance may have made them meanwhile.
  const { missing, span } = missingMonths(await readingPartitions(tx), fromMs, toMs);
  if (missing.length > 0) {
    // An array literal as one parameter (drizzle would spread a JS array into a list).
    const times = `{${missing.map((ms) => new Date(ms).toISOString()).join(',')}}`;
    await tx.execute(
      sql`select partman.create_partition_time(${READINGS_PARENT}, ${times}::timestamptz[], false)`,
    );
  }
  return span;
}

/**
 * ensureReadingPartitions inside a transaction the caller already holds open on a plain client
 * (a CSV import's, whose staging table dies with it): Drizzle's own transaction() there would
 * send a second BEGIN and its COMMIT would end the caller's transaction early. The months made
 * here commit or roll back with the caller's rows; the session's time zone is put back after.
 */
export async function ensureReadingPartitionsWithin(
  tx: Db,
  fromAt: Date,
  toAt: Date,
): Promise<ReadingPartitionSpan> {
  const fromMs = Math.min(fromAt.getTime(), toAt.getTime());
  const toMs = Math.max(fromAt.getTime(), toAt.getTime());
  const first = missingMonths(await readingPartitions(tx), fromMs, toMs);
  if (first.missing.length === 0) return first.span;
  const zone = await tx.execute<{ zone: string }>(sql`select current_setting('TimeZone') as zone`);
  try {
    return await fillMonths(tx, fromMs, toMs, false);
  } finally {
    await tx.execute(sql`select set_config('TimeZone', ${zone.rows[0]!.zone}, true)`);
  }
}

async function makePartitions(db: Db, fromMs: number, toMs: number, settleDefault = false) {
  // On a pool, a transaction of its own; inside the caller's transaction, a savepoint, so the
  // new partitions commit with the caller's rows (a CSV import's insert … select).
  return transaction(db, (tx) => fillMonths(tx, fromMs, toMs, settleDefault));
}

const FURTHEST_AHEAD_MS = 400 * 86_400_000;

/** How long the writer trusts its remembered span: retention may drop the oldest month meanwhile. */
const GUARD_REFRESH_MS = 3_600_000;

export interface ReadingPartitionGuard {
  /**
   * Resolves at once (no query) when [minMs, maxMs] lies in the remembered span; otherwise makes
   * the partitions and remembers the new span.
   */
  cover(minMs: number, maxMs: number): Promise<void> | null;
}

/**
 * The writer's memory of the covered span, so the hot path pays two comparisons per group
 * (`cover` returns null) and the database is asked only when a group holds a reading older than
 * the oldest partition or newer than the premade ones, and once an hour.
 */
export function createReadingPartitionGuard(
  pool: pg.Pool,
  options: { now?: () => number; refreshMs?: number } = {},
): ReadingPartitionGuard {
  const now = options.now ?? Date.now;
  const refreshMs = options.refreshMs ?? GUARD_REFRESH_MS;
  const db = drizzle(pool, { schema, casing: 'snake_case' });
  let span: (ReadingPartitionSpan & { readAtMs: number }) | null = null;
  return {
    cover(minMs, rawMaxMs) {
      // Ingest refuses readings over 5 min ahead; a bypass must not premake years of months.
      const maxMs = Math.min(rawMaxMs, now() + FURTHEST_AHEAD_MS);
      if (maxMs < minMs) return null;
      if (span && minMs >= span.fromMs && maxMs < span.toMs && now() - span.readAtMs < refreshMs) {
        return null;
      }
      return ensureReadingPartitions(db, new Date(minMs), new Date(maxMs)).then(
        (covered) => {
          span = { ...covered, readAtMs: now() };
        },
        (err: unknown) => {
          // The writer tells a database that is away (503) from a refused row by node-postgres's
          // own error and code, which Drizzle wraps.
          throw err instanceof DrizzleQueryError && err.cause ? err.cause : err;
        },
      );
    },
  };
}

export interface ReadingPartitionMaintenance {
  /** Partitions made (premade months ahead, months of rows found in the default). */
  created: string[];
  /** Partitions dropped by retention. */
  dropped: string[];
}

/**
 * The daily maintenance: raw readings are kept `keepMonths` whole months (a partition goes once
 * its whole month is older than that), the months ahead are premade, and any rows in the default
 * partition are moved to their months first, since they would make pg_partman's maintenance
 * fail. Runs `partman.run_maintenance_proc()` (every pg_partman set of the database) on a
 * connection of its own, as the procedure commits as it goes. Roll-ups of an hour must be made
 * before its raw rows can go: the job runs them first.
 */
export async function runReadingPartitionMaintenance(
  db: Db,
  options: { keepMonths: number },
): Promise<ReadingPartitionMaintenance> {
  if (!Number.isInteger(options.keepMonths) || options.keepMonths < 1) {
    throw new RangeError(`keepMonths must be a whole number of months ≥ 1: ${options.keepMonths}`);
  }
  const pool = (db as { $client?: unknown }).$client;
  if (!(pool instanceof pg.Pool)) {
    throw new TypeError(
      'runReadingPartitionMaintenance needs a pool-backed Db (the procedure commits)',
    );
  }
  const before = new Set((await readingPartitions(db)).map((p) => p.name));
  await db.execute(sql`
    update partman.part_config
    set retention = ${`${options.keepMonths} months`}, retention_keep_table = false,
        infinite_time_partitions = true
    where parent_table = ${READINGS_PARENT}`);
  const nowMs = Date.now();
  await makePartitions(db, nowMs, nowMs, true);

  const client = await pool.connect();
  let broken = false;
  try {
    await client.query(`set time zone 'UTC'`);
    // Session-level: the procedure commits between partition sets, and the writer's
    // ensureReadingPartitions must not make a month while it does.
    await client.query(`select pg_advisory_lock(hashtext('drybench reading partitions'))`);
    try {
      await client.query('call partman.run_maintenance_proc()');
    } finally {
      await client.query(`select pg_advisory_unlock(hashtext('drybench reading partitions'))`);
    }
    await client.query('reset time zone');
  } catch (err) {
    broken = true;
    throw err;
  } finally {
    client.release(broken);
  }
  const after = (await readingPartitions(db)).map((p) => p.name);
  const afterSet = new Set(after);
  return {
    created: after.filter((n) => !before.has(n)),
    dropped: [...before].filter((n) => !afterSet.has(n)),
  };
}
