// Hourly roll-ups (db/queries/readingRollups.ts) against the raw readings they summarise. The
// reference is the rule itself: the week figures of ingest/reportWeek.ts
// (weekFiguresFromReadings, which weekReportSql.test.ts holds the raw SQL to) computed in
// JavaScript from the very rows stored (tests/support/weekFigures.ts), and the raw-reading chart query answered before any
// roll-up existed. Min, max, counts, levels and gaps must match exactly; means and time sums to
// 1e-9 (only the order of float additions differs). Then the raw rows of the middle are deleted
// (as retention will) and the long ranges must still answer the same: they read the roll-ups.
//
// Own database: the roll-up mark is one row per database, and the shared test database's other
// files insert readings into hours this file's job would mark as rolled.
import { randomUUID } from 'node:crypto';

import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createDatabase, type Database } from '@/db';
import { runMigrations } from '@/db/migrate';
import { hourRuns, rollUpHours, rollUpRange } from '@/db/queries/readingRollups';
import { insertReadingGroup, querySeries, type ReadingRow } from '@/db/queries/readings';
import { zoneWeekFigures } from '@/db/queries/reports';
import { insertSensor } from '@/db/queries/sensors';
import { createShopWithOwner } from '@/db/queries/shops';
import { insertUser } from '@/db/queries/users';
import { insertZone } from '@/db/queries/zones';
import { TOW_MAX_GAP_MS } from '@/ingest/wetness';
import { runReadingRollup } from '@/server/jobs';
import { bucketPlan } from '@/server/readings/bucketPlan';

import {
  expectSameWeekFigures,
  LEVELS,
  referenceWeekFigures,
  seededRandom,
} from '../support/weekFigures';

const MIN = 60_000;
const HOUR = 60 * MIN;
const DAY = 24 * HOUR;
const DB_NAME = 'drybench_rollups';

let d: Database;
beforeAll(async () => {
  const url = process.env.DATABASE_URL!;
  const admin = createDatabase(url.replace(/\/[^/]+$/, '/postgres'), { max: 1 });
  await admin.pool.query(`drop database if exists ${DB_NAME} with (force)`);
  await admin.pool.query(`create database ${DB_NAME}`);
  await admin.pool.end();
  d = createDatabase(url.replace(/\/[^/]+$/, `/${DB_NAME}`), { max: 4 });
  await runMigrations(d.db);
}, 60_000);
afterAll(() => d?.pool.end());

/**
 * Two sensors of one zone over `days`: mostly 1–6 min apart, with ties at one instant, steps of
 * exactly the cap, just over it, and silences of hours (a gap running across hour boundaries).
 */
function series(seed: number, ids: { shopId: string; zoneId: string; sensors: string[] }) {
  const rand = seededRandom(seed);
  const rows: ReadingRow[] = [];
  const endMs = Math.floor(Date.now() / MIN) * MIN - 30 * MIN;
  const steps = [MIN, 3 * MIN, 6 * MIN, TOW_MAX_GAP_MS, TOW_MAX_GAP_MS + 1000, 50 * MIN, 5 * HOUR];
  for (let atMs = endMs - 40 * DAY; atMs < endMs;) {
    const pick = rand();
    atMs += steps[pick < 0.95 ? Math.floor(rand() * 3) : 3 + Math.floor(rand() * 4)]! + 17;
    const one = (sensorId: string): ReadingRow => {
      const level = LEVELS[Math.floor(rand() * 4)]!;
      return {
        sensorId,
        shopId: ids.shopId,
        zoneId: ids.zoneId,
        at: new Date(atMs),
        // Around ISO 9223's edges (0 °C, 80 % RH) now and then.
        airC: Math.round((rand() * 6 - 1) * 2) / 2,
        rhPct: Math.round(70 + rand() * 20),
        surfaceC: rand() < 0.5 ? null : 10 + rand() * 5,
        surfaceSource: null,
        batteryV: null,
        dewPointC: 5 + rand() * 5,
        marginK: level === 'unknown' ? null : Math.round((rand() * 8 - 1) * 10) / 10,
        emcPct: rand() < 0.1 ? null : 8 + rand() * 10,
        level,
      };
    };
    const first = ids.sensors[Math.floor(rand() * 2)]!;
    rows.push(one(first));
    if (rand() < 0.1) rows.push(one(ids.sensors.find((s) => s !== first)!));
  }
  return rows;
}

// Min and max are the stored values themselves; sums over 30 days are large, so within 1e-9 of
// their size.
const ROLLED = { within: (want: number) => 1e-9 * Math.max(1, want), exactMinMax: true };

const countRolled = async (db: Database['db']) =>
  Number(
    (await db.execute<{ n: string }>(sql`select coalesce(sum(n), 0) as n from readings_hourly`))
      .rows[0]!.n,
  );

describe('hourly roll-ups', () => {
  it('answer the 30-day chart, exposure and trial figures as the raw readings do, also once the raw rows are gone', async () => {
    const user = await insertUser(d.db, {
      email: `rollup-${randomUUID().slice(0, 8)}@test.example`,
      name: 'Ida Larch',
      passwordHash: 'x',
    });
    const shop = await createShopWithOwner(
      d.db,
      { name: 'Tamarack Joinery', timeZone: 'Asia/Kolkata' },
      user!.id,
    );
    const zone = await insertZone(d.db, shop.id, 'Machine room');
    const sensorIds: string[] = [];
    for (const name of ['Saw top', 'Wall']) {
      const s = await insertSensor(d.db, {
        shopId: shop.id,
        zoneId: zone.id,
        name,
        tokenHash: randomUUID(),
      });
      sensorIds.push(s.id);
    }
    const rows = series(13, { shopId: shop.id, zoneId: zone.id, sensors: sensorIds });
    for (let i = 0; i < rows.length; i += 2000) {
      await insertReadingGroup(d.pool, rows.slice(i, i + 2000), []);
    }
    const times = rows.map((r) => r.at.getTime());
    const steps = times.slice(1).map((ms, i) => ms - times[i]!);
    // The premise: ties, steps of exactly the cap, and gaps over it (some across hours).
    expect(steps.filter((s) => s === 0).length).toBeGreaterThan(20);
    expect(steps.filter((s) => s > TOW_MAX_GAP_MS).length).toBeGreaterThan(20);
    expect(steps.filter((s) => s >= HOUR).length).toBeGreaterThan(5);

    // Windows off the hour at both ends; the chart's plan as the route makes it (+05:30 shop:
    // the buckets start on the UTC hour before its midnight).
    const lastMs = times[times.length - 1]!;
    const toMs = lastMs - 2 * HOUR - 7 * MIN - 3_000;
    const fromMs = toMs - 30 * DAY + 11 * MIN;
    const from = new Date(fromMs);
    const to = new Date(toMs);
    const plan = bucketPlan(fromMs, toMs, 500, shop.timeZone);
    expect(plan.bucketSeconds % 3600).toBe(0);
    const chart = () => querySeries(d.db, { zoneId: zone.id, from, to, points: 500, plan });
    const figures = async (sensorId?: string) =>
      (
        await zoneWeekFigures(d.db, [zone.id], {
          fromMs,
          endMs: toMs,
          maxGapMs: TOW_MAX_GAP_MS,
          sensorId,
        })
      ).get(zone.id)!;

    // Before any roll-up: the raw answers (no mark, so the readers read raw).
    const rawChart = await chart();
    expect(await countRolled(d.db)).toBe(0);

    const outcome = await runReadingRollup(d.db, Date.now());
    // Every stored reading is in exactly one rolled hour (the hours up to now − cap).
    expect(await countRolled(d.db)).toBe(
      rows.filter((r) => r.at.getTime() < outcome.rolledUntil.getTime()).length,
    );

    const check = async () => {
      const rolledChart = await chart();
      expect(rolledChart.bucketSeconds).toBe(rawChart.bucketSeconds);
      expect(rolledChart.rows.map((r) => [r.at.getTime(), r.count, r.level])).toEqual(
        rawChart.rows.map((r) => [r.at.getTime(), r.count, r.level]),
      );
      rolledChart.rows.forEach((r, i) => {
        const w = rawChart.rows[i]!;
        expect([r.marginMinK, r.marginMaxK]).toEqual([w.marginMinK, w.marginMaxK]);
        for (const k of ['airC', 'rhPct', 'surfaceC', 'dewPointC', 'marginK', 'emcPct'] as const) {
          if (w[k] === null) expect(r[k]).toBeNull();
          else expect(Math.abs(r[k]! - w[k]!)).toBeLessThan(1e-9);
        }
      });
      // The zone (week report, trials) and one probe's own readings (a surface's exposure).
      expectSameWeekFigures(
        await figures(),
        referenceWeekFigures(rows, { fromMs, endMs: toMs }),
        ROLLED,
      );
      const own = rows.filter((r) => r.sensorId === sensorIds[0]);
      expectSameWeekFigures(
        await figures(sensorIds[0]),
        referenceWeekFigures(own, { fromMs, endMs: toMs }),
        ROLLED,
      );
    };
    await check();

    // Retention: the raw rows of the middle go. Answers that still read raw would lose them.
    const deleted = await d.db.execute(sql`
      delete from readings where zone_id = ${zone.id}
        and at >= ${new Date(fromMs + 2 * DAY)} and at < ${new Date(toMs - 2 * DAY)}`);
    expect(deleted.rowCount).toBeGreaterThan(rows.length / 2);
    await check();
    expect((await chart()).rows.reduce((n, r) => n + r.count, 0)).toBe(
      rows.filter((r) => r.at.getTime() >= fromMs && r.at.getTime() <= toMs).length,
    );
  }, 120_000);

  it('re-rolls an old hour that received a late reading, and rolling twice changes nothing', async () => {
    const user = await insertUser(d.db, {
      email: `late-${randomUUID().slice(0, 8)}@test.example`,
      name: 'Noor Alder',
      passwordHash: 'x',
    });
    const shop = await createShopWithOwner(
      d.db,
      { name: 'Tamarack Annex', timeZone: 'UTC' },
      user!.id,
    );
    const zone = await insertZone(d.db, shop.id, 'Lumber rack');
    const s = await insertSensor(d.db, {
      shopId: shop.id,
      zoneId: zone.id,
      name: 'Rack',
      tokenHash: randomUUID(),
    });
    const base = Math.floor(Date.now() / HOUR) * HOUR - 20 * DAY;
    const reading = (atMs: number, marginK: number): ReadingRow => ({
      sensorId: s.id,
      shopId: shop.id,
      zoneId: zone.id,
      at: new Date(atMs),
      airC: 12,
      rhPct: 85,
      surfaceC: null,
      surfaceSource: null,
      batteryV: null,
      dewPointC: 9.5,
      marginK,
      emcPct: 18,
      level: marginK <= 1 ? 'wet' : 'dry',
    });
    // Two readings five hours apart: the first stands 15 min, then the zone is silent.
    await insertReadingGroup(
      d.pool,
      [reading(base + 10 * MIN, 4), reading(base + 5 * HOUR, 4)],
      [],
    );
    await runReadingRollup(d.db, Date.now());
    const period = { fromMs: base - 8 * DAY, endMs: base + 12 * DAY, maxGapMs: TOW_MAX_GAP_MS };
    const before = (await zoneWeekFigures(d.db, [zone.id], period)).get(zone.id)!;
    expect(before.silentPeriods[1]).toEqual({ fromMs: base + 25 * MIN, toMs: base + 5 * HOUR });

    // A buffered wet reading lands two hours into the silence, long after its hour was rolled.
    await insertReadingGroup(d.pool, [reading(base + 2 * HOUR + 5 * MIN, 0.5)], []);
    const outcome = await runReadingRollup(d.db, Date.now());
    expect(outcome.hours).toBeGreaterThan(0);
    const after = (await zoneWeekFigures(d.db, [zone.id], period)).get(zone.id)!;
    expect(after.readings).toBe(3);
    // The late reading's 15 min are wet, and the gap before it now ends at it.
    expect(after.levelMs.wet).toBe(TOW_MAX_GAP_MS);
    expect(after.lowestMargin).toEqual({ marginK: 0.5, atMs: base + 2 * HOUR + 5 * MIN });
    expect(after.silentPeriods.slice(1, 3)).toEqual([
      { fromMs: base + 25 * MIN, toMs: base + 2 * HOUR + 5 * MIN },
      { fromMs: base + 2 * HOUR + 20 * MIN, toMs: base + 5 * HOUR },
    ]);

    // Idempotent: the same hours again leave every roll-up as it was.
    const snapshot = async () =>
      (
        await d.db.execute(sql`
          select hour, n, zone_covered_ms, zone_wet_ms, zone_gaps from readings_hourly
          where zone_id = ${zone.id} order by hour`)
      ).rows;
    const once = await snapshot();
    await rollUpHours(d.db, new Date(base), new Date(base + 6 * HOUR));
    expect(await snapshot()).toEqual(once);
    // And over days, as an import calls it: the three rolled hours again, nothing else changed.
    expect(await rollUpRange(d.db, new Date(base - 2 * DAY), new Date(base + 2 * DAY))).toBe(3);
    expect(await snapshot()).toEqual(once);
  }, 60_000);

  it('groups touched hours into runs of consecutive hours, none longer than asked', () => {
    // 30 consecutive hours in runs of at most 24: a statement stays inside the timeout.
    const hours = Array.from({ length: 30 }, (_, i) => i * HOUR);
    expect(hourRuns(hours, 24)).toEqual([
      { fromMs: 0, toMs: 24 * HOUR },
      { fromMs: 24 * HOUR, toMs: 30 * HOUR },
    ]);
    expect(hourRuns([5 * HOUR, 0, HOUR, 9 * HOUR, 5 * HOUR])).toEqual([
      { fromMs: 0, toMs: 2 * HOUR },
      { fromMs: 5 * HOUR, toMs: 6 * HOUR },
      { fromMs: 9 * HOUR, toMs: 10 * HOUR },
    ]);
  });
});
