// The demo day (server/demo/dayModel.ts) through the engine: the machine-room iron sweats when
// the heater comes on at 07:00 with moist air, and dries by late morning. Posted as one backlog,
// as the demo sensors' backfill does, it must open and clear each alarm once.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { demoAir, rhFromDewPoint, stepIron } from '@/server/demo/dayModel';

import { alarmsOf, changeCounts, MINUTE_MS, onlyAlarm, postBatch } from '../support/alarms';
import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(() => void (t = makeTestApp()));
afterAll(() => t.pool.end());

const HOUR_MS = 60 * MINUTE_MS;
// The demo shop is in America/Chicago; in winter that is UTC−6.
const UTC_OFFSET_H = -6;

/** The machine room's day at the demo sensors' 5-minute step, without their noise. */
function machineRoomDay(localMidnightMs: number) {
  const first = demoAir('machine-room', localMidnightMs, UTC_OFFSET_H);
  let ironC = first.airC - 1; // the simulator's starting point
  return Array.from({ length: 24 * 12 }, (_, i) => {
    const atMs = localMidnightMs + i * 5 * MINUTE_MS;
    const { airC, dewC } = demoAir('machine-room', atMs, UTC_OFFSET_H);
    ironC = stepIron(ironC, airC, i === 0 ? 0 : 5 * MINUTE_MS);
    const rh = rhFromDewPoint(airC, dewC);
    return { at: new Date(atMs).toISOString(), air: airC, rh, surface: ironC, battery: 3.1 };
  });
}

describe('the demo day', () => {
  it('opens dew risk and wet surface in the morning sweat and clears both by noon', async () => {
    const o = await ownerWithSensor(t);
    const dayMs = 24 * HOUR_MS;
    const localMidnightMs =
      Math.floor((Date.now() - 2 * dayMs) / dayMs) * dayMs - UTC_OFFSET_H * HOUR_MS;
    const localHour = (iso: string | null) => (Date.parse(iso!) - localMidnightMs) / HOUR_MS;
    const posted = await postBatch(t.app, o.token, machineRoomDay(localMidnightMs));
    // The model's margin (surface − dew point): about +4.9 K at 06:30, below the 1 K wet limit
    // from about 06:55 to 09:15, past 1.5 K (wet + band) from about 09:25, past 3.5 K from 10:20.
    const wetHours = posted.results.filter((r) => r.level === 'wet').map((r) => localHour(r.at));
    expect(Math.min(...wetHours)).toBeGreaterThan(6.5);
    expect(Math.max(...wetHours)).toBeLessThan(9.5);

    const wet = await onlyAlarm(o.agent, o.shopId, 'wet_surface');
    expect(localHour(wet.openedAt)).toBeGreaterThan(6.5);
    expect(localHour(wet.openedAt)).toBeLessThan(7.5);
    expect(localHour(wet.clearedAt)).toBeGreaterThan(9.25);
    expect(localHour(wet.clearedAt)).toBeLessThan(10);
    expect(wet.worstMarginK).toBeLessThan(-3);

    const dewRisk = await onlyAlarm(o.agent, o.shopId, 'dew_risk');
    expect(Date.parse(dewRisk.openedAt)).toBeLessThanOrEqual(Date.parse(wet.openedAt));
    expect(Date.parse(dewRisk.clearedAt!)).toBeGreaterThan(Date.parse(wet.clearedAt!));
    expect(localHour(dewRisk.clearedAt)).toBeLessThan(12);

    for (const alarm of [wet, dewRisk]) {
      expect(await changeCounts(t.db, alarm.id)).toMatchObject({ opened: 1, cleared: 1 });
    }
    // The battery (3.1 V) never runs low on the demo day.
    expect(await alarmsOf(o.agent, o.shopId, { kind: 'battery_low' })).toEqual([]);
  });
});
