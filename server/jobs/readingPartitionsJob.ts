/**
 * The readings' partition maintenance as a daily pg-boss job (db/queries/readingPartitions.ts):
 * premakes the coming months, moves any rows found in the default partition to their months,
 * and drops raw readings past RAW_READINGS_KEEP_MONTHS a whole month at a time. Daily, because a
 * month is the unit: a day late drops nothing early, and three months are premade anyway. A
 * singleton queue, so two instances never run it at once; `before` runs first in the same job
 * (the hourly roll-ups, so an hour is rolled up before its raw rows can go).
 */
import type PgBoss from 'pg-boss';

import type { Db } from '@/db';
import { runReadingPartitionMaintenance } from '@/db/queries/readingPartitions';

import type { Logger } from '../logger';

import { scheduleSingletonJob } from './singletonJob';

export const READING_PARTITIONS_QUEUE = 'reading-partitions';
// 03:23 UTC: a quiet hour for most shops, off the round minutes other schedules take.
export const READING_PARTITIONS_CRON = '23 3 * * *';

/**
 * Two years of raw readings: a season compared with the same season last year, at full
 * resolution. Our own choice, not a standard's; roll-ups are kept for ever.
 */
export const DEFAULT_RAW_READINGS_KEEP_MONTHS = 24;

export interface ReadingPartitionsJobOptions {
  db: Db;
  logger: Logger;
  keepMonths: number;
  /** Runs before the maintenance in the same job; its failure skips the maintenance. */
  before?: () => Promise<unknown>;
  /** How often an idle worker asks for a job; pg-boss's default is 2 s. */
  pollingIntervalSeconds?: number;
  /** False: work jobs sent by hand without scheduling them (tests). */
  schedule?: boolean;
}

export async function scheduleReadingPartitionMaintenance(
  boss: PgBoss,
  options: ReadingPartitionsJobOptions,
): Promise<void> {
  const log = options.logger.child({ component: 'jobs' });
  await scheduleSingletonJob(
    boss,
    {
      queue: READING_PARTITIONS_QUEUE,
      cron: READING_PARTITIONS_CRON,
      // A failure is retried within the hour; otherwise tomorrow's run does it all again.
      retryLimit: 3,
      retryDelay: 600,
      // Dropping a partition waits for the queries reading it; a long one must not be cut short.
      expireInSeconds: 30 * 60,
      pollingIntervalSeconds: options.pollingIntervalSeconds,
      schedule: options.schedule,
    },
    async () => {
      if (options.before) await options.before();
      const outcome = await runReadingPartitionMaintenance(options.db, {
        keepMonths: options.keepMonths,
      });
      log.info(
        { ...outcome, keepMonths: options.keepMonths },
        'reading partitions: maintenance done',
      );
    },
  );
}
