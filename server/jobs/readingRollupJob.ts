/**
 * The hourly roll-ups' job (db/queries/readingRollups.ts): every 5 minutes, on a singleton queue,
 * it rolls up the hours since its mark and any older hour that readings received since its last
 * run touched (a sensor emptying its buffer, a reading late over a bad link). Its first run rolls
 * up all stored history, a day per statement, so a database from before the roll-ups gets them
 * without a long migration. Readers use roll-ups only for hours before the mark, so a job that
 * has not run yet (or fell behind) makes the long ranges slower, never wrong.
 */
import type PgBoss from 'pg-boss';

import type { Db } from '@/db';
import {
  HOUR_MS,
  floorHourMs,
  hourRuns,
  hoursTouchedSince,
  readRollupMark,
  readingSpan,
  rollUpHours,
  writeRollupMark,
} from '@/db/queries/readingRollups';
import { TOW_MAX_GAP_MS } from '@/ingest/wetness';

import type { Logger } from '../logger';

import { scheduleSingletonJob } from './singletonJob';

export const READING_ROLLUP_QUEUE = 'reading-rollup';
export const READING_ROLLUP_CRON = '*/5 * * * *';

// A reading's received_at is its transaction's start; one committing a little after the job
// read the clock would otherwise fall between two runs. Ingest statements take milliseconds.
const RECEIVED_OVERLAP_MS = 2 * 60_000;
const CHUNK_MS = 24 * HOUR_MS;

export interface RollupRunOutcome {
  /** Hours rolled (a range's hours counted once per statement). */
  hours: number;
  rows: number;
  rolledUntil: Date;
}

/**
 * One run at `nowMs`. An hour is final once a gap cap has passed after its end (its last
 * reading's share may run that far), so the mark stops at the hour before now − cap.
 */
export async function runReadingRollup(db: Db, nowMs: number): Promise<RollupRunOutcome> {
  const targetMs = floorHourMs(nowMs - TOW_MAX_GAP_MS);
  const receivedThrough = new Date(nowMs - RECEIVED_OVERLAP_MS);
  const mark = await readRollupMark(db);
  const runs: { fromMs: number; toMs: number }[] = [];
  // [fromMs, targetMs) a day per statement: a busy install's day is well inside the timeout.
  const forward = (fromMs: number) => {
    for (let h = fromMs; h < targetMs; h += CHUNK_MS) {
      runs.push({ fromMs: h, toMs: Math.min(h + CHUNK_MS, targetMs) });
    }
  };
  if (!mark) {
    const span = await readingSpan(db);
    forward(span ? floorHourMs(span.from.getTime()) : targetMs);
  } else {
    // The hour before the mark again: cheap, and it absorbs readings a minute or two late.
    const startMs = Math.min(mark.rolledUntil.getTime() - HOUR_MS, targetMs);
    const touched = await hoursTouchedSince(db, mark.receivedThrough, new Date(startMs));
    runs.push(...hourRuns(touched, CHUNK_MS / HOUR_MS));
    forward(startMs);
  }
  let rows = 0;
  let hours = 0;
  for (const run of runs) {
    rows += await rollUpHours(db, new Date(run.fromMs), new Date(run.toMs));
    hours += (run.toMs - run.fromMs) / HOUR_MS;
  }
  const rolledUntil = new Date(Math.max(targetMs, mark?.rolledUntil.getTime() ?? 0));
  await writeRollupMark(db, { rolledUntil, receivedThrough });
  return { hours, rows, rolledUntil };
}

export interface ReadingRollupJobOptions {
  db: Db;
  logger: Logger;
  now?: () => number;
  pollingIntervalSeconds?: number;
}

/** Schedules the roll-up every 5 minutes and works it on this instance. */
export async function scheduleReadingRollups(
  boss: PgBoss,
  options: ReadingRollupJobOptions,
): Promise<void> {
  const now = options.now ?? Date.now;
  const log = options.logger.child({ component: 'jobs' });
  await scheduleSingletonJob(
    boss,
    {
      queue: READING_ROLLUP_QUEUE,
      cron: READING_ROLLUP_CRON,
      // Not retried: the next run, 5 minutes on, starts from the same mark.
      retryLimit: 0,
      // A first run over years of history takes a while.
      expireInSeconds: 60 * 60,
      pollingIntervalSeconds: options.pollingIntervalSeconds,
    },
    async () => {
      const outcome = await runReadingRollup(options.db, now());
      if (outcome.rows > 0) log.info(outcome, 'reading roll-up: hours rolled');
    },
  );
}
