// A sensor's posting interval: learnt from its readings, settable by its owner (PATCH), shown on
// the sensor with when it counts as silent, and what the silent sweep goes by. The numbers are
// ours (ingest/postingInterval.ts): silent after 3 intervals, at least 15 min unless set.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { Sensor } from '@/ingest/wire';

import {
  alarmsOf,
  MINUTE_MS,
  postBatch,
  postEach,
  seriesStartMs,
  withMargin,
} from '../support/alarms';
import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(() => void (t = makeTestApp()));
afterAll(() => t.pool.end());

type Owner = Awaited<ReturnType<typeof ownerWithSensor>>;
const sensorsPath = (o: Owner) => `/api/v1/shops/${o.shopId}/sensors`;
const listed = async (o: Owner): Promise<Sensor> => {
  const res = await o.agent.get(sensorsPath(o)).expect(200);
  return (res.body.sensors as Sensor[]).find((s) => s.id === o.sensorId)!;
};
const sweep = (shopId: string, nowMs: number) => t.alarms.sweepSilent({ nowMs, shopId });

describe('the posting interval on the sensor', () => {
  it('is the default (5 min, silent after 15) before the sensor has posted twice', async () => {
    const o = await ownerWithSensor(t);
    expect((await listed(o)).interval).toEqual({
      setS: null,
      learnedS: null,
      effectiveS: 300,
      source: 'default',
      silentAfterS: 900,
      silentFrom: null,
    });
  });

  it('is learnt from the readings, with the 15-minute floor on a fast sensor', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    // Every minute for 10 minutes: learnt 60 s; 3 × 60 s is 3 min, under the 15-min floor.
    await postBatch(
      t.app,
      o.token,
      Array.from({ length: 11 }, (_, i) => withMargin(startMs + i * MINUTE_MS, 6)),
    );
    const lastMs = startMs + 10 * MINUTE_MS;
    expect((await listed(o)).interval).toEqual({
      setS: null,
      learnedS: 60,
      effectiveS: 60,
      source: 'learned',
      silentAfterS: 900,
      silentFrom: new Date(lastMs + 15 * MINUTE_MS).toISOString(),
    });
  });

  it('can be set by the owner, wins over the learnt one, and can be cleared', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    await postBatch(t.app, o.token, [withMargin(startMs, 6), withMargin(startMs + MINUTE_MS, 6)]);
    const set = await o.agent
      .patch(`${sensorsPath(o)}/${o.sensorId}`)
      .send({ expectedIntervalS: 120 })
      .expect(200);
    expect(set.body).toMatchObject({ id: o.sensorId, name: 'Saw probe', zoneId: o.zoneId });
    // Set: 3 × 120 s = 6 min, taken at its word (no 15-min floor).
    expect(set.body.interval).toEqual({
      setS: 120,
      learnedS: 60,
      effectiveS: 120,
      source: 'set',
      silentAfterS: 360,
      silentFrom: new Date(startMs + MINUTE_MS + 6 * MINUTE_MS).toISOString(),
    });
    expect((await listed(o)).interval.setS).toBe(120);
    // The zone's card goes stale when its only sensor would count as silent.
    const zones = await o.agent.get(`/api/v1/shops/${o.shopId}/zones`).expect(200);
    expect(zones.body.zones[0].staleAfterS).toBe(360);
    const cleared = await o.agent
      .patch(`${sensorsPath(o)}/${o.sensorId}`)
      .send({ expectedIntervalS: null })
      .expect(200);
    expect(cleared.body.interval).toMatchObject({ setS: null, source: 'learned', effectiveS: 60 });
  });

  it.each<[string, unknown]>([
    ['negative', { expectedIntervalS: -60 }],
    ['zero', { expectedIntervalS: 0 }],
    ['under 10 s', { expectedIntervalS: 9 }],
    ['over a day', { expectedIntervalS: 86_401 }],
    ['a fraction', { expectedIntervalS: 60.5 }],
    ['a string', { expectedIntervalS: '60' }],
    ['a boolean', { expectedIntervalS: true }],
    ['an object', { expectedIntervalS: { s: 60 } }],
    ['an unknown field', { expectedInterval: 60 }],
    ['an unknown field beside a good one', { expectedIntervalS: 60, interval: 60 }],
    ['an empty body', {}],
  ])('refuses %s with 400 in the shared shape and changes nothing', async (_name, body) => {
    const o = await ownerWithSensor(t);
    const before = await listed(o);
    const res = await o.agent
      .patch(`${sensorsPath(o)}/${o.sensorId}`)
      .send(body as object)
      .expect(400);
    expect(res.body).toMatchObject({
      error: { code: 'invalid_input', message: expect.any(String), details: expect.any(Array) },
    });
    expect(await listed(o)).toEqual(before);
  });
});

describe('the silent sweep goes by the interval in force', () => {
  it('waits at least 15 min for a sensor that posts every minute', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    await postBatch(
      t.app,
      o.token,
      Array.from({ length: 11 }, (_, i) => withMargin(startMs + i * MINUTE_MS, 6)),
    );
    const lastMs = startMs + 10 * MINUTE_MS;
    // Three intervals (3 min) have passed, and ten: not silent under the 15-min floor.
    expect(await sweep(o.shopId, lastMs + 4 * MINUTE_MS)).toEqual({ opened: 0, cleared: 0 });
    expect(await sweep(o.shopId, lastMs + 14 * MINUTE_MS)).toEqual({ opened: 0, cleared: 0 });
    expect(await alarmsOf(o.agent, o.shopId, { kind: 'sensor_silent' })).toEqual([]);
    expect(await sweep(o.shopId, lastMs + 16 * MINUTE_MS)).toEqual({ opened: 1, cleared: 0 });
  });

  it('goes by the owner’s interval: silent after three of them', async () => {
    const o = await ownerWithSensor(t);
    const lastMs = seriesStartMs();
    await postEach(t.app, o.token, [withMargin(lastMs - MINUTE_MS, 6), withMargin(lastMs, 6)]);
    await o.agent
      .patch(`${sensorsPath(o)}/${o.sensorId}`)
      .send({ expectedIntervalS: 60 })
      .expect(200);
    expect(await sweep(o.shopId, lastMs + 2 * MINUTE_MS)).toEqual({ opened: 0, cleared: 0 });
    expect(await sweep(o.shopId, lastMs + 3 * MINUTE_MS + 1000)).toEqual({ opened: 1, cleared: 0 });
    const [silent] = await alarmsOf(o.agent, o.shopId, { kind: 'sensor_silent' });
    expect(silent).toMatchObject({ state: 'open', sinceAt: new Date(lastMs).toISOString() });
  });
});
