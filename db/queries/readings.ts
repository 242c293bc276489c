import { sql } from 'drizzle-orm';
import type pg from 'pg';

import type { Level, MarginSample } from '@/ingest';
import type { SurfaceSource } from '@/ingest/wire/levels';

import { numberArray, plainArray } from '../arrayLiteral';
import type { Db } from '../index';
import { LIVE_CHANNEL } from '../notify';
import {
  firstRolledAt,
  ROLLUP_RANGE_MS,
  rolledHours,
  rolledUntil,
  seriesFromRollups,
  type SeriesSqlRow,
} from './readingRollups';

export interface ReadingRow {
  sensorId: string;
  shopId: string;
  zoneId: string;
  at: Date;
  /**
   * `at.toISOString()`, when the maker has it already (the ingest path makes it once per
   * reading, for the insert and the answer both): the batch path's per-reading costs add up.
   */
  atIso?: string;
  airC: number;
  rhPct: number;
  surfaceC: number | null;
  surfaceSource: SurfaceSource | null;
  batteryV: number | null;
  dewPointC: number | null;
  marginK: number | null;
  emcPct: number | null;
  level: Level;
}

/** Identifies a reading: a sensor posts at most one reading per instant. */
export const readingKey = (sensorId: string, atMs: number) => `${sensorId}|${atMs}`;

/**
 * Inserts a group of readings in ONE statement — a round trip instead of five, with no
 * explicit transaction: the multi-row INSERT through unnest (a fixed set of array parameters
 * whatever the row count), the sensors' last-seen, battery and interval, and the live
 * notifications, which PostgreSQL delivers only when the statement commits, so a stored
 * reading's message is never lost and a refused one's never sent.
 *
 * `notifyIfAllNew` are the caller's LIVE_CHANNEL payloads for "every row was new", the usual
 * case; when some rows were duplicates the statement sends none of them, and the caller sends
 * its own for the rows that really were new (db/notify.ts). The (shop, sensor, at) key makes
 * retries harmless. The rows' months must have their partitions already (readingPartitions.ts:
 * the writer's guard), or they land in the default partition. Returns the keys (readingKey)
 * inserted, to be asked about `rows`' own keys only; a row of a sensor that no longer exists is
 * not stored and not among them.
 */
export async function insertReadingGroup(
  pool: pg.Pool,
  rows: ReadingRow[],
  notifyIfAllNew: readonly string[],
): Promise<InsertedKeys> {
  const latest = summarizeSensors(rows);
  const inserted = await pool.query<{ sensor_id: string | null; at: Date | null; n: number }>({
    // Named, so each connection parses it once and PostgreSQL keeps its plan: parsing and
    // planning it afresh cost ~0.4 ms of PostgreSQL CPU per one-row group and ~0.7 ms per
    // ten-row group, a third of their cost (scripts/bench/groupCost.ts, FINDINGS.md "The loaded
    // live latency").
    name: 'insert-reading-group',
    text: `with seen as (
       update sensors s
       set last_seen_at = greatest(coalesce(s.last_seen_at, u.at), u.at),
           battery_v = coalesce(u.battery_v, s.battery_v),
           interval_s = case
             when u.batch_interval_s is not null then u.batch_interval_s
             when s.last_seen_at is null or u.at <= s.last_seen_at then s.interval_s
             when s.interval_s is null then extract(epoch from u.at - s.last_seen_at)
             -- A gap of over 4 intervals is an outage, not a new cadence.
             when extract(epoch from u.at - s.last_seen_at) > 4 * s.interval_s then s.interval_s
             else 0.8 * s.interval_s + 0.2 * extract(epoch from u.at - s.last_seen_at)
           end
       from unnest($14::uuid[], $15::timestamptz[], $16::float8[], $17::float8[])
         as u(id, at, battery_v, batch_interval_s)
       where s.id = u.id
       returning s.id
     ), ins as (
       insert into readings (sensor_id, at, shop_id, zone_id, air_c, rh_pct, surface_c,
         surface_source, battery_v, dew_point_c, margin_k, emc_pct, level)
       select * from unnest($1::uuid[], $2::timestamptz[], $3::uuid[], $4::uuid[], $5::float8[],
         $6::float8[], $7::float8[], $8::surface_source[], $9::float8[], $10::float8[],
         $11::float8[], $12::float8[], $13::level[])
         as r(sensor_id, at, shop_id, zone_id, air_c, rh_pct, surface_c, surface_source,
           battery_v, dew_point_c, margin_k, emc_pct, level)
       -- Only for sensors whose row this statement updated, and so locked: readings have no
       -- foreign key (db/schema/sensing.ts), and a sensor deleted meanwhile (its shop deleted)
       -- either went before (nothing stored) or waits for this commit and its trigger then
       -- deletes these rows too.
       where r.sensor_id in (select id from seen)
       on conflict (shop_id, sensor_id, at) do nothing
       returning sensor_id, at
     ), notified as (
       select pg_notify($18, p) from unnest($19::text[]) as p
       where (select count(*) from ins) = $20
     ), counted as (
       select count(*) as n from ins
     )
     -- The usual case, every row new, answers one row with the count: no key is sent back and
     -- parsed per row. Only when some were not stored do the stored ones' keys come back.
     select i.sensor_id, i.at, c.n::int as n, (select count(*) from notified) as notes
       from counted c
       left join lateral (select sensor_id, at from ins where c.n < $20) i on true`,
    values: [
      plainArray(rows.map((r) => r.sensorId)),
      plainArray(rows.map((r) => r.atIso ?? r.at.toISOString())),
      plainArray(rows.map((r) => r.shopId)),
      plainArray(rows.map((r) => r.zoneId)),
      numberArray(rows.map((r) => r.airC)),
      numberArray(rows.map((r) => r.rhPct)),
      numberArray(rows.map((r) => r.surfaceC)),
      plainArray(rows.map((r) => r.surfaceSource)),
      numberArray(rows.map((r) => r.batteryV)),
      numberArray(rows.map((r) => r.dewPointC)),
      numberArray(rows.map((r) => r.marginK)),
      numberArray(rows.map((r) => r.emcPct)),
      plainArray(rows.map((r) => r.level)),
      plainArray(latest.map((r) => r.sensorId)),
      plainArray(latest.map((r) => r.at.toISOString())),
      numberArray(latest.map((r) => r.batteryV)),
      numberArray(latest.map((r) => r.batchIntervalS)),
      LIVE_CHANNEL,
      notifyIfAllNew,
      rows.length,
    ],
  });
  if (inserted.rows[0]?.n === rows.length) return allOf(rows.length);
  return new Set(
    inserted.rows
      .filter((r) => r.at !== null)
      .map((r) => readingKey(r.sensor_id!, r.at!.getTime())),
  );
}

/** The stored keys when every row given was stored: asked only about those rows' keys. */
export interface InsertedKeys {
  size: number;
  has(key: string): boolean;
}

const allOf = (size: number): InsertedKeys => ({ size, has: () => true });

/**
 * Per sensor in a group: its newest reading (last seen, battery) and, when it sent several,
 * the median gap between them — a batch is a sensor's own record of its cadence.
 */
function summarizeSensors(rows: ReadingRow[]) {
  const bySensor = new Map<string, ReadingRow[]>();
  for (const row of rows) {
    const own = bySensor.get(row.sensorId);
    if (own) own.push(row);
    else bySensor.set(row.sensorId, [row]);
  }
  return [...bySensor.values()].map((own) => {
    const times = own.map((r) => r.at.getTime()).sort((a, b) => a - b);
    const gapsS = times
      .slice(1)
      .map((t, i) => (t - times[i]!) / 1000)
      .sort((a, b) => a - b);
    const newest = own.reduce((a, b) => (b.at > a.at ? b : a));
    return {
      sensorId: newest.sensorId,
      at: newest.at,
      batteryV: newest.batteryV,
      batchIntervalS: gapsS.length ? gapsS[Math.floor(gapsS.length / 2)]! : null,
    };
  });
}

/** A point of a zone's series as stored: one reading, or one bucket's means and lowest margin. */
export interface SeriesRow {
  at: Date;
  airC: number;
  rhPct: number;
  surfaceC: number | null;
  dewPointC: number | null;
  marginK: number | null;
  /** The lowest margin inside the bucket; equals `marginK` for a raw reading. */
  marginMinK: number | null;
  /** The highest margin inside the bucket; equals `marginK` for a raw reading. */
  marginMaxK: number | null;
  emcPct: number | null;
  /** The level stored with the reading; for a bucket, the worst one stored in it. */
  level: Level;
  count: number;
}

/**
 * When a zone's first reading was taken, or null before any: the chart spans what there is until
 * a zone has a day of history. One probe of the (zone_id, at) index.
 */
export async function firstReadingAt(db: Db, zoneId: string): Promise<Date | null> {
  const [result, rolled] = await Promise.all([
    db.execute<{ at: Date | string }>(sql`
      select at from readings where zone_id = ${zoneId} order by at limit 1`),
    // Raw readings older than the retention are gone; their hours' roll-ups stay.
    firstRolledAt(db, zoneId),
  ]);
  const at = result.rows[0]?.at;
  const raw = at === undefined ? null : new Date(at);
  return raw && rolled ? (raw < rolled ? raw : rolled) : (raw ?? rolled);
}

/**
 * A zone's series between two times: raw readings when they fit in `points`, else buckets of
 * `plan.bucketSeconds` (date_bin from `plan.originMs`) that average the values but keep each
 * bucket's lowest AND highest margin, because the closest approach to the dew point is what a
 * chart must never smooth away, and the band between the two shows how far the margin swung.
 * The caller's plan keeps the bucket count within `points` (server/readings/bucketPlan.ts);
 * without one the buckets are equal slices from `from`.
 * `bucketSeconds` is 0 for raw readings.
 */
export async function querySeries(
  db: Db,
  q: {
    zoneId: string;
    from: Date;
    to: Date;
    points: number;
    /** Without one: equal buckets from `from`, at most `points` of them. */
    plan?: { bucketSeconds: number; originMs: number };
    /** False: raw readings only, even over 7 days (the bench's before-and-after). */
    rollups?: boolean;
  },
): Promise<{ bucketSeconds: number; rows: SeriesRow[] }> {
  const spanS = (q.to.getTime() - q.from.getTime()) / 1000;
  const plan = q.plan ?? {
    // floor(span / width) + 1 buckets over [from, to] with both ends included.
    bucketSeconds: Math.max(1, Math.ceil(spanS / Math.max(1, q.points - 1))),
    originMs: q.from.getTime(),
  };
  // Bucketed first: a long span (the usual case for a chart) then costs one index-only scan;
  // only a span of no more readings than points is read again, raw.
  const { bucketSeconds } = plan;
  const origin = new Date(plan.originMs);
  // Over 7 days, with buckets of whole hours from a whole hour (the route's plan), the whole
  // hours the roll-up job has done come from readings_hourly and only the edges from readings.
  // The mark is asked for only when the range could use it: a round trip saved on every chart
  // of 7 days or less, the usual one.
  const hourly =
    (q.rollups ?? true) &&
    q.to.getTime() - q.from.getTime() > ROLLUP_RANGE_MS &&
    bucketSeconds % 3600 === 0 &&
    plan.originMs % 3_600_000 === 0;
  const hours = hourly ? rolledHours(q.from, q.to, await rolledUntil(db)) : null;
  if (hours) {
    const rows = (await seriesFromRollups(db, { ...q, plan, hours })).map(toSeriesRow);
    const total = rows.reduce((n, r) => n + r.count, 0);
    if (total > q.points) return { bucketSeconds, rows };
    // Few enough to send one by one, if the raw readings are all still there (retention).
    const raw = await rawSeries(db, q);
    return raw.length === total ? { bucketSeconds: 0, rows: raw } : { bucketSeconds, rows };
  }
  // Bucket by bucket: a series of the buckets' starts, and for each one an aggregate over its
  // own range of the (zone_id, at) index. Grouping all the zone's readings by date_bin(at)
  // instead leaves the plan to the planner's guess of the group count, which takes
  // date_bin(at) to be as distinct as `at` (~14,000 groups guessed for a week's 449): over the
  // monthly partitions' Append that guess tipped the hash table past work_mem and the plan
  // became a sort of every reading (20,000 for a week of a two-sensor zone) before grouping,
  // 2.3x slower than the unpartitioned table's hash (README, issue 13). Here there is nothing
  // to guess: each bucket's readings arrive in index order, one short range each. Means are
  // sum / count (the same float additions in the same order as avg()).
  const width = sql`make_interval(secs => ${bucketSeconds})`;
  const bucketed = await db.execute<RawRow>(sql`
    select b.at, f.*
    from generate_series(date_bin(${width}, ${q.from}::timestamptz, ${origin}::timestamptz),
                         ${q.to}::timestamptz, ${width}) as b(at)
    cross join lateral (
      select sum(air_c) / count(*) as air_c, sum(rh_pct) / count(*) as rh_pct,
             sum(surface_c) / nullif(count(surface_c), 0) as surface_c,
             sum(dew_point_c) / nullif(count(dew_point_c), 0) as dew_point_c,
             sum(margin_k) / nullif(count(margin_k), 0) as margin_k,
             min(margin_k) as margin_min, max(margin_k) as margin_max,
             sum(emc_pct) / nullif(count(emc_pct), 0) as emc_pct,
             count(*)::int as n,
             -- The worst level stored in the bucket (wet over close over dry over unknown), so a
             -- short wet spell never disappears into an average.
             (array['unknown', 'dry', 'close', 'wet']::level[])[
               max(case level when 'wet' then 4 when 'close' then 3 when 'dry' then 2 else 1 end)
             ] as level
      from readings
      -- The constant bounds prune the months at plan time; the bucket's own bound reads its
      -- range of the index.
      where zone_id = ${q.zoneId} and at >= ${q.from} and at <= ${q.to}
        and at >= b.at and at < b.at + ${width}
    ) f
    where f.n > 0
    order by b.at`);
  const total = bucketed.rows.reduce((n, r) => n + Number(r.n), 0);
  if (total > q.points) return { bucketSeconds, rows: bucketed.rows.map(toSeriesRow) };

  return { bucketSeconds: 0, rows: await rawSeries(db, q) };
}

async function rawSeries(db: Db, q: { zoneId: string; from: Date; to: Date }) {
  const raw = await db.execute<RawRow>(sql`
    select at, air_c, rh_pct, surface_c, dew_point_c, margin_k, margin_k as margin_min,
           margin_k as margin_max, emc_pct, level, 1 as n
    from readings
    where zone_id = ${q.zoneId} and at >= ${q.from} and at <= ${q.to}
    order by at`);
  return raw.rows.map(toSeriesRow);
}

type RawRow = SeriesSqlRow;

// avg() of double precision comes back as double, but be strict: pg may hand back strings.
const num = (v: number | string) => (typeof v === 'number' ? v : Number(v));
const numOrNull = (v: number | string | null) => (v === null ? null : num(v));

function toSeriesRow(r: RawRow): SeriesRow {
  return {
    at: new Date(r.at),
    airC: num(r.air_c),
    rhPct: num(r.rh_pct),
    surfaceC: numOrNull(r.surface_c),
    dewPointC: numOrNull(r.dew_point_c),
    marginK: numOrNull(r.margin_k),
    marginMinK: numOrNull(r.margin_min),
    marginMaxK: numOrNull(r.margin_max),
    emcPct: numOrNull(r.emc_pct),
    level: r.level,
    count: r.n,
  };
}

/** A sensor's stored air temperatures in [from, to), oldest first: the surface estimate's input. */
export async function airSamplesOfSensor(db: Db, sensorId: string, from: Date, to: Date) {
  const result = await db.execute<{ at: Date | string; air_c: number }>(sql`
    select at, air_c from readings
    where sensor_id = ${sensorId} and at >= ${from} and at < ${to}
    order by at
    limit 5000`);
  return result.rows.map((r) => ({ atMs: new Date(r.at).getTime(), airC: Number(r.air_c) }));
}

/**
 * For a reconnecting live client: per zone of these shops, the newest reading after `since`
 * and how many arrived, walked through the (zone_id, at) index.
 */
export async function latestPerZoneSince(db: Db, shopIds: string[], since: Date) {
  if (shopIds.length === 0) return [];
  const result = await db.execute<{
    shop_id: string;
    zone_id: string;
    sensor_id: string;
    at: Date | string;
    air_c: number;
    rh_pct: number;
    surface_c: number | null;
    dew_point_c: number | null;
    margin_k: number | null;
    emc_pct: number | null;
    level: Level;
    surface_source: SurfaceSource | null;
    n: number;
  }>(sql`
    select z.shop_id, z.id as zone_id, r.sensor_id, r.at, r.air_c, r.rh_pct, r.surface_c,
           r.dew_point_c, r.margin_k, r.emc_pct, r.level, r.surface_source, c.n
    from zones z
    join lateral (
      select * from readings where zone_id = z.id and at > ${since} order by at desc limit 1
    ) r on true
    join lateral (
      select count(*)::int as n from readings where zone_id = z.id and at > ${since}
    ) c on true
    where z.shop_id in (${sql.join(
      shopIds.map((id) => sql`${id}::uuid`),
      sql`, `,
    )})`);
  return result.rows.map((r) => ({
    shopId: r.shop_id,
    zoneId: r.zone_id,
    sensorId: r.sensor_id,
    count: r.n,
    reading: {
      at: new Date(r.at).toISOString(),
      air: num(r.air_c),
      rh: num(r.rh_pct),
      surface: numOrNull(r.surface_c),
      dewPoint: numOrNull(r.dew_point_c),
      margin: numOrNull(r.margin_k),
      emc: numOrNull(r.emc_pct),
      level: r.level,
      surfaceSource: r.surface_source,
    },
  }));
}

/** A zone's stored dew margins in [from, to], oldest first: the early warning's input. */
export async function zoneMargins(ex: Db, zoneId: string, from: Date, to: Date) {
  const rows = await ex.execute<{ at: Date | string; margin_k: number }>(sql`
    select at, margin_k from readings
    where zone_id = ${zoneId} and at >= ${from} and at <= ${to} and margin_k is not null
    order by at`);
  return rows.rows.map((r): MarginSample => ({
    atMs: new Date(r.at).getTime(),
    marginK: Number(r.margin_k),
  }));
}
