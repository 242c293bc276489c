// A measured wet margin raises the wet-surface alarm even when another sensor of the zone (here
// one without a surface probe, whose estimated surface is dry) posts beside it. The zone's level
// was once confirmed by one hysteresis fed by every sensor: the two series read as one noisy
// series, a reading at the same instant as the other sensor's was dropped as a duplicate, and a
// probe measuring −2.7 K raised only dew risk. Persistence is the rule's: 3 readings or 5 min
// (ALARM_RULES.level, rules of thumb stated in ingest/hysteresis.ts).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { ALARM_RULES, evaluateZone, readZoneState } from '@/server/alarms';

import {
  alarmsOf,
  iso,
  MINUTE_MS,
  onlyAlarm,
  postEach,
  seriesStartMs,
  withMargin,
} from '../support/alarms';
import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(() => void (t = makeTestApp({ sensorRate: { ratePerS: 1000, burst: 1000 } })));
afterAll(() => t.pool.end());

async function secondSensor(o: Awaited<ReturnType<typeof ownerWithSensor>>) {
  const res = await o.agent
    .post(`/api/v1/shops/${o.shopId}/sensors`)
    .send({ name: 'Wall hygrometer', zoneId: o.zoneId })
    .expect(201);
  return res.body as { id: string; token: string };
}

// 20 °C at 50 % RH without a surface: the estimate starts at the air temperature, so its margin
// is 20 − 9.26 = +10.7 K (dew point from ASHRAE via psychrolib, tests/server/ingest.test.ts).
const airOnly = (atMs: number) => ({ at: iso(atMs), air: 20, rh: 50 });

describe('wet surface in a zone with two sensors', () => {
  it.each([
    ['at the same instant, the air-only sensor first', 0],
    ['half a minute after the air-only sensor', 30_000],
    ['half a minute before the air-only sensor', -30_000],
  ])('opens when the probe measures −2.7 K, posting %s', async (_, probeOffsetMs) => {
    const o = await ownerWithSensor(t);
    const wall = await secondSensor(o);
    const startMs = seriesStartMs();
    for (let i = 0; i < 8; i++) {
      const atMs = startMs + i * MINUTE_MS;
      await postEach(t.app, wall.token, [airOnly(atMs)]);
      await postEach(t.app, o.token, [withMargin(atMs + probeOffsetMs, -2.7)]);
    }
    const wet = await onlyAlarm(o.agent, o.shopId, 'wet_surface');
    expect(wet.state).toBe('open');
    expect(wet.worstMarginK).toBeCloseTo(-2.7, 6);
    // Confirmed by the probe's third wet reading (minCount 3), never later.
    expect(ALARM_RULES.level.minCount).toBe(3);
    expect(Date.parse(wet.openedAt)).toBeLessThanOrEqual(startMs + 2 * MINUTE_MS + probeOffsetMs);
    // And it stays open while the probe stays wet: the dry estimate beside it does not clear it.
    expect(await alarmsOf(o.agent, o.shopId, { kind: 'wet_surface' })).toHaveLength(1);
  });

  it('clears once the probe dries, and a sensor gone quiet stops holding the zone wet', async () => {
    const o = await ownerWithSensor(t);
    const wall = await secondSensor(o);
    const startMs = seriesStartMs();
    await postEach(
      t.app,
      o.token,
      [0, 1, 2, 3].map((i) => withMargin(startMs + i * MINUTE_MS, -2.7)),
    );
    expect((await onlyAlarm(o.agent, o.shopId, 'wet_surface')).state).toBe('open');
    // The probe stops; only the dry wall sensor posts. Past levelFreshMs the probe's last
    // (wet) level no longer counts, and the zone's level is the wall sensor's dry one.
    const quietFromMs = startMs + 4 * MINUTE_MS;
    const steps = ALARM_RULES.levelFreshMs / MINUTE_MS + 10;
    await postEach(
      t.app,
      wall.token,
      Array.from({ length: steps }, (_, i) => airOnly(quietFromMs + i * MINUTE_MS)),
    );
    const wet = await onlyAlarm(o.agent, o.shopId, 'wet_surface');
    expect(wet.state).toBe('cleared');
    expect(Date.parse(wet.clearedAt!)).toBeGreaterThan(
      startMs + 3 * MINUTE_MS + ALARM_RULES.levelFreshMs,
    );
  });
});

describe('a zone state stored before levels were kept per sensor', () => {
  it('starts each sensor from the old zone-wide level, so an open wet alarm is not cleared by the change', () => {
    const atMs = seriesStartMs();
    // The shape written by the engine before this change: one level for the zone.
    const stored = {
      level: { level: 'wet', enteredAtMs: atMs - MINUTE_MS, atMs: atMs - MINUTE_MS, pending: null },
      levelSinceMs: atMs - 3 * MINUTE_MS,
      dewRisk: null,
      humid: null,
      batteries: {},
    };
    const { signals } = evaluateZone(
      readZoneState(stored),
      'zone',
      [{ sensorId: 'probe', atMs, marginK: -2, rhPct: 50, batteryV: null }],
      [],
      { limits: { cautionK: 3, wetK: 1 }, humidRhPct: 60 },
    );
    expect(signals.find((s) => s.kind === 'wet_surface')?.active).toBe(true);
  });
});
