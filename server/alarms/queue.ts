/**
 * Alarm judging off the ingest path. A request's readings are durable once committed, so the
 * sensor gets its 202 then; the alarm engine catches up here. Zones waiting their turn gather
 * every reading that arrives meanwhile and are judged once for all of them, a zone at most once
 * per `minIntervalMs`. Every zone due is judged in one batch — one transaction whose statements
 * each cover the whole set — and at most `concurrency` batches run at a time, so under a burst
 * alarm work grows with the number of batches (about one a second), not with the requests or
 * the busy zones, and never crowds out ingest itself.
 *
 * Readings still queued when the process stops are not judged here; the zone's next reading
 * is (its margins come from the database), and silence has its own sweep.
 */
import type { ReadingRow } from '@/db/queries/readings';

import type { Logger } from '../logger';

import type { AlarmEngine } from './engine';

type ZoneOf = Parameters<AlarmEngine['judge']>[0];

export interface AlarmQueue {
  /** Queues a request's newly stored rows; resolves once they have been judged. */
  add(where: ZoneOf, rows: ReadingRow[]): Promise<void>;
  /** Resolves when nothing is queued or being judged (for shutdown and tests). */
  drained(): Promise<void>;
}

interface Pending {
  where: ZoneOf;
  rows: ReadingRow[];
  done: (() => void)[];
}

export interface AlarmQueueOptions {
  /** Batches of zones judged at once; each holds a database connection while it runs. */
  concurrency: number;
  /** A batch is cut at this many zones (its statements' arrays, its transaction's locks). */
  maxZonesPerBatch: number;
  /** A zone that falls this far behind keeps only its newest rows (a burst, not history). */
  maxRowsPerZone: number;
  /**
   * A zone is judged at most this often; what arrives in between is judged together. Alarms
   * act on minutes (the early warning looks an hour ahead), so a second's delay costs nothing,
   * while judging a busy zone per request would cost more CPU than storing the readings.
   */
  minIntervalMs: number;
  now: () => number;
}

const DEFAULTS: AlarmQueueOptions = {
  concurrency: 2,
  maxZonesPerBatch: 500,
  maxRowsPerZone: 5000,
  minIntervalMs: 1000,
  now: Date.now,
};

export function createAlarmQueue(
  engine: AlarmEngine,
  logger: Logger,
  options: Partial<AlarmQueueOptions> = {},
): AlarmQueue {
  const opts = { ...DEFAULTS, ...options };
  const log = logger.child({ component: 'alarms' });
  const pending = new Map<string, Pending>();
  const judging = new Set<string>();
  const lastStartMs = new Map<string, number>();
  let wakeUp: NodeJS.Timeout | null = null;
  let idleWaiters: (() => void)[] = [];

  /** Batches being judged; each holds a database connection while it runs. */
  let running = 0;

  function settle(batch: [string, Pending][]) {
    running -= 1;
    for (const [zoneId, next] of batch) {
      judging.delete(zoneId);
      next.done.forEach((resolve) => resolve());
    }
    if (pending.size === 0 && judging.size === 0) {
      idleWaiters.forEach((resolve) => resolve());
      idleWaiters = [];
    }
    pump();
  }

  /**
   * Starts judging every zone that is due, all in one batch (one transaction of set-based
   * statements, server/alarms/engine.ts). Zones that arrive while a batch runs gather for the
   * next, so under load a batch holds every zone a writer group touched.
   */
  function pump() {
    const nowMs = opts.now();
    let nextDueMs = Infinity;
    while (running < opts.concurrency) {
      const batch: [string, Pending][] = [];
      for (const [zoneId, next] of pending) {
        if (judging.has(zoneId)) continue;
        const dueMs = (lastStartMs.get(zoneId) ?? -Infinity) + opts.minIntervalMs;
        if (dueMs > nowMs) {
          nextDueMs = Math.min(nextDueMs, dueMs);
          continue;
        }
        batch.push([zoneId, next]);
        if (batch.length >= opts.maxZonesPerBatch) break;
      }
      if (batch.length === 0) break;
      running += 1;
      const judgements = batch.map(([zoneId, next]) => {
        lastStartMs.set(zoneId, nowMs);
        pending.delete(zoneId);
        judging.add(zoneId);
        const rows = [...next.rows].sort((a, b) => a.at.getTime() - b.at.getTime());
        return { where: next.where, rows };
      });
      void engine.judgeZones(judgements).finally(() => settle(batch));
    }
    // A batch in flight pumps again when it ends; only an idle queue needs the timer.
    if (running >= opts.concurrency) return;
    if (nextDueMs < Infinity && !wakeUp) {
      wakeUp = setTimeout(() => {
        wakeUp = null;
        pump();
      }, nextDueMs - nowMs);
    }
  }

  return {
    add(where, rows) {
      if (rows.length === 0) return Promise.resolve();
      return new Promise<void>((resolve) => {
        const entry = pending.get(where.zoneId) ?? { where, rows: [], done: [] };
        entry.rows.push(...rows);
        if (entry.rows.length > opts.maxRowsPerZone) {
          entry.rows.sort((a, b) => a.at.getTime() - b.at.getTime());
          const dropped = entry.rows.splice(0, entry.rows.length - opts.maxRowsPerZone).length;
          // Not an error (the rows are stored; only their alarm steps are skipped), but a zone this
          // far behind means judging cannot keep up, which an operator should see.
          log.warn(
            { zoneId: where.zoneId, dropped, kept: opts.maxRowsPerZone },
            'alarm queue: zone fell behind; judging only its newest readings',
          );
        }
        entry.done.push(resolve);
        pending.set(where.zoneId, entry);
        pump();
      });
    },
    drained() {
      if (pending.size === 0 && judging.size === 0) return Promise.resolve();
      return new Promise((resolve) => idleWaiters.push(resolve));
    },
  };
}
