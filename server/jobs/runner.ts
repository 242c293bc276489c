/**
 * Scheduled jobs run through pg-boss in our own PostgreSQL (its tables live in their own
 * schema, created and migrated by pg-boss on start). Every server instance starts a runner;
 * pg-boss keeps the cron clock and the job queue in the database, so a schedule fires once per
 * slot however many instances run, and a singleton queue never runs two of its jobs at once.
 */
import PgBoss from 'pg-boss';

import type { Logger } from '../logger';

export interface JobRunnerOptions {
  databaseUrl: string;
  logger: Logger;
  /** PostgreSQL schema for pg-boss's tables. */
  schema?: string;
  /** False: this runner works jobs but never fires schedules (a test beside live data). */
  cron?: boolean;
}

export async function startJobRunner(options: JobRunnerOptions): Promise<PgBoss> {
  const boss = new PgBoss({
    connectionString: options.databaseUrl,
    schema: options.schema ?? 'pgboss',
    // Polling, cron and maintenance need few connections; the app's pool keeps the rest.
    max: 3,
    schedule: options.cron ?? true,
  });
  // A lost connection or a failed job is reported here; pg-boss retries on its own.
  const log = options.logger.child({ component: 'jobs' });
  boss.on('error', (err) => log.error({ err }, 'jobs: pg-boss reported an error'));
  await boss.start();
  return boss;
}
