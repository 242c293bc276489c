/**
 * Group commit for readings. Requests that arrive while a write is in flight wait a moment and
 * go into the next statement together: one statement inserts every row (through unnest, so it
 * has a fixed 20 parameters whatever the row count), updates the sensors and sends each
 * request's live message, committed as one (db/queries/readings.ts). Each request's promise
 * settles only after that commit, so a 202 always means the rows are durable.
 *
 * Live messages: the writer builds one reading message per request (server/live/messages.ts)
 * before the statement, for the usual case that every row is new, and hands the statement the
 * strings. When some rows turn out to be duplicates the statement sends none, and the writer
 * sends the messages of the rows that were new right after, before the request settles.
 *
 * Isolation: one request's rows must never fail another's. When a group statement fails for a
 * reason that is not transient (the database refused some row, not "the database is away"),
 * each request of the group is written again alone, so only the one at fault fails. A
 * transient failure rejects the whole group: every request answers 503 and its sensor retries.
 *
 * Partitions: readings are partitioned by month (db/queries/readingPartitions.ts). A group whose
 * times all lie in the span the guard remembers goes straight to the statement; one holding an
 * older reading (a sensor's buffer, a logger's backlog) or one beyond the premade months first
 * has its months made, so no reading lands in the default partition.
 *
 * Back-pressure: rows accepted but not yet committed are counted; past `maxPendingRows` a
 * request is refused at once (503 `busy` with Retry-After) instead of queueing in memory
 * behind a database that cannot keep up.
 */
import type pg from 'pg';

import { LIVE_CHANNEL, notify } from '@/db/notify';
import {
  createReadingPartitionGuard,
  type ReadingPartitionGuard,
} from '@/db/queries/readingPartitions';
import {
  insertReadingGroup,
  readingKey,
  type InsertedKeys,
  type ReadingRow,
} from '@/db/queries/readings';
import { MIN_TIME_MS } from '@/ingest/readingFields';

import { ApiError, isDatabaseUnavailable, RetryLaterError } from '../errors';
import type { LiveEcho } from '../live/localEcho';
import { readingMessage } from '../live/messages';
import { markCommitted, stageMs, stageTraceOn } from '../stageTrace';

export interface WriteOutcome {
  /** `at` (epoch ms) of the rows this request inserted; the others were duplicates. */
  insertedMs: Set<number>;
}

export interface ReadingWriter {
  /** Stores one request's rows (and sends their live message); settles after the commit. */
  write(rows: ReadingRow[]): Promise<WriteOutcome>;
  close(): Promise<void>;
}

interface Pending {
  rows: ReadingRow[];
  /** STAGE_TRACE only (server/stageTrace.ts): when it joined the queue. */
  queuedAtMs?: number;
  resolve: (outcome: WriteOutcome) => void;
  reject: (err: unknown) => void;
}

export interface WriterOptions {
  /** How long the first request of a group waits for company when nothing is in flight. */
  maxWaitMs: number;
  /** Statements in flight at once; more pending requests queue for the next group. */
  maxInFlight: number;
  /** A group is cut at this many rows. */
  maxGroupRows: number;
  /** Rows queued or in flight, at most; a request that would pass it is refused as busy. */
  maxPendingRows: number;
}

/**
 * 50,000 rows is ~2.5 s of the group writer's measured rate (~19,000 readings/s) and a few tens
 * of MB of rows: a backlog a healthy database clears quickly, and a bound on memory
 * when it cannot. Operators change it with INGEST_MAX_PENDING_ROWS (server/config.ts).
 */
export const DEFAULT_MAX_PENDING_ROWS = 50_000;

/** What a refused sensor is told to wait: long enough for a backlog of the bound to clear. */
const BUSY_RETRY_AFTER_S = 5;

// maxWaitMs 1 rather than 2 measured +15–23 % single-reading throughput for ~30 % more
// database CPU per reading (npm run bench, A/B on this 2-core machine).
const DEFAULTS: WriterOptions = {
  maxWaitMs: 1,
  maxInFlight: 2,
  maxGroupRows: 10_000,
  maxPendingRows: DEFAULT_MAX_PENDING_ROWS,
};

/** The error a request gets when the database refused its own rows (SQLSTATE class 22). */
function unstorable(): ApiError {
  return new ApiError(
    422,
    'unstorable_reading',
    'The database refused a value of these readings (a time or number out of its range); check the sensor clock and values.',
  );
}

const isDataException = (err: unknown) =>
  typeof err === 'object' &&
  err !== null &&
  typeof (err as { code?: unknown }).code === 'string' &&
  (err as { code: string }).code.startsWith('22');

export function createReadingWriter(
  pool: pg.Pool,
  options: Partial<WriterOptions> & {
    partitions?: ReadingPartitionGuard;
    /** This instance's live hub hears its own messages at commit (server/live/localEcho.ts). */
    echo?: LiveEcho;
  } = {},
): ReadingWriter {
  const opts = { ...DEFAULTS, ...options };
  const partitions = options.partitions ?? createReadingPartitionGuard(pool);
  let queue: Pending[] = [];
  // Rows of the requests in `queue` and in flight: kept as a counter so the hot path adds one
  // addition and one comparison, never a walk over the queue.
  let pendingRows = 0;
  let queuedRows = 0;
  let inFlight = 0;
  let timer: NodeJS.Timeout | null = null;
  const idle: (() => void)[] = [];

  function schedule() {
    if (timer || queue.length === 0 || inFlight >= opts.maxInFlight) return;
    // With a write already in flight, the queue fills while it runs: go as soon as it ends.
    const waitMs = inFlight > 0 ? 0 : opts.maxWaitMs;
    timer = setTimeout(() => {
      timer = null;
      void flush();
    }, waitMs);
  }

  async function flush() {
    if (queue.length === 0 || inFlight >= opts.maxInFlight) return;
    const group: Pending[] = [];
    let rowCount = 0;
    while (
      queue.length > 0 &&
      (group.length === 0 || rowCount + queue[0]!.rows.length <= opts.maxGroupRows)
    ) {
      const next = queue.shift()!;
      if (next.queuedAtMs !== undefined)
        stageMs('writer.queue', performance.now() - next.queuedAtMs);
      group.push(next);
      rowCount += next.rows.length;
    }
    queuedRows -= rowCount;
    inFlight++;
    try {
      await settle(group);
    } finally {
      pendingRows -= rowCount;
      inFlight--;
      if (queue.length > 0) schedule();
      else if (inFlight === 0) idle.splice(0).forEach((done) => done());
    }
  }

  /** Writes a group; on a failure that is not transient, each request again alone. */
  async function settle(group: Pending[]) {
    try {
      const outcomes = await writeGroup(pool, partitions, group, options.echo);
      group.forEach((p, i) => p.resolve(outcomes[i]!));
      return;
    } catch (err) {
      if (group.length === 1) {
        group[0]!.reject(isDataException(err) ? unstorable() : err);
        return;
      }
      if (isDatabaseUnavailable(err)) {
        for (const p of group) p.reject(err);
        return;
      }
    }
    // One statement per request, one after another: a rare path (the checks in ingest/ stop
    // what they know of), and in sequence it takes one connection, not the pool.
    for (const p of group) await settle([p]);
  }

  return {
    write(rows) {
      if (rows.length === 0) return Promise.resolve({ insertedMs: new Set() });
      // A lone request larger than the bound still goes through when nothing else is pending.
      if (pendingRows > 0 && pendingRows + rows.length > opts.maxPendingRows) {
        return Promise.reject(
          new RetryLaterError(
            'busy',
            `Storage is behind with earlier readings; keep these and retry in ${BUSY_RETRY_AFTER_S} s.`,
            BUSY_RETRY_AFTER_S,
          ),
        );
      }
      pendingRows += rows.length;
      queuedRows += rows.length;
      return new Promise<WriteOutcome>((resolve, reject) => {
        queue.push({
          rows,
          resolve,
          reject,
          ...(stageTraceOn ? { queuedAtMs: performance.now() } : {}),
        });
        if (queuedRows >= opts.maxGroupRows) void flush();
        else schedule();
      });
    },
    async close() {
      if (timer) clearTimeout(timer);
      timer = null;
      if (queue.length > 0) void flush();
      if (inFlight > 0 || queue.length > 0)
        await new Promise<void>((resolve) => idle.push(resolve));
      queue = [];
      queuedRows = 0;
    },
  };
}

async function writeGroup(
  pool: pg.Pool,
  partitions: ReadingPartitionGuard,
  group: Pending[],
  echo?: LiveEcho,
): Promise<WriteOutcome[]> {
  // The first request to name a (sensor, at) owns it; a later one in the same group is a duplicate.
  // Each request's owned rows and their keys are kept, so the keys are built once per row.
  const owner = new Set<string>();
  const owned: ReadingRow[][] = [];
  const ownedKeys: string[][] = [];
  const rows: ReadingRow[] = [];
  let minMs = Infinity;
  let maxMs = -Infinity;
  for (const p of group) {
    const mine: ReadingRow[] = [];
    const myKeys: string[] = [];
    for (const row of p.rows) {
      const atMs = row.at.getTime();
      const k = readingKey(row.sensorId, atMs);
      if (owner.has(k)) continue;
      owner.add(k);
      mine.push(row);
      myKeys.push(k);
      rows.push(row);
      // A time before the contract's earliest never passes ingest's checks: it makes no
      // partition (a value PostgreSQL cannot store fails the statement, as it should).
      if (atMs < minMs && atMs >= MIN_TIME_MS) minMs = atMs;
      if (atMs > maxMs) maxMs = atMs;
    }
    owned.push(mine);
    ownedKeys.push(myKeys);
  }
  // Null (no query) when every month already has its partition: the usual case.
  const making = maxMs >= minMs ? partitions.cover(minMs, maxMs) : null;
  if (making) await making;

  // The rows each request owns and that were new, given the keys the database inserted.
  const freshOf = (insertedKeys: InsertedKeys) =>
    insertedKeys.size === rows.length
      ? owned
      : owned.map((mine, i) => mine.filter((_, j) => insertedKeys.has(ownedKeys[i]![j]!)));
  const liveMessages = (fresh: ReadingRow[][]) =>
    fresh.filter((f) => f.length > 0).map((f) => JSON.stringify(readingMessage(f)));

  const t0 = performance.now();
  const messages = liveMessages(owned);
  echo?.expect(messages);
  let insertedKeys: InsertedKeys;
  try {
    insertedKeys = await insertReadingGroup(pool, rows, messages);
  } catch (err) {
    echo?.forget(messages);
    throw err;
  }
  // The statement notifies only when every row was new.
  if (insertedKeys.size === rows.length) echo?.committed(messages);
  else echo?.forget(messages);
  if (stageTraceOn) {
    const t1 = performance.now();
    stageMs('writer.statement', t1 - t0);
    stageMs('writer.groupRows', rows.length);
    markCommitted(messages);
  }
  const fresh = freshOf(insertedKeys);
  // Some rows were duplicates, so the statement sent nothing: tell about the new ones only.
  // The rows are committed already, so this goes out after the commit, never for a lost row.
  if (insertedKeys.size > 0 && insertedKeys.size < rows.length) {
    const later = liveMessages(fresh);
    echo?.expect(later);
    try {
      await notify(pool, LIVE_CHANNEL, later);
    } catch (err) {
      echo?.forget(later);
      throw err;
    }
    echo?.committed(later);
  }
  return fresh.map((f) => ({ insertedMs: new Set(f.map((r) => r.at.getTime())) }));
}
