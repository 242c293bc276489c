/**
 * The Monday week-report e-mail as a pg-boss schedule: a sweep every 5 minutes (pg-boss fires a
 * schedule once per slot across instances, and the singleton queue never runs two sweeps at
 * once) delivers every shop-week that is due (server/reports/weekReportMail.ts). Five minutes is
 * how late after 07:00 shop time a mail may leave; a sweep that finds nothing costs one query
 * per time zone in use. Sweeping instead of one cron per shop keeps every zone's 07:00 (and its
 * daylight-saving shifts) in our own pure code, and a server that was down at 07:00 catches up
 * on its first sweep.
 */
import type PgBoss from 'pg-boss';

import { sweepWeekReportMails, type WeekReportMailDeps } from '@/server/reports/weekReportMail';

import { createSingletonQueue, scheduleSingletonJob } from './singletonJob';

export const WEEK_REPORT_QUEUE = 'week-report-mail';
export const WEEK_REPORT_CRON = '*/5 * * * *';

export interface WeekReportJobOptions extends WeekReportMailDeps {
  /** How often an idle worker asks for a job; pg-boss's default is 2 s. */
  pollingIntervalSeconds?: number;
  /** False: work sweeps sent by hand, but do not schedule them (tests with their own clock). */
  schedule?: boolean;
}

const WEEK_REPORT_JOB = {
  queue: WEEK_REPORT_QUEUE,
  cron: WEEK_REPORT_CRON,
  // A failed sweep is not retried: the next one, 5 minutes on, looks at everything again.
  retryLimit: 0,
  // A sweep mails every due shop of the hour; a slow relay may take minutes.
  expireInSeconds: 15 * 60,
} as const;

export async function createWeekReportQueue(boss: PgBoss): Promise<void> {
  await createSingletonQueue(boss, WEEK_REPORT_JOB);
}

/** Schedules the sweep and works it on this instance. */
export async function scheduleWeekReportMails(
  boss: PgBoss,
  options: WeekReportJobOptions,
): Promise<void> {
  const log = options.logger.child({ component: 'jobs' });
  const deps = { ...options, logger: log };
  await scheduleSingletonJob(
    boss,
    {
      ...WEEK_REPORT_JOB,
      pollingIntervalSeconds: options.pollingIntervalSeconds,
      schedule: options.schedule,
    },
    async () => {
      const outcome = await sweepWeekReportMails(deps);
      if (outcome.due > 0) log.info(outcome, 'week report mail: sweep');
    },
  );
}
