// scheduleSingletonJob (server/jobs/singletonJob.ts) on a real pg-boss in the test database:
// the queue gets its policy and options, the cron is registered, the handler runs for each job,
// a throw fails the job, and two instances working one queue never run two jobs at once —
// pg-boss 10's documented meaning of the `singleton` queue policy ("only 1 job may be active
// at a time"; README, Queues → policy), checked here rather than taken on trust.
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { scheduleSingletonJob, startJobRunner } from '@/server/jobs';
import { silentLogger } from '@/server/logger';

const SCHEMA = 'pgboss_singleton_job';
let a: PgBoss;
let b: PgBoss;
beforeAll(async () => {
  // Two runners on one schema: two server instances sharing the database. Cron off, so only
  // jobs sent here run (a schedule is still registered and can be read back).
  const runner = () =>
    startJobRunner({
      databaseUrl: process.env.DATABASE_URL!,
      logger: silentLogger(),
      cron: false,
      schema: SCHEMA,
    });
  a = await runner();
  b = await runner();
});
afterAll(async () => {
  await a?.stop({ graceful: false });
  await b?.stop({ graceful: false });
});

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('scheduleSingletonJob', () => {
  it('creates a singleton queue with the given options and registers its cron', async () => {
    await scheduleSingletonJob(
      a,
      { queue: 'test-singleton-options', cron: '17 4 * * *', expireInSeconds: 321, retryLimit: 2 },
      async () => {},
    );
    const queue = await a.getQueue('test-singleton-options');
    expect(queue).toMatchObject({ policy: 'singleton', expireInSeconds: 321, retryLimit: 2 });
    const schedules = await a.getSchedules();
    expect(schedules.find((s) => s.name === 'test-singleton-options')?.cron).toBe('17 4 * * *');
  });

  it('with `schedule: false` registers no cron but still works jobs sent by hand', async () => {
    const seen: unknown[] = [];
    await scheduleSingletonJob<{ n: number }>(
      a,
      {
        queue: 'test-singleton-manual',
        cron: '*/5 * * * *',
        expireInSeconds: 60,
        pollingIntervalSeconds: 0.5,
        schedule: false,
      },
      async (job) => {
        seen.push(job.data.n);
      },
    );
    expect((await a.getSchedules()).some((s) => s.name === 'test-singleton-manual')).toBe(false);
    await a.send('test-singleton-manual', { n: 7 });
    await expect.poll(() => seen, { timeout: 15_000, interval: 100 }).toEqual([7]);
  });

  it('runs one job at a time across two instances, and a throw fails only that job', async () => {
    const queue = 'test-singleton-one-at-a-time';
    let active = 0;
    let mostActive = 0;
    const done: number[] = [];
    const handle = async (job: PgBoss.Job<{ n: number }>) => {
      active += 1;
      mostActive = Math.max(mostActive, active);
      // Long enough that the other instance polls (every 0.5 s) while this one runs.
      await sleep(1_200);
      active -= 1;
      if (job.data.n === 2) throw new Error('job 2 fails on purpose');
      done.push(job.data.n);
    };
    const spec = {
      queue,
      cron: '* * * * *',
      expireInSeconds: 60,
      pollingIntervalSeconds: 0.5,
      schedule: false,
    };
    await scheduleSingletonJob(a, spec, handle);
    await scheduleSingletonJob(b, spec, handle);
    const ids: (string | null)[] = [];
    for (const n of [1, 2, 3]) ids.push(await a.send(queue, { n }));
    await expect
      .poll(
        async () => {
          const jobs = await Promise.all(ids.map((id) => a.getJobById(queue, id!)));
          return jobs.every((j) => j?.state === 'completed' || j?.state === 'failed');
        },
        { timeout: 20_000, interval: 250 },
      )
      .toBe(true);
    const jobs = await Promise.all(ids.map((id) => a.getJobById(queue, id!)));
    expect(jobs.map((j) => j?.state)).toEqual(['completed', 'failed', 'completed']);
    expect(done.sort()).toEqual([1, 3]);
    // Three jobs, two workers polling: a standard queue would have run two at once.
    expect(mostActive).toBe(1);
  });
});
