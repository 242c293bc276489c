// The week's figures two ways: SQL aggregates (db/queries/reports.ts, what the API serves) and
// the JavaScript reference (ingest/reportWeek.ts weekFiguresFromReadings) over the same stored
// rows. A messy series — two sensors in one zone, ties at the same instant, random gaps around
// and beyond the 15 min cap, readings without a margin, some outside the week — must give the
// same numbers to 1e-9 whichever path computes them.
import { randomUUID } from 'node:crypto';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { insertReadingGroup, type ReadingRow } from '@/db/queries/readings';
import { zoneWeekFigures } from '@/db/queries/reports';
import { insertSensor } from '@/db/queries/sensors';
import { createShopWithOwner } from '@/db/queries/shops';
import { insertUser } from '@/db/queries/users';
import { insertZone } from '@/db/queries/zones';
import { weekBounds } from '@/ingest/reportWeek';
import { TOW_MAX_GAP_MS } from '@/ingest/wetness';

import { makeTestApp, type TestApp } from '../support/app';
import {
  expectSameWeekFigures,
  LEVELS,
  referenceWeekFigures,
  seededRandom,
} from '../support/weekFigures';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

const MIN = 60_000;
function messySeries(
  rand: () => number,
  sensors: string[],
  zoneId: string,
  shopId: string,
  fromMs: number,
  toMs: number,
) {
  const rows: ReadingRow[] = [];
  // Start a little before the week so the filter is exercised, end a little after it.
  let atMs = fromMs - 30 * MIN;
  const steps = [MIN, 2 * MIN, 5 * MIN, 15 * MIN, 15 * MIN + 1000, 40 * MIN, 3 * 60 * MIN];
  while (atMs < toMs + 30 * MIN) {
    const pick = rand();
    // Mostly 1–5 min; now and then exactly the cap, just over it, or a long silence.
    atMs += steps[pick < 0.92 ? Math.floor(rand() * 3) : 3 + Math.floor(rand() * 4)]!;
    const one = (sensorId: string): ReadingRow => {
      const level = LEVELS[Math.floor(rand() * 4)]!;
      const marginK = level === 'unknown' ? null : Math.round((rand() * 8 - 1) * 10) / 10;
      return {
        sensorId,
        shopId,
        zoneId,
        at: new Date(atMs),
        // Around the ISO 9223 edges: 0 °C and 80 % come up exactly now and then.
        airC: Math.round((rand() * 6 - 1) * 2) / 2,
        rhPct: Math.round(70 + rand() * 20),
        surfaceC: null,
        surfaceSource: null,
        batteryV: null,
        dewPointC: null,
        marginK,
        emcPct: rand() < 0.1 ? null : 8 + rand() * 10,
        level,
      };
    };
    const first = sensors[Math.floor(rand() * sensors.length)]!;
    rows.push(one(first));
    // A tie: the other sensor at the very same instant.
    if (rand() < 0.15) rows.push(one(sensors.find((s) => s !== first)!));
  }
  return rows;
}

describe('week figures: SQL and the JavaScript reference agree', () => {
  it.each([
    ['the whole week', 1, null],
    ['a partial week (the current one, cut at "now")', 2, Date.parse('2026-03-26T13:37:00Z')],
  ])('on a messy two-sensor series, %s', async (_name, seed, nowMs) => {
    const user = await insertUser(t.db, {
      email: `sql-${randomUUID().slice(0, 8)}@test.example`,
      name: 'Owner',
      passwordHash: 'x',
    });
    const shop = await createShopWithOwner(
      t.db,
      { name: 'Tamarack', timeZone: 'Europe/Berlin' },
      user!.id,
    );
    const zone = await insertZone(t.db, shop.id, 'Machine room');
    const quiet = await insertZone(t.db, shop.id, 'Lumber rack');
    const sensor = async (zoneId: string, name: string) =>
      (
        await insertSensor(t.db, {
          shopId: shop.id,
          zoneId,
          name,
          tokenHash: randomUUID(),
        })
      ).id;
    const sensors = [await sensor(zone.id, 'A'), await sensor(zone.id, 'B')];
    const quietSensors = [await sensor(quiet.id, 'C'), await sensor(quiet.id, 'D')];

    // The spring-change week in Berlin (167 h): the figures run over instants, not local hours.
    const week = weekBounds('2026-03-23', 'Europe/Berlin');
    const rand = seededRandom(seed);
    const rows = messySeries(rand, sensors, zone.id, shop.id, week.fromMs, week.toMs);
    // A second zone with a handful of readings: one zone's readings must not leak into another's.
    const few = messySeries(
      rand,
      quietSensors,
      quiet.id,
      shop.id,
      week.fromMs,
      week.fromMs + 3 * 3_600_000,
    );
    for (let i = 0; i < rows.length; i += 1000) {
      await insertReadingGroup(t.pool, rows.slice(i, i + 1000), []);
    }
    await insertReadingGroup(t.pool, few, []);
    // The premise: the series has ties, gaps over the cap and gaps of exactly the cap.
    const times = rows.map((r) => r.at.getTime()).sort((a, b) => a - b);
    const steps = times.slice(1).map((ms, i) => ms - times[i]!);
    expect(steps.filter((s) => s === 0).length).toBeGreaterThan(10);
    expect(steps.filter((s) => s === TOW_MAX_GAP_MS).length).toBeGreaterThan(3);
    expect(steps.filter((s) => s > TOW_MAX_GAP_MS).length).toBeGreaterThan(10);

    const period = {
      fromMs: week.fromMs,
      endMs: nowMs ?? week.toMs,
      maxGapMs: TOW_MAX_GAP_MS,
    };
    const fromSql = await zoneWeekFigures(t.db, [zone.id, quiet.id], period);
    const js = referenceWeekFigures(rows, period);
    expect(js.readings).toBeGreaterThan(400);
    expectSameWeekFigures(fromSql.get(zone.id)!, js);
    expectSameWeekFigures(fromSql.get(quiet.id)!, referenceWeekFigures(few, period));
  });
});
