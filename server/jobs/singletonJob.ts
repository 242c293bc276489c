/**
 * One scheduled job on a singleton queue: its queue, its cron schedule and this instance's
 * worker. Every scheduled sweep of ours (silent sensors, roll-ups, partitions, week-report mail,
 * upload expiry) looks at the whole database each time, so two copies running at once would do
 * the same work twice and race on the same rows (two roll-ups upserting one hour, two
 * maintenances dropping one partition). pg-boss's singleton policy lets a queue hold at most one
 * job queued and one active across all instances, and its cron fires once per slot however many
 * instances run: one sweep at a time, everywhere. A failed or expired sweep is picked up by the
 * next slot, which looks at everything again, so most of these retry little or not at all.
 */
import type PgBoss from 'pg-boss';

export interface SingletonJobSpec {
  queue: string;
  /** pg-boss cron (UTC, minute resolution). */
  cron: string;
  /** How long one run may take before pg-boss counts it as failed (and retries it, if allowed). */
  expireInSeconds: number;
  /** Retries of a failed run; 0 (the default) leaves it to the next scheduled run. */
  retryLimit?: number;
  /** Seconds before a retry (pg-boss's default when unset). */
  retryDelay?: number;
  /** How often an idle worker asks for a job; pg-boss's default is 2 s. */
  pollingIntervalSeconds?: number;
  /** False: create the queue and work it, but fire no schedule (tests send jobs by hand). */
  schedule?: boolean;
}

/** The queue's options, apart so a queue can be created before its worker starts. */
export async function createSingletonQueue(
  boss: PgBoss,
  spec: Pick<SingletonJobSpec, 'queue' | 'expireInSeconds' | 'retryLimit' | 'retryDelay'>,
): Promise<void> {
  await boss.createQueue(spec.queue, {
    name: spec.queue,
    policy: 'singleton',
    retryLimit: spec.retryLimit ?? 0,
    ...(spec.retryDelay === undefined ? {} : { retryDelay: spec.retryDelay }),
    expireInSeconds: spec.expireInSeconds,
  });
}

/**
 * Creates the singleton queue, schedules it (unless `schedule: false`) and works it on this
 * instance, one job at a time: `handle` runs once per job, and a throw fails that job. Returns
 * the worker's id (for `boss.offWork`).
 */
export async function scheduleSingletonJob<T extends object = object>(
  boss: PgBoss,
  spec: SingletonJobSpec,
  handle: (job: PgBoss.Job<T>) => Promise<void>,
): Promise<string> {
  await createSingletonQueue(boss, spec);
  if (spec.schedule ?? true) await boss.schedule(spec.queue, spec.cron, {});
  return boss.work<T>(
    spec.queue,
    { pollingIntervalSeconds: spec.pollingIntervalSeconds ?? 2, batchSize: 1 },
    async (jobs) => {
      for (const job of jobs) await handle(job);
    },
  );
}
