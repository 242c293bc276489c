/**
 * The silent-sensor sweep as a pg-boss job: scheduled every minute (the silent rule's own
 * resolution — no sensor counts as silent in under a minute), on a singleton queue so two
 * instances never sweep at the same moment. A job may name one shop (`{ shopId }`).
 */
import type PgBoss from 'pg-boss';

import type { AlarmEngine } from '../alarms';
import type { Logger } from '../logger';

import { scheduleSingletonJob } from './singletonJob';

export const ALARM_SWEEP_QUEUE = 'alarm-silent-sweep';
export const ALARM_SWEEP_CRON = '* * * * *';

export interface AlarmSweepOptions {
  now?: () => number;
  logger: Logger;
  /** How often an idle worker asks for a job; pg-boss's default is 2 s. */
  pollingIntervalSeconds?: number;
}

export async function scheduleAlarmSweep(
  boss: PgBoss,
  engine: Pick<AlarmEngine, 'sweepSilent'>,
  options: AlarmSweepOptions,
): Promise<void> {
  const now = options.now ?? Date.now;
  const log = options.logger.child({ component: 'jobs' });
  await scheduleSingletonJob<{ shopId?: unknown }>(
    boss,
    {
      queue: ALARM_SWEEP_QUEUE,
      cron: ALARM_SWEEP_CRON,
      // A failed sweep is not retried: the next minute's sweep looks at everything again.
      retryLimit: 0,
      expireInSeconds: 120,
      pollingIntervalSeconds: options.pollingIntervalSeconds,
    },
    async (job) => {
      const shopId = typeof job.data?.shopId === 'string' ? job.data.shopId : undefined;
      const outcome = await engine.sweepSilent({ nowMs: now(), shopId });
      if (outcome.opened + outcome.cleared > 0) {
        log.info({ ...outcome, shopId }, 'alarm sweep: sensor-silent alarms changed');
      }
    },
  );
}
