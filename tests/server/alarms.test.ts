// The alarm engine through the real ingest route and database: dew risk (early warning and
// level), wet surface, humid air and battery low open once, update, and clear with hysteresis.
// Expected times follow from the rules in server/alarms/rules.ts and ingest/hysteresis.ts; the
// ones that are rules of thumb (no published source) are marked so where they are used.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { ALARM_RULES } from '@/server/alarms';

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

let t: TestApp;
// Series post one request per reading, faster than a real sensor's limit.
beforeAll(() => void (t = makeTestApp({ sensorRate: { ratePerS: 1000, burst: 1000 } })));
afterAll(() => t.pool.end());

// The zone defaults (db/schema/sensing.ts): caution 3 K (ISO 8502-4), wet 1 K (rule of thumb),
// humid 60 % RH (rule of thumb of the trade — no standard gives 60 %).
const WET_K = 1;

describe('dew risk', () => {
  it('opens once with the expected minutes, updates as the margin falls, clears after recovery', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    const stepMs = 2 * MINUTE_MS;
    // The margin falls 0.1 K per 2 min (0.05 K/min) from 6.05 K: a straight line, so the
    // Theil–Sen fit is exact and the wet limit is (margin − 1 K) / 0.05 K/min away.
    const falling = Array.from({ length: 36 }, (_, i) =>
      withMargin(startMs + i * stepMs, 6.05 - 0.1 * i),
    );
    await postEach(t.app, o.token, falling.slice(0, 21));
    expect(await alarmsOf(o.agent, o.shopId, { kind: 'dew_risk' })).toEqual([]);

    // Reading 21: margin 3.95 K, still dry, but wet in (3.95 − 1) / 0.05 = 59 min ≤ 60 min.
    await postEach(t.app, o.token, falling.slice(21, 22));
    const opened = await onlyAlarm(o.agent, o.shopId, 'dew_risk');
    expect(opened.state).toBe('open');
    expect(opened.openedAt).toBe(iso(startMs + 21 * stepMs));
    expect(opened.minutesToWet).toBeCloseTo(59, 6);
    expect(opened.latestMarginK).toBeCloseTo(3.95, 6);
    expect(opened.zone).toEqual({ id: o.zoneId, name: 'Machine room' });

    // Readings 22–35 (down to 2.55 K): the same alarm is updated, never a second one.
    await postEach(t.app, o.token, falling.slice(22));
    const updated = await onlyAlarm(o.agent, o.shopId, 'dew_risk');
    expect(updated.id).toBe(opened.id);
    expect(updated.worstMarginK).toBeCloseTo(2.55, 6);
    // (2.55 − 1) / 0.05 = 31 min; it is recorded whenever it moves to another 5-min step.
    expect(updated.minutesToWet).toBeCloseTo(31, 6);
    const afterFall = await changeCounts(t.db, opened.id);
    expect(afterFall).toMatchObject({ opened: 1, cleared: 0 });
    expect(afterFall.updated).toBeGreaterThanOrEqual(10);

    // Recovery to a steady 5 K (past caution 3 K + band 0.5 K) for 50 min.
    const recoverStartMs = startMs + 36 * stepMs;
    const steady = Array.from({ length: 26 }, (_, i) => withMargin(recoverStartMs + i * stepMs, 5));
    await postEach(t.app, o.token, steady);
    const cleared = await onlyAlarm(o.agent, o.shopId, 'dew_risk');
    expect(cleared.state).toBe('cleared');
    // Not before dry is confirmed (3 readings: the 3rd steady one) plus the quiet hold (ours).
    expect(Date.parse(cleared.clearedAt!)).toBeGreaterThanOrEqual(
      recoverStartMs + 2 * stepMs + ALARM_RULES.warningQuietMs,
    );
    expect(await changeCounts(t.db, opened.id)).toMatchObject({ opened: 1, cleared: 1 });
    expect(await alarmsOf(o.agent, o.shopId, { state: 'open', kind: 'dew_risk' })).toEqual([]);
  });

  it('opens once on margin noise around the caution limit and does not flap', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    const dry = [5, 5, 5].map((m, i) => withMargin(startMs + i * 2 * MINUTE_MS, m));
    // ±0.2 K around the 3 K caution limit: the ±0.5 K of a typical probe, a flat trend.
    const noisy = Array.from({ length: 30 }, (_, i) =>
      withMargin(startMs + (3 + i) * 2 * MINUTE_MS, i % 2 === 0 ? 2.8 : 3.2),
    );
    await postEach(t.app, o.token, [...dry, ...noisy]);
    const alarm = await onlyAlarm(o.agent, o.shopId, 'dew_risk');
    expect(alarm.state).toBe('open');
    expect(await changeCounts(t.db, alarm.id)).toMatchObject({ opened: 1, cleared: 0 });
  });
});

describe('wet surface', () => {
  it('opens on the third wet reading and clears past the wet limit + band', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    const at = (i: number) => startMs + i * 2 * MINUTE_MS;
    // ingest/hysteresis.ts: a level is confirmed after 3 readings (rule of thumb of ours).
    await postEach(
      t.app,
      o.token,
      [0, 1].map((i) => withMargin(at(i), -0.5)),
    );
    expect(await alarmsOf(o.agent, o.shopId, { kind: 'wet_surface' })).toEqual([]);
    await postEach(t.app, o.token, [withMargin(at(2), -0.5)]);
    const wet = await onlyAlarm(o.agent, o.shopId, 'wet_surface');
    expect(wet).toMatchObject({ state: 'open', sinceAt: iso(at(0)), openedAt: iso(at(2)) });
    expect(wet.worstMarginK).toBeCloseTo(-0.5, 6);

    // 1.3 K is past the wet limit but inside the 0.5 K band: still wet.
    await postEach(
      t.app,
      o.token,
      [3, 4, 5].map((i) => withMargin(at(i), WET_K + 0.3)),
    );
    expect((await onlyAlarm(o.agent, o.shopId, 'wet_surface')).state).toBe('open');
    // 2 K is past 1 K + 0.5 K: three such readings confirm close, and the wet alarm clears.
    await postEach(
      t.app,
      o.token,
      [6, 7, 8].map((i) => withMargin(at(i), 2)),
    );
    const cleared = await onlyAlarm(o.agent, o.shopId, 'wet_surface');
    expect(cleared).toMatchObject({ state: 'cleared', clearedAt: iso(at(8)) });
    expect(cleared.latestMarginK).toBeCloseTo(2, 6);
    expect(await changeCounts(t.db, wet.id)).toMatchObject({ opened: 1, cleared: 1 });
  });

  it('does not flap on noise around the wet limit, nor around the clearing threshold', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    // 0.8 / 1.2 K around the 1 K wet limit, then 1.4 / 1.6 K around 1 K + 0.5 K band.
    const series = Array.from({ length: 60 }, (_, i) => {
      const [low, high] = i < 30 ? [0.8, 1.2] : [1.4, 1.6];
      return withMargin(startMs + i * 2 * MINUTE_MS, i % 2 === 0 ? low : high);
    });
    await postBatch(t.app, o.token, series.slice(0, 30));
    const wet = await onlyAlarm(o.agent, o.shopId, 'wet_surface');
    expect(wet.state).toBe('open');
    await postEach(t.app, o.token, series.slice(30));
    expect(await changeCounts(t.db, wet.id)).toMatchObject({ opened: 1, cleared: 1 });
    expect(await alarmsOf(o.agent, o.shopId, { kind: 'wet_surface' })).toHaveLength(1);
  });
});

describe('humid air', () => {
  it('opens after RH has stayed above the zone limit for the hold and clears below limit − band', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    const at = (min: number) => startMs + min * MINUTE_MS;
    // Surface 30 °C keeps the iron far from the dew point: only the air is humid.
    const reading = (min: number, rh: number) => ({ at: iso(at(min)), air: 20, rh, surface: 30 });
    // Above 60 % (rule of thumb) for 25 min: less than the 30-min hold (ours).
    await postEach(
      t.app,
      o.token,
      [0, 5, 10, 15, 20, 25].map((m) => reading(m, 70)),
    );
    expect(await alarmsOf(o.agent, o.shopId, { kind: 'humid_air' })).toEqual([]);
    await postEach(t.app, o.token, [reading(30, 71)]);
    const humid = await onlyAlarm(o.agent, o.shopId, 'humid_air');
    expect(humid).toMatchObject({ state: 'open', sinceAt: iso(at(0)), openedAt: iso(at(30)) });
    expect(humid).toMatchObject({ peakRhPct: 71, latestRhPct: 71 });
    // A new peak is an update of the same alarm.
    await postEach(t.app, o.token, [reading(35, 74)]);
    expect(await onlyAlarm(o.agent, o.shopId, 'humid_air')).toMatchObject({ peakRhPct: 74 });

    // 57 % is under the limit but inside the 5 % band: nothing changes.
    await postEach(t.app, o.token, [reading(40, 57), reading(45, 57)]);
    expect((await onlyAlarm(o.agent, o.shopId, 'humid_air')).state).toBe('open');
    // 50 % (≤ 55 %) from minute 50: cleared once it has held 15 min, at minute 65.
    await postEach(
      t.app,
      o.token,
      [50, 55, 60].map((m) => reading(m, 50)),
    );
    expect((await onlyAlarm(o.agent, o.shopId, 'humid_air')).state).toBe('open');
    await postEach(t.app, o.token, [reading(65, 50)]);
    const cleared = await onlyAlarm(o.agent, o.shopId, 'humid_air');
    expect(cleared).toMatchObject({ state: 'cleared', clearedAt: iso(at(65)), peakRhPct: 74 });
    expect(cleared.latestRhPct).toBe(50);
    expect(await changeCounts(t.db, humid.id)).toMatchObject({ opened: 1, cleared: 1 });
  });
});

describe('battery low', () => {
  it('opens below 2.7 V held 15 min and clears 0.1 V above after 15 min', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    const at = (min: number) => startMs + min * MINUTE_MS;
    // 2.7 V for a 3 V lithium pair is a rule of thumb of the trade, as is the 0.1 V band.
    const reading = (min: number, battery: number) => withMargin(at(min), 8, { battery });
    await postEach(
      t.app,
      o.token,
      [0, 5, 10].map((m) => reading(m, 2.66)),
    );
    expect(await alarmsOf(o.agent, o.shopId, { kind: 'battery_low' })).toEqual([]);
    await postEach(t.app, o.token, [reading(15, 2.64)]);
    const low = await onlyAlarm(o.agent, o.shopId, 'battery_low');
    expect(low).toMatchObject({ state: 'open', sinceAt: iso(at(0)), openedAt: iso(at(15)) });
    expect(low.sensor).toEqual({ id: o.sensorId, name: 'Saw probe' });
    expect(low.lowestBatteryV).toBe(2.64);

    // 2.75 V sits inside the band: not cleared; fresh cells at 3.05 V clear after 15 min.
    await postEach(t.app, o.token, [
      reading(20, 2.75),
      ...[25, 30, 35].map((m) => reading(m, 3.05)),
    ]);
    expect((await onlyAlarm(o.agent, o.shopId, 'battery_low')).state).toBe('open');
    await postEach(t.app, o.token, [reading(40, 3.05)]);
    const cleared = await onlyAlarm(o.agent, o.shopId, 'battery_low');
    expect(cleared).toMatchObject({
      state: 'cleared',
      clearedAt: iso(at(40)),
      latestBatteryV: 3.05,
    });
    expect(await changeCounts(t.db, low.id)).toMatchObject({ opened: 1, cleared: 1 });
  });
});
