/**
 * The long-range chart bench: one zone's 30-day and 90-day history (the readings route's plan,
 * 500 points) from raw readings and from the hourly roll-ups, interleaved round by round on the
 * same data, so load on the shared machine falls on both alike.
 *
 * The install: 2 shops × 5 zones × 2 sensors posting once a minute for 91 days, 2.6 M readings
 * (a zone's 90 days are 259,200 of them), generated in SQL a day per statement in time order
 * across the sensors as ingest writes them, with received_at set to the reading's time (as if
 * received when taken), then rolled up the way a CSV import does (rollUpRange over its range).
 * Besides the times, the rows each answer reads: independent of load.
 */
import type pg from 'pg';

import { createDatabase } from '@/db';
import { rollUpRange } from '@/db/queries/readingRollups';
import { querySeries } from '@/db/queries/readings';
import { runReadingRollup } from '@/server/jobs';
import { bucketPlan } from '@/server/readings/bucketPlan';

import { dayOfReadingsSql, insertInstall, type InstallNames } from './generatedInstall';
import { percentile } from './stats';

export const LONG_INSTALL = { shops: 2, zonesPerShop: 5, sensorsPerZone: 2, days: 91 };
const SHOP_TIME_ZONE = 'Europe/Berlin';
const DAY_MS = 24 * 3_600_000;
const POINTS = 500;

export interface LongChartResult {
  rows: number;
  seedS: number;
  /** Seconds rollUpRange took over the 91 days, and the hourly rows it wrote. */
  rollupS: number;
  rollupRows: number;
  rounds: number;
  queriesPerRound: number;
  /** p50 / p95 per span, raw readings only and with roll-ups. */
  spans: Record<
    '30d' | '90d',
    {
      rawP50Ms: number;
      rawP95Ms: number;
      p50Ms: number;
      p95Ms: number;
      /** Rows one answer reads: readings in the window, or rolled hours plus edge readings. */
      rawRowsRead: number;
      rowsRead: number;
      points: number;
    }
  >;
}

const NAMES: InstallNames = {
  idKey: 'long',
  shop: 'Long shop',
  zone: 'Long zone',
  sensor: 'Long sensor',
  token: 'long-token',
};
const DAY_OF_READINGS = dayOfReadingsSql(NAMES, { receivedAtTaken: true });

async function seed(pool: pg.Pool, endMs: number, progress: (line: string) => void) {
  const { days } = LONG_INSTALL;
  const { sensors } = await insertInstall(pool, LONG_INSTALL, NAMES, SHOP_TIME_ZONE);
  const started = performance.now();
  const startMs = endMs - days * DAY_MS;
  for (let day = 0; day < days; day++) {
    await pool.query(DAY_OF_READINGS, [new Date(startMs + day * DAY_MS).toISOString()]);
    if ((day + 1) % 10 === 0) progress(`  day ${day + 1} of ${days}`);
  }
  await pool.query('vacuum analyze readings');
  return { rows: sensors * days * 1440, seedS: (performance.now() - started) / 1000, startMs };
}

export async function measureLongChart(
  databaseUrl: string,
  progress: (line: string) => void,
  rounds = 6,
  queriesPerRound = 20,
): Promise<LongChartResult> {
  const { pool, db } = createDatabase(databaseUrl, { max: 2 });
  try {
    const endMs = Math.floor(Date.now() / 60_000) * 60_000;
    progress(`generating ${LONG_INSTALL.days} days of readings for the long-range chart…`);
    const seeded = await seed(pool, endMs, progress);
    let started = performance.now();
    const rollupRows = await rollUpRange(db, new Date(seeded.startMs), new Date(endMs));
    const rollupS = (performance.now() - started) / 1000;
    // The mark, as the job leaves it: hours up to now − cap are rolled.
    await runReadingRollup(db, Date.now());
    progress(
      `seeded ${seeded.rows.toLocaleString('en-US')} readings in ${seeded.seedS.toFixed(1)} s; ` +
        `rolled up into ${rollupRows.toLocaleString('en-US')} hourly rows in ${rollupS.toFixed(1)} s`,
    );
    const zoneIds = (
      await pool.query<{ id: string }>(`select id from zones where name like 'Long zone %'`)
    ).rows.map((z) => z.id);

    const spans = { '30d': 30, '90d': 90 } as const;
    const samples = new Map<string, number[]>();
    const time = async (span: keyof typeof spans, rollups: boolean, count: number) => {
      const to = new Date(endMs);
      const from = new Date(endMs - spans[span] * DAY_MS);
      const plan = bucketPlan(from.getTime(), to.getTime(), POINTS, SHOP_TIME_ZONE);
      const key = `${span}:${rollups}`;
      const list = samples.get(key) ?? [];
      let points = 0;
      for (let i = 0; i < count; i++) {
        const zoneId = zoneIds[(i * 7) % zoneIds.length]!;
        started = performance.now();
        const series = await querySeries(db, { zoneId, from, to, points: POINTS, plan, rollups });
        list.push(performance.now() - started);
        points = series.rows.length;
      }
      samples.set(key, list);
      return points;
    };
    // Warm-up of both, then rounds that alternate which goes first.
    for (const span of ['30d', '90d'] as const) {
      await time(span, false, 5);
      await time(span, true, 5);
    }
    samples.clear();
    const points: Record<string, number> = {};
    for (let round = 0; round < rounds; round++) {
      progress(`  round ${round + 1} of ${rounds}`);
      for (const span of ['30d', '90d'] as const) {
        const order = round % 2 === 0 ? [false, true] : [true, false];
        for (const rollups of order) {
          points[`${span}:${rollups}`] = await time(span, rollups, queriesPerRound);
        }
      }
    }

    const rowsRead = async (days: number) => {
      const from = new Date(endMs - days * DAY_MS);
      const r = await pool.query<{ raw: string; rolled: string; edges: string }>(
        `select (select count(*) from readings where zone_id = $1 and at >= $2 and at <= $3) as raw,
                (select count(*) from readings_hourly where zone_id = $1
                   and hour >= date_trunc('hour', $2::timestamptz) + interval '1 hour'
                   and hour < date_trunc('hour', $3::timestamptz)) as rolled,
                (select count(*) from readings where zone_id = $1 and (
                   (at >= $2 and at < date_trunc('hour', $2::timestamptz) + interval '1 hour')
                   or (at >= date_trunc('hour', $3::timestamptz) and at <= $3))) as edges`,
        [zoneIds[0], from, new Date(endMs)],
      );
      const row = r.rows[0]!;
      return { raw: Number(row.raw), rolled: Number(row.rolled) + Number(row.edges) };
    };
    const figures = async (span: keyof typeof spans) => {
      const sorted = (rollups: boolean) =>
        [...(samples.get(`${span}:${rollups}`) ?? [])].sort((a, b) => a - b);
      const read = await rowsRead(spans[span]);
      return {
        rawP50Ms: percentile(sorted(false), 50),
        rawP95Ms: percentile(sorted(false), 95),
        p50Ms: percentile(sorted(true), 50),
        p95Ms: percentile(sorted(true), 95),
        rawRowsRead: read.raw,
        rowsRead: read.rolled,
        points: points[`${span}:true`] ?? 0,
      };
    };
    return {
      rows: seeded.rows,
      seedS: seeded.seedS,
      rollupS,
      rollupRows,
      rounds,
      queriesPerRound,
      spans: { '30d': await figures('30d'), '90d': await figures('90d') },
    };
  } finally {
    await pool.end();
  }
}
