// Sensor silent: the sweep judges each sensor by its own posting interval (learnt from its
// readings, or set by its owner — more in sensorInterval.test.ts), with an injected clock; once
// through pg-boss as the server runs it.
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { ALARM_RULES } from '@/server/alarms';
import {
  ALARM_SWEEP_CRON,
  ALARM_SWEEP_QUEUE,
  scheduleAlarmSweep,
  startJobRunner,
} from '@/server/jobs';

import {
  alarmsOf,
  changeCounts,
  iso,
  MINUTE_MS,
  onlyAlarm,
  postBatch,
  postEach,
  seriesStartMs,
  withMargin,
} from '../support/alarms';
import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { captureLogs } from '../support/logs';

let t: TestApp;
beforeAll(() => void (t = makeTestApp()));
afterAll(() => t.pool.end());

// Every sweep here names its shop, so it never touches other tests' sensors.
const sweep = (shopId: string, nowMs: number) => t.alarms.sweepSilent({ nowMs, shopId });

describe('the silent-sensor sweep', () => {
  it('fires after 3 × the sensor’s own interval, once, and clears with its next reading', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    // Every 6 min for an hour: the learnt interval is 6 min, so silent after 3 × 6 = 18 min
    // (ours; above the 15-min floor, which sensorInterval.test.ts covers).
    const series = Array.from({ length: 11 }, (_, i) => withMargin(startMs + i * 6 * MINUTE_MS, 6));
    await postBatch(t.app, o.token, series);
    const lastMs = startMs + 60 * MINUTE_MS;

    expect(await sweep(o.shopId, lastMs + 17 * MINUTE_MS)).toEqual({ opened: 0, cleared: 0 });
    expect(await alarmsOf(o.agent, o.shopId, { kind: 'sensor_silent' })).toEqual([]);
    expect(await sweep(o.shopId, lastMs + 19 * MINUTE_MS)).toEqual({ opened: 1, cleared: 0 });
    const silent = await onlyAlarm(o.agent, o.shopId, 'sensor_silent');
    expect(silent).toMatchObject({
      state: 'open',
      sensor: { id: o.sensorId, name: 'Saw probe' },
      zone: { id: o.zoneId, name: 'Machine room' },
      sinceAt: iso(lastMs),
      openedAt: iso(lastMs + 19 * MINUTE_MS),
    });

    // Later sweeps find it open and add nothing.
    expect(await sweep(o.shopId, lastMs + 40 * MINUTE_MS)).toEqual({ opened: 0, cleared: 0 });
    await postEach(t.app, o.token, [withMargin(lastMs + 41 * MINUTE_MS, 6)]);
    const cleared = await onlyAlarm(o.agent, o.shopId, 'sensor_silent');
    expect(cleared).toMatchObject({ state: 'cleared', clearedAt: iso(lastMs + 41 * MINUTE_MS) });
    expect(await changeCounts(t.db, silent.id)).toMatchObject({ opened: 1, cleared: 1 });
  });

  it('uses 5 min as the interval of a sensor with a single reading', async () => {
    const o = await ownerWithSensor(t);
    const lastMs = seriesStartMs();
    await postBatch(t.app, o.token, [withMargin(lastMs, 6)]);
    const allowedMs = ALARM_RULES.silent.factor * ALARM_RULES.silent.defaultIntervalMs;
    expect(allowedMs).toBe(15 * MINUTE_MS);
    expect(await sweep(o.shopId, lastMs + allowedMs - MINUTE_MS)).toMatchObject({ opened: 0 });
    expect(await sweep(o.shopId, lastMs + allowedMs + MINUTE_MS)).toMatchObject({ opened: 1 });
  });

  it('closes the silent alarm of a sensor whose token was revoked', async () => {
    const o = await ownerWithSensor(t);
    const lastMs = seriesStartMs();
    await postBatch(t.app, o.token, [withMargin(lastMs, 6)]);
    await sweep(o.shopId, lastMs + 20 * MINUTE_MS);
    expect((await onlyAlarm(o.agent, o.shopId, 'sensor_silent')).state).toBe('open');
    await o.agent.delete(`/api/v1/shops/${o.shopId}/sensors/${o.sensorId}/token`).expect(204);
    expect(await sweep(o.shopId, lastMs + 21 * MINUTE_MS)).toEqual({ opened: 0, cleared: 1 });
    expect((await onlyAlarm(o.agent, o.shopId, 'sensor_silent')).state).toBe('cleared');
  });
});

describe('the sweep as a pg-boss job', () => {
  let boss: PgBoss;
  const logs = captureLogs();
  beforeAll(async () => {
    // Cron off in this runner: a scheduled sweep would judge every test's sensors by the clock.
    boss = await startJobRunner({
      databaseUrl: process.env.DATABASE_URL!,
      logger: logs.logger,
      cron: false,
    });
    await scheduleAlarmSweep(boss, t.alarms, {
      logger: logs.logger,
      pollingIntervalSeconds: 0.5,
    });
  });
  afterAll(() => boss?.stop({ graceful: false }));

  it('is scheduled every minute and opens a silent alarm when a job runs', async () => {
    const schedules = await boss.getSchedules();
    expect(schedules.find((s) => s.name === ALARM_SWEEP_QUEUE)?.cron).toBe(ALARM_SWEEP_CRON);
    const queue = await boss.getQueue(ALARM_SWEEP_QUEUE);
    // Singleton: at most one sweep active at a time, whichever instance fetched it.
    expect(queue?.policy).toBe('singleton');

    const o = await ownerWithSensor(t);
    // Last reading an hour ago on a 5-min interval: silent by the real clock.
    const series = [60, 55, 50].map((m) => withMargin(Date.now() - m * MINUTE_MS, 6));
    await postBatch(t.app, o.token, series);
    await boss.send(ALARM_SWEEP_QUEUE, { shopId: o.shopId });
    await expect
      .poll(async () => (await alarmsOf(o.agent, o.shopId, { kind: 'sensor_silent' })).length, {
        timeout: 15_000,
        interval: 200,
      })
      .toBe(1);
    const silent = await onlyAlarm(o.agent, o.shopId, 'sensor_silent');
    expect(silent).toMatchObject({ state: 'open', sinceAt: series[2]!.at });
    // The job says what it did, as the job runner's component.
    expect(logs.lines()).toContainEqual(
      expect.objectContaining({
        component: 'jobs',
        shopId: o.shopId,
        opened: 1,
        msg: 'alarm sweep: sensor-silent alarms changed',
      }),
    );
  });
});
