/**
 * The chart-query bench: one zone's 7-day history (the readings route's own query, 500 points)
 * with 10 million readings stored across 1,000 sensors.
 *
 * The install: 100 shops × 5 zones × 2 sensors. A big Drybench install is many small shops on
 * one server, not one shop with a thousand sensors: a shop watches a few areas (machine room,
 * lumber rack, finishing room…) and a zone has one or two sensors (a probe on the main saw top,
 * one by the jointer). Two per zone is the harder case for this query (twice the rows per zone
 * than one sensor per zone). Each sensor posts once a minute for a week: 1,000 × 10,080 =
 * 10.08 M rows, so the week asked for holds 20,160 of a zone's readings, bucketed into ~450.
 *
 * The rows are generated in SQL (insert … select … generate_series), in time order across all
 * sensors as real ingest writes them — a zone's rows are scattered over the whole table, which
 * is what makes the query hard — with the indexes dropped while loading and rebuilt after
 * (sorting once is far quicker than 10 M index insertions), then VACUUM ANALYZE, as autovacuum
 * would have done on a live table long ago.
 */
import { readFileSync } from 'node:fs';

import type pg from 'pg';

import { createDatabase } from '@/db';
import { floorHourMs, readRollupMark, writeRollupMark } from '@/db/queries/readingRollups';
import { querySeries } from '@/db/queries/readings';
import { TOW_MAX_GAP_MS } from '@/ingest/wetness';
import { bucketPlan } from '@/server/readings/bucketPlan';

import { dayOfReadingsSql, insertInstall, type InstallNames } from './generatedInstall';
import { rollupRunsBetween } from './rollupRuns';
import { percentile } from './stats';

export const CHART_INSTALL = { shops: 100, zonesPerShop: 5, sensorsPerZone: 2, days: 7 };
const SHOP_TIME_ZONE = 'Europe/Berlin';
const WEEK_MS = 7 * 24 * 3_600_000;
const POINTS = 500;

export interface ChartQueryResult {
  rows: number;
  sensors: number;
  zones: number;
  seedS: number;
  indexS: number;
  vacuumS: number;
  /** Seconds migration 0010 took on the 10 M rows (drop and build the covering index). */
  coverS: number;
  /** p50 / p95 of the route's query as shipped (db/migrations). */
  p50Ms: number;
  p95Ms: number;
  /** The same queries on the plain (zone_id, at) index, before 0010, in the same run. */
  baselineP50Ms: number;
  baselineP95Ms: number;
  queries: number;
  pointsPerAnswer: number;
  /**
   * Buffer pages one week query touches (EXPLAIN BUFFERS, median of 20 zones), plain index
   * and covering: a figure that does not move with other work on the machine, and the one that
   * decides how the query fares once the table no longer fits in memory.
   */
  baselinePages: number;
  pages: number;
  /**
   * Seconds the server's roll-up job ran during the timed queries (plain index, as shipped):
   * it shares the two cores, so a figure taken beside one of its runs is partly its own.
   */
  rollupJobS: { baseline: number; shipped: number };
}

const ZONE_INDEX = 'readings_zone_id_at_index';
const PLAIN_ZONE_INDEX = `create index "${ZONE_INDEX}" on readings using btree (zone_id, at)`;
const COVERING_MIGRATION = 'db/migrations/0010_history_covering_index.sql';

const NAMES: InstallNames = {
  idKey: 'bench',
  shop: 'History shop',
  zone: 'Zone',
  sensor: 'History sensor',
  token: 'token',
};
// Both halves of the sensors at once, one connection each.
// Received when taken, as a week of live ingest was: loaded with now() the server's roll-up job
// took the whole week as late readings and re-rolled 10 M rows on the machine's two cores while
// the queries were being timed.
const DAY_OF_READINGS = dayOfReadingsSql(NAMES, { half: true, receivedAtTaken: true });

/**
 * Runs `load` on a connection of its own with triggers off (session_replication_role = replica):
 * readings have no foreign key since migration 0014, and nothing else fires on an insert, so
 * this only keeps the load as plain as it was measured before.
 */
async function generated<T>(pool: pg.Pool, load: (client: pg.PoolClient) => Promise<T>) {
  const client = await pool.connect();
  try {
    await client.query('set session_replication_role = replica');
    return await load(client);
  } finally {
    await client.query('reset session_replication_role');
    client.release();
  }
}

/** The shops, zones and sensors, then 10 M readings; returns seconds spent per step. */
async function seed(
  pool: pg.Pool,
  db: ReturnType<typeof createDatabase>['db'],
  endMs: number,
  progress: (line: string) => void,
) {
  const { days } = CHART_INSTALL;
  const { zones, sensors } = await insertInstall(pool, CHART_INSTALL, NAMES, SHOP_TIME_ZONE);

  // The indexes are rebuilt after the load; their definitions come from the migrations.
  const indexes = await pool.query<{ name: string; def: string; constraint: boolean }>(`
    select i.indexname as name, i.indexdef as def,
           exists (select 1 from pg_constraint c where c.conname = i.indexname) as constraint
    from pg_indexes i where i.tablename = 'readings'`);
  for (const index of indexes.rows) {
    await pool.query(
      index.constraint
        ? `alter table readings drop constraint "${index.name}"`
        : `drop index "${index.name}"`,
    );
  }

  let started = performance.now();
  progress(`generating ${(sensors * days * 1440).toLocaleString('en-US')} readings in SQL…`);
  // A day per statement, both halves of the sensors at once: one core each.
  const startMs = endMs - days * 24 * 3_600_000;
  for (let day = 0; day < days; day++) {
    const from = new Date(startMs + day * 86_400_000).toISOString();
    await Promise.all(
      [0, 1].map((half) =>
        generated(pool, (client) => client.query(DAY_OF_READINGS, [from, half])),
      ),
    );
    progress(`  day ${day + 1} of ${days}`);
  }
  const seedS = (performance.now() - started) / 1000;

  started = performance.now();
  await pool.query(`set maintenance_work_mem = '512MB'`);
  // The zone index as it was before migration 0010 (no INCLUDE): the baseline is measured on
  // it, then the migration's own statements turn it into the covering one.
  // readings is partitioned (migration 0014): pg_indexes gives the parent's definitions "ON
  // ONLY", which would build an index of the parent alone; and a partitioned table's primary key
  // cannot adopt an index, so it is added with its columns and builds on every partition.
  const rebuilt = indexes.rows
    .filter((index) => !index.constraint)
    .map((index) =>
      index.name === ZONE_INDEX ? PLAIN_ZONE_INDEX : index.def.replace(' ON ONLY ', ' ON '),
    );
  const keys = indexes.rows
    .filter((index) => index.constraint)
    .map((index) => {
      const columns = /\(([^()]*)\)\s*$/.exec(index.def)?.[1];
      if (!columns) throw new Error(`no key columns in ${index.def}`);
      return `alter table readings add constraint "${index.name}" primary key (${columns})`;
    });
  // One at a time: on the partitioned table each statement locks readings anyway, and waiting
  // ones would sit in the pool's queue past its connect timeout.
  for (const statement of [...rebuilt, ...keys]) await pool.query(statement);
  const indexS = (performance.now() - started) / 1000;
  started = performance.now();
  await pool.query('vacuum analyze readings');
  const vacuumS = (performance.now() - started) / 1000;
  // A server that has been running has its roll-up mark; one started for this phase alone may
  // not have run the job yet, and its first run would roll up all 10 M rows during the timing.
  // The mark as the job leaves it (the hours of this week are not rolled: a 7-day chart reads
  // raw readings, and so does every other reader of these bench zones).
  if (!(await readRollupMark(db))) {
    await writeRollupMark(db, {
      rolledUntil: new Date(floorHourMs(endMs - TOW_MAX_GAP_MS)),
      receivedThrough: new Date(),
    });
  }
  return { rows: sensors * days * 1440, sensors, zones, seedS, indexS, vacuumS };
}

/** Times the route's query for a week of one zone, rotating over the zones; ms per query. */
async function timeQueries(
  db: ReturnType<typeof createDatabase>['db'],
  zoneIds: string[],
  endMs: number,
  count: number,
): Promise<{ samplesMs: number[]; points: number }> {
  const samplesMs: number[] = [];
  let points = 0;
  const to = new Date(endMs);
  const from = new Date(endMs - WEEK_MS);
  const plan = bucketPlan(from.getTime(), to.getTime(), POINTS, SHOP_TIME_ZONE);
  for (let i = 0; i < count; i++) {
    const zoneId = zoneIds[(i * 37) % zoneIds.length]!;
    const started = performance.now();
    const series = await querySeries(db, { zoneId, from, to, points: POINTS, plan });
    samplesMs.push(performance.now() - started);
    points = Math.max(points, series.rows.length);
  }
  return { samplesMs, points };
}

/**
 * Median shared buffers (hit + read) of the week query's scan over 20 zones: the median, as a
 * buffer pinned again counts again and an odd zone can show thousands of repeat hits.
 */
async function pagesPerQuery(pool: pg.Pool, zoneIds: string[], endMs: number): Promise<number> {
  const counts: number[] = [];
  const zones = zoneIds.slice(0, 20);
  for (const zoneId of zones) {
    // The series query's range and its columns (db/queries/readings.ts): the pages the week
    // lies on. The route reads them bucket by bucket, one short index descent each, so its own
    // EXPLAIN counts more hits (~2,200 for 449 buckets) on these same pages.
    const result = await pool.query<{ 'QUERY PLAN': [{ Plan: Record<string, number> }] }>(
      `explain (analyze, buffers, format json)
       select avg(air_c), avg(rh_pct), avg(surface_c), avg(dew_point_c), min(margin_k),
              max(margin_k), avg(emc_pct), max(level::text)
       from readings where zone_id = $1 and at >= $2 and at <= $3`,
      [zoneId, new Date(endMs - WEEK_MS), new Date(endMs)],
    );
    const plan = result.rows[0]!['QUERY PLAN'][0].Plan;
    counts.push((plan['Shared Hit Blocks'] ?? 0) + (plan['Shared Read Blocks'] ?? 0));
  }
  return percentile(
    counts.sort((a, b) => a - b),
    50,
  );
}

export async function measureChartQuery(
  databaseUrl: string,
  progress: (line: string) => void,
  queries = 300,
): Promise<ChartQueryResult> {
  const { pool, db } = createDatabase(databaseUrl, { max: 2 });
  try {
    // The newest reading a minute ago, so the week asked for is full.
    const endMs = Math.floor(Date.now() / 60_000) * 60_000;
    const seeded = await seed(pool, db, endMs, progress);
    progress(
      `seeded ${seeded.rows.toLocaleString('en-US')} readings in ${seeded.seedS.toFixed(1)} s, ` +
        `indexes ${seeded.indexS.toFixed(1)} s, vacuum analyze ${seeded.vacuumS.toFixed(1)} s`,
    );
    const zones = await pool.query<{ id: string }>(
      `select id from zones where name like 'Zone %' order by id`,
    );
    const zoneIds = zones.rows.map((z) => z.id);

    progress(`${queries} week queries with the plain (zone_id, at) index (baseline)…`);
    // Warm-up: a first pass over the zones, as a running server's cache would be.
    await timeQueries(db, zoneIds, endMs, 50);
    let timedFromMs = Date.now();
    const baseline = await timeQueries(db, zoneIds, endMs, queries);
    const baselineJob = await rollupRunsBetween(pool, timedFromMs, Date.now());
    const baselinePages = await pagesPerQuery(pool, zoneIds, endMs);
    const baseSorted = [...baseline.samplesMs].sort((a, b) => a - b);

    progress('migration 0010: the zone index covers the chart columns…');
    const started = performance.now();
    await pool.query(`set maintenance_work_mem = '512MB'`);
    for (const statement of readFileSync(COVERING_MIGRATION, 'utf8').split(
      '--> statement-breakpoint',
    )) {
      await pool.query(statement);
    }
    await pool.query('analyze readings');
    const coverS = (performance.now() - started) / 1000;
    progress(`  ${coverS.toFixed(1)} s`);

    progress(`${queries} week queries, as shipped…`);
    await timeQueries(db, zoneIds, endMs, 50);
    timedFromMs = Date.now();
    const shipped = await timeQueries(db, zoneIds, endMs, queries);
    const shippedJob = await rollupRunsBetween(pool, timedFromMs, Date.now());
    progress(
      `  roll-up job running during the timing: ${baselineJob.seconds.toFixed(1)} s (plain), ` +
        `${shippedJob.seconds.toFixed(1)} s (as shipped)`,
    );
    const pages = await pagesPerQuery(pool, zoneIds, endMs);
    const sorted = [...shipped.samplesMs].sort((a, b) => a - b);
    return {
      ...seeded,
      coverS,
      p50Ms: percentile(sorted, 50),
      p95Ms: percentile(sorted, 95),
      baselineP50Ms: percentile(baseSorted, 50),
      baselineP95Ms: percentile(baseSorted, 95),
      queries,
      pointsPerAnswer: shipped.points,
      baselinePages,
      pages,
      rollupJobS: { baseline: baselineJob.seconds, shipped: shippedJob.seconds },
    };
  } finally {
    await pool.end();
  }
}
