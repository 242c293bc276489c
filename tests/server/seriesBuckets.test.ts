// A zone's bucketed history (db/queries/readings.ts querySeries, the chart of 7 days or less)
// against a reference computed in JavaScript from the very rows stored. The bucket rule is
// PostgreSQL's date_bin (PostgreSQL 15 documentation, §9.9.3: a bucket starts at
// origin + floor((t − origin) / stride) · stride), the window [from, to] includes both ends, a
// mean is over the non-null values, margin min and max are exact, the level is the worst stored.
// The window crosses the start of a month, so the readings lie in two monthly partitions
// (migration 0014), and the rows are messy: two sensors with ties, readings exactly on bucket
// edges and on both ends of the window, rows just outside it, nulls, all four levels.
import { randomUUID } from 'node:crypto';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { ensureReadingPartitions } from '@/db/queries/readingPartitions';
import { insertReadingGroup, querySeries, type ReadingRow } from '@/db/queries/readings';
import { insertSensor } from '@/db/queries/sensors';
import { createShopWithOwner } from '@/db/queries/shops';
import { insertUser } from '@/db/queries/users';
import { insertZone } from '@/db/queries/zones';
import type { Level } from '@/ingest/levels';

import { makeTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

const MIN = 60_000;
const LEVELS: Level[] = ['dry', 'close', 'wet', 'unknown'];
const RANK: Record<Level, number> = { unknown: 1, dry: 2, close: 3, wet: 4 };

interface Bucket {
  atMs: number;
  n: number;
  sums: Record<'air' | 'rh' | 'surface' | 'dew' | 'margin' | 'emc', [number, number]>;
  marginMin: number | null;
  marginMax: number | null;
  level: Level;
}

/** The reference: date_bin's buckets over [from, to], means over non-null values. */
function referenceBuckets(rows: ReadingRow[], fromMs: number, toMs: number, plan: Plan) {
  const widthMs = plan.bucketSeconds * 1000;
  const buckets = new Map<number, Bucket>();
  const add = (pair: [number, number], v: number | null) => {
    if (v !== null) {
      pair[0] += v;
      pair[1] += 1;
    }
  };
  for (const r of rows) {
    const atMs = r.at.getTime();
    if (atMs < fromMs || atMs > toMs) continue;
    const start = plan.originMs + Math.floor((atMs - plan.originMs) / widthMs) * widthMs;
    const b = buckets.get(start) ?? {
      atMs: start,
      n: 0,
      sums: {
        air: [0, 0],
        rh: [0, 0],
        surface: [0, 0],
        dew: [0, 0],
        margin: [0, 0],
        emc: [0, 0],
      },
      marginMin: null,
      marginMax: null,
      level: 'unknown' as Level,
    };
    b.n += 1;
    add(b.sums.air, r.airC);
    add(b.sums.rh, r.rhPct);
    add(b.sums.surface, r.surfaceC);
    add(b.sums.dew, r.dewPointC);
    add(b.sums.margin, r.marginK);
    add(b.sums.emc, r.emcPct);
    if (r.marginK !== null) {
      b.marginMin = b.marginMin === null ? r.marginK : Math.min(b.marginMin, r.marginK);
      b.marginMax = b.marginMax === null ? r.marginK : Math.max(b.marginMax, r.marginK);
    }
    if (RANK[r.level] > RANK[b.level]) b.level = r.level;
    buckets.set(start, b);
  }
  return [...buckets.values()].sort((a, b) => a.atMs - b.atMs);
}

interface Plan {
  bucketSeconds: number;
  originMs: number;
}

const mean = ([sum, n]: [number, number]) => (n === 0 ? null : sum / n);

describe('zone history buckets', () => {
  it('equal the date_bin rule computed from the stored rows, across a month boundary', async () => {
    const user = await insertUser(t.db, {
      email: `buckets-${randomUUID().slice(0, 8)}@test.example`,
      name: 'Maren Spruce',
      passwordHash: 'x',
    });
    const shop = await createShopWithOwner(
      t.db,
      { name: 'Tamarack Benchworks', timeZone: 'Europe/Berlin' },
      user!.id,
    );
    const zone = await insertZone(t.db, shop.id, 'Finishing room');
    const sensors: string[] = [];
    for (const name of ['Saw top', 'Jointer bed']) {
      const s = await insertSensor(t.db, {
        shopId: shop.id,
        zoneId: zone.id,
        name,
        tokenHash: randomUUID(),
      });
      sensors.push(s.id);
    }

    // The start of the current UTC month: its partition and the one before it hold the window.
    const now = new Date();
    const monthMs = Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), 1);
    const fromMs = monthMs - 5 * 60 * MIN - 17_000;
    const toMs = monthMs + 4 * 60 * MIN + 23_000;
    // Buckets of 30 min from an origin off the window's start: the first bucket begins before it.
    const plan: Plan = { bucketSeconds: 1800, originMs: fromMs - 7 * MIN };

    const rows: ReadingRow[] = [];
    const push = (sensor: number, atMs: number, i: number) => {
      const nullish = i % 7 === 3;
      const marginK = i % 11 === 5 ? null : Math.sin(i / 5) * 4 + 1.3;
      rows.push({
        sensorId: sensors[sensor]!,
        shopId: shop.id,
        zoneId: zone.id,
        at: new Date(atMs),
        airC: 14 + Math.sin(i / 9) * 6 + i / 1000,
        rhPct: 60 + Math.cos(i / 13) * 25,
        surfaceC: nullish ? null : 12 + Math.sin(i / 7) * 3,
        surfaceSource: nullish ? null : 'probe',
        batteryV: null,
        dewPointC: nullish ? null : 8 + Math.cos(i / 6),
        marginK,
        emcPct: i % 5 === 2 ? null : 10 + (i % 9) / 3,
        level: LEVELS[(i * 7) % 4]!,
      });
    };
    let i = 0;
    // Irregular steps from 20 min before the window to 20 min after it, both sensors, with ties.
    for (let atMs = fromMs - 20 * MIN; atMs <= toMs + 20 * MIN; atMs += ((i % 5) + 1) * 37_000) {
      push(0, atMs, i);
      if (i % 3 === 0) push(1, atMs, i + 1000);
      i++;
    }
    // On the ends of the window, and exactly on bucket edges (inside and just before).
    push(1, fromMs, 5001);
    push(1, toMs, 5002);
    for (let k = 1; k <= 6; k++) {
      const edgeMs = plan.originMs + k * 1800_000;
      push(1, edgeMs, 6000 + k);
      push(1, edgeMs - 1, 7000 + k);
    }
    await ensureReadingPartitions(t.db, new Date(fromMs - 30 * MIN), new Date(toMs + 30 * MIN));
    await insertReadingGroup(t.pool, rows, []);

    const answer = await querySeries(t.db, {
      zoneId: zone.id,
      from: new Date(fromMs),
      to: new Date(toMs),
      points: 40,
      plan,
    });
    const expected = referenceBuckets(rows, fromMs, toMs, plan);
    // The premise: a bucketed answer, the window's readings split between the two months.
    expect(answer.bucketSeconds).toBe(1800);
    expect(expected.length).toBeGreaterThan(15);
    const parts = await t.pool.query<{ part: string }>(
      `select distinct tableoid::regclass::text as part from readings
       where zone_id = $1 and at >= $2 and at <= $3`,
      [zone.id, new Date(fromMs), new Date(toMs)],
    );
    expect(parts.rows.map((p) => p.part).sort()).toHaveLength(2);
    expect(parts.rows.some((p) => p.part === 'readings_default')).toBe(false);

    expect(answer.rows.map((r) => [r.at.getTime(), r.count, r.level])).toEqual(
      expected.map((b) => [b.atMs, b.n, b.level]),
    );
    answer.rows.forEach((r, k) => {
      const b = expected[k]!;
      // Sums in index order against the reference's insertion order: ties may add differently.
      const close = (got: number | null, want: number | null) => {
        if (want === null) expect(got).toBeNull();
        else expect(got).toBeCloseTo(want, 9);
      };
      close(r.airC, mean(b.sums.air));
      close(r.rhPct, mean(b.sums.rh));
      close(r.surfaceC, mean(b.sums.surface));
      close(r.dewPointC, mean(b.sums.dew));
      close(r.marginK, mean(b.sums.margin));
      close(r.emcPct, mean(b.sums.emc));
      expect(r.marginMinK).toBe(b.marginMin);
      expect(r.marginMaxK).toBe(b.marginMax);
    });
  });
});
