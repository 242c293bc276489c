/**
 * Alarm judging off the ingest path. A request's readings are durable once committed, so the
 * sensor gets its 202 then; the alarm engine catches up here. Zones waiting their turn gather
 * every reading that arrives meanwhile and are judged once for all of them, and at most
 * `concurrency` zones are judged at a time — so under a burst, alarm work grows with the number
 * of busy zones, not the number of requests, and never crowds out ingest itself.
 *
 * Readings still queued when the process stops are not judged here; the zone's next reading
 * is (its margins come from the database), and silence has its own sweep.
 */
import type { ReadingRow } from '@/db/queries/readings';

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
  /** Zones judged at once; each holds a database connection while it runs. */
  concurrency: number;
  /** A zone that falls this far behind keeps only its newest rows (a burst, not history). */
  maxRowsPerZone: number;
}

const DEFAULTS: AlarmQueueOptions = { concurrency: 2, maxRowsPerZone: 5000 };

export function createAlarmQueue(
  engine: AlarmEngine,
  options: Partial<AlarmQueueOptions> = {},
): AlarmQueue {
  const opts = { ...DEFAULTS, ...options };
  const pending = new Map<string, Pending>();
  const judging = new Set<string>();
  let idleWaiters: (() => void)[] = [];

  function pump() {
    for (const [zoneId, next] of pending) {
      if (judging.size >= opts.concurrency) return;
      if (judging.has(zoneId)) continue;
      pending.delete(zoneId);
      judging.add(zoneId);
      const rows = [...next.rows].sort((a, b) => a.at.getTime() - b.at.getTime());
      void engine.judge(next.where, rows).finally(() => {
        judging.delete(zoneId);
        next.done.forEach((resolve) => resolve());
        if (pending.size === 0 && judging.size === 0) {
          idleWaiters.forEach((resolve) => resolve());
          idleWaiters = [];
        }
        pump();
      });
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
          entry.rows.splice(0, entry.rows.length - opts.maxRowsPerZone);
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
