/**
 * Hourly roll-ups of the readings (db/schema/rollups.ts): writing them from raw readings, the
 * roll-up job's mark, and finding the hours that readings received since the last run touched.
 * The readers of long ranges live beside their raw twins (readings.ts, reports.ts) and read
 * roll-ups only for hours before the mark.
 */
import { sql, type SQL } from 'drizzle-orm';

import type { Level } from '@/ingest';

import { TOW_AIR_ABOVE_C, TOW_MAX_GAP_MS, TOW_RH_ABOVE_PCT } from '@/ingest/wetness';

import type { Db } from '../index';
import { transaction } from '../transaction';
import type { FigureSqlRow, ReportPeriod } from './reports';

export const HOUR_MS = 3_600_000;

/** Ranges longer than this are read from the roll-ups for their whole hours. */
export const ROLLUP_RANGE_MS = 7 * 24 * HOUR_MS;

/** UTC hours, whatever the session's time zone (date_trunc would follow it: +05:30 shops). */
export const floorHourMs = (ms: number) => Math.floor(ms / HOUR_MS) * HOUR_MS;
export const ceilHourMs = (ms: number) => Math.ceil(ms / HOUR_MS) * HOUR_MS;

/**
 * Recomputes the roll-ups of every sensor for the hours in [fromHour, toHour) (widened to whole
 * UTC hours) from the raw readings, in one statement; an upsert, so running it twice changes
 * nothing. Readings up to TOW_MAX_GAP_MS past the range are read too: a reading's share runs
 * until the next one, and a next reading further away than the cap changes nothing but the end
 * of a gap, which a probe of the indexes finds. Hours whose raw readings are gone (dropped by
 * retention) keep their roll-ups: nothing is deleted. Returns the rows written.
 *
 * With `scope`, only the readings of those zones are read and only their sensors' hours
 * written: what a zone's readings change never reaches another zone's roll-ups (a reading's
 * zone share ends at its zone's next reading, its own share at its sensor's next), so a CSV
 * import re-rolls its zone alone and never loads other shops' readings.
 */
export async function rollUpHours(
  db: Db,
  fromHour: Date,
  toHour: Date,
  scope?: RollupScope,
): Promise<number> {
  const from = new Date(floorHourMs(fromHour.getTime()));
  const to = new Date(ceilHourMs(toHour.getTime()));
  if (to <= from) return 0;
  if (scope && scope.zoneIds.length === 0) return 0;
  const cap = TOW_MAX_GAP_MS;
  const inScope = scope ? sql`and r.zone_id in (${uuidList(scope.zoneIds)})` : sql``;
  return transaction(db, async (tx) => {
    // No JIT for this statement. Its correlated look-ups run over every month partition of
    // readings, so the planner's cost estimate grows with the months stored (not the rows
    // rolled) and passes jit_optimize_above_cost: measured here with 50 partitions, a day of 471
    // readings took 41–62 s, nearly all of it compiling 6,193 functions with LLVM, against
    // 0.5 s without JIT — the statement timeouts after a year's import. JIT only pays for long
    // scans; this statement reads a day at most.
    await tx.execute(sql`set local jit = off`);
    return rollUpStatement(tx, from, to, cap, inScope);
  });
}

async function rollUpStatement(db: Db, from: Date, to: Date, cap: number, inScope: SQL) {
  const result = await db.execute(sql`
    with src as (
      select r.*, round(date_part('epoch', r.at) * 1000) as at_ms,
             lead(r.at) over z as zone_next_at, lead(r.sensor_id) over z as zone_next_sensor,
             lead(r.at) over s as own_next_at
      from readings r
      where r.at >= ${from}::timestamptz
        and r.at < ${to}::timestamptz + make_interval(secs => ${cap / 1000})
        ${inScope}
      window z as (partition by r.zone_id order by r.at, r.sensor_id),
             s as (partition by r.sensor_id order by r.at)
    ), nexts as materialized (
      -- The last reading of a zone or sensor in the window: its next may lie far beyond (a gap).
      -- Materialized: inlined, each use of zone_next_ms / own_next_ms below copied its look-up
      -- (24 subplans, each over every partition; planning 650 ms against 86 ms).
      select src.*,
             round(date_part('epoch', coalesce(zone_next_at, (
               select x.at from readings x
               where x.zone_id = src.zone_id and x.at >= src.at
                 and (x.at, x.sensor_id) > (src.at, src.sensor_id)
               order by x.at, x.sensor_id limit 1))) * 1000) as zone_next_ms,
             round(date_part('epoch', coalesce(own_next_at, (
               select x.at from readings x
               where x.sensor_id = src.sensor_id and x.at > src.at
               order by x.at limit 1))) * 1000) as own_next_ms
      from src
      where src.at < ${to}::timestamptz
    ), timed as (
      select *,
             least(coalesce(zone_next_ms - at_ms, ${cap}::float8), ${cap}::float8) as zone_ms,
             least(coalesce(own_next_ms - at_ms, ${cap}::float8), ${cap}::float8) as own_ms,
             (rh_pct > ${TOW_RH_ABOVE_PCT}::float8 and air_c > ${TOW_AIR_ABOVE_C}::float8) as tow
      from nexts
    )
    insert into readings_hourly as h (
      shop_id, zone_id, sensor_id, hour, n, first_at_ms,
      air_min_c, air_max_c, air_sum_c, rh_min_pct, rh_max_pct, rh_sum_pct,
      surface_n, surface_min_c, surface_max_c, surface_sum_c,
      dew_point_n, dew_point_min_c, dew_point_max_c, dew_point_sum_c,
      margin_n, margin_min_k, margin_max_k, margin_sum_k, margin_min_at_ms,
      emc_n, emc_min_pct, emc_max_pct, emc_sum_pct, level,
      zone_covered_ms, zone_air_ms_c, zone_rh_ms_pct, zone_emc_ms_pct, zone_emc_ms,
      zone_dry_ms, zone_close_ms, zone_wet_ms, zone_tow_ms, zone_gaps,
      own_covered_ms, own_air_ms_c, own_rh_ms_pct, own_emc_ms_pct, own_emc_ms,
      own_dry_ms, own_close_ms, own_wet_ms, own_tow_ms, own_gaps, rolled_at)
    select shop_id, zone_id, sensor_id,
           date_bin('1 hour', at, timestamptz '2000-01-01T00:00:00Z'),
           count(*)::int, min(at_ms)::bigint,
           min(air_c), max(air_c), sum(air_c), min(rh_pct), max(rh_pct), sum(rh_pct),
           count(surface_c)::int, min(surface_c), max(surface_c), sum(surface_c),
           count(dew_point_c)::int, min(dew_point_c), max(dew_point_c), sum(dew_point_c),
           count(margin_k)::int, min(margin_k), max(margin_k), sum(margin_k),
           -- Arrays compare element by element: the lowest margin, then its earliest time.
           ((min(array[margin_k, at_ms]) filter (where margin_k is not null))[2])::bigint,
           count(emc_pct)::int, min(emc_pct), max(emc_pct), sum(emc_pct),
           (array['unknown', 'dry', 'close', 'wet']::level[])[
             max(case level when 'wet' then 4 when 'close' then 3 when 'dry' then 2 else 1 end)
           ],
           sum(zone_ms), sum(air_c * zone_ms), sum(rh_pct * zone_ms),
           coalesce(sum(emc_pct * zone_ms) filter (where emc_pct is not null), 0),
           coalesce(sum(zone_ms) filter (where emc_pct is not null), 0),
           coalesce(sum(zone_ms) filter (where level = 'dry'), 0),
           coalesce(sum(zone_ms) filter (where level = 'close'), 0),
           coalesce(sum(zone_ms) filter (where level = 'wet'), 0),
           coalesce(sum(zone_ms) filter (where tow), 0),
           jsonb_agg(jsonb_build_object('f', at_ms + ${cap}::float8, 't', zone_next_ms)
             order by at_ms)
             filter (where zone_next_ms is null or zone_next_ms - at_ms > ${cap}::float8),
           sum(own_ms), sum(air_c * own_ms), sum(rh_pct * own_ms),
           coalesce(sum(emc_pct * own_ms) filter (where emc_pct is not null), 0),
           coalesce(sum(own_ms) filter (where emc_pct is not null), 0),
           coalesce(sum(own_ms) filter (where level = 'dry'), 0),
           coalesce(sum(own_ms) filter (where level = 'close'), 0),
           coalesce(sum(own_ms) filter (where level = 'wet'), 0),
           coalesce(sum(own_ms) filter (where tow), 0),
           jsonb_agg(jsonb_build_object('f', at_ms + ${cap}::float8, 't', own_next_ms)
             order by at_ms)
             filter (where own_next_ms is null or own_next_ms - at_ms > ${cap}::float8),
           now()
    from timed
    group by 1, 2, 3, 4
    on conflict (shop_id, zone_id, sensor_id, hour) do update set
      n = excluded.n, first_at_ms = excluded.first_at_ms,
      air_min_c = excluded.air_min_c, air_max_c = excluded.air_max_c,
      air_sum_c = excluded.air_sum_c, rh_min_pct = excluded.rh_min_pct,
      rh_max_pct = excluded.rh_max_pct, rh_sum_pct = excluded.rh_sum_pct,
      surface_n = excluded.surface_n, surface_min_c = excluded.surface_min_c,
      surface_max_c = excluded.surface_max_c, surface_sum_c = excluded.surface_sum_c,
      dew_point_n = excluded.dew_point_n, dew_point_min_c = excluded.dew_point_min_c,
      dew_point_max_c = excluded.dew_point_max_c, dew_point_sum_c = excluded.dew_point_sum_c,
      margin_n = excluded.margin_n, margin_min_k = excluded.margin_min_k,
      margin_max_k = excluded.margin_max_k, margin_sum_k = excluded.margin_sum_k,
      margin_min_at_ms = excluded.margin_min_at_ms,
      emc_n = excluded.emc_n, emc_min_pct = excluded.emc_min_pct,
      emc_max_pct = excluded.emc_max_pct, emc_sum_pct = excluded.emc_sum_pct,
      level = excluded.level,
      zone_covered_ms = excluded.zone_covered_ms, zone_air_ms_c = excluded.zone_air_ms_c,
      zone_rh_ms_pct = excluded.zone_rh_ms_pct, zone_emc_ms_pct = excluded.zone_emc_ms_pct,
      zone_emc_ms = excluded.zone_emc_ms, zone_dry_ms = excluded.zone_dry_ms,
      zone_close_ms = excluded.zone_close_ms, zone_wet_ms = excluded.zone_wet_ms,
      zone_tow_ms = excluded.zone_tow_ms, zone_gaps = excluded.zone_gaps,
      own_covered_ms = excluded.own_covered_ms, own_air_ms_c = excluded.own_air_ms_c,
      own_rh_ms_pct = excluded.own_rh_ms_pct, own_emc_ms_pct = excluded.own_emc_ms_pct,
      own_emc_ms = excluded.own_emc_ms, own_dry_ms = excluded.own_dry_ms,
      own_close_ms = excluded.own_close_ms, own_wet_ms = excluded.own_wet_ms,
      own_tow_ms = excluded.own_tow_ms, own_gaps = excluded.own_gaps,
      rolled_at = excluded.rolled_at`);
  return result.rowCount ?? 0;
}

/** Zones whose roll-ups a statement recomputes (db/queries/readingRollups.ts rollUpHours). */
export interface RollupScope {
  zoneIds: readonly string[];
}

/**
 * rollUpHours over a range of any length, a day per statement (each well inside the server's
 * statement timeout): the bench's backfill, or (scoped) a zone's months. Returns rows written.
 */
export async function rollUpRange(
  db: Db,
  from: Date,
  to: Date,
  scope?: RollupScope,
): Promise<number> {
  let rows = 0;
  for (const run of dayRuns(from.getTime(), to.getTime())) {
    rows += await rollUpHours(db, new Date(run.fromMs), new Date(run.toMs), scope);
  }
  return rows;
}

/** [from, to) widened to whole hours, as runs of at most `hours` (a day). */
function dayRuns(
  fromMs: number,
  toMs: number,
  hours = DAY_HOURS,
): { fromMs: number; toMs: number }[] {
  const runs: { fromMs: number; toMs: number }[] = [];
  const endMs = ceilHourMs(toMs);
  for (let h = floorHourMs(fromMs); h < endMs; h += hours * HOUR_MS) {
    runs.push({ fromMs: h, toMs: Math.min(h + hours * HOUR_MS, endMs) });
  }
  return runs;
}

/**
 * One zone's roll-up statement covers a week: a zone of three sensors posting every minute is
 * 30,000 readings, a second or so, far inside the 10 s statement timeout; a year is then 53
 * statements, where a day each made 365, each paying ~90 ms of planning over the month
 * partitions (measured with 50).
 */
const SPAN_CHUNK_HOURS = 7 * 24;

/** What a bulk write (a CSV import) stored: one sensor's readings in [from, to]. */
export interface StoredSpan {
  zoneId: string;
  sensorId: string;
  from: Date;
  to: Date;
}

/**
 * The roll-ups a bulk write changed, scoped to its zone and in week-long statements: the hours
 * from a gap cap before its first reading (a reading just before now stands only until it) to
 * its last, and the hours of the zone's and the sensor's last readings before it (a gap that
 * ran past the cap now ends at the first new reading). The same hours the roll-up job's
 * hoursTouchedSince finds, for one zone (and the sensor's previous reading's zone, should it
 * have moved). Each statement reads at most a week (and a cap) of one zone's readings, so a year
 * of a logger's history is 53 small statements, none near the statement timeout. The roll-up job
 * still finds these readings by their arrival within 5 minutes and re-rolls their hours
 * unscoped: what a moved sensor's other readings in the range change is caught there. Returns
 * the rows written.
 */
export async function rollUpStoredSpan(db: Db, span: StoredSpan): Promise<number> {
  const prev = await db.execute<{
    zone_prev: Date | string | null;
    own_prev: Date | string | null;
    own_prev_zone: string | null;
  }>(
    sql`select
      (select max(at) from readings where zone_id = ${span.zoneId} and at < ${span.from}) as zone_prev,
      o.at as own_prev, o.zone_id as own_prev_zone
    from (select 1) one
    left join lateral (select at, zone_id from readings
                       where sensor_id = ${span.sensorId} and at < ${span.from}
                       order by at desc limit 1) o on true`,
  );
  const p = prev.rows[0];
  const fromMs = floorHourMs(span.from.getTime() - TOW_MAX_GAP_MS);
  const runs: { fromMs: number; toMs: number; zoneId: string }[] = [];
  const earlier = (at: Date | string | null | undefined, zoneId: string | null | undefined) => {
    if (!at || !zoneId) return;
    const h = floorHourMs(new Date(at).getTime());
    // A sensor moved since keeps its earlier reading's roll-up in that reading's zone.
    if (h < fromMs || zoneId !== span.zoneId) runs.push({ fromMs: h, toMs: h + HOUR_MS, zoneId });
  };
  earlier(p?.zone_prev, span.zoneId);
  earlier(p?.own_prev, p?.own_prev_zone);
  for (const run of dayRuns(fromMs, span.to.getTime() + 1, SPAN_CHUNK_HOURS)) {
    runs.push({ ...run, zoneId: span.zoneId });
  }
  let rows = 0;
  // In time order and without repeats: both earlier readings may share an hour.
  const seen = new Set<string>();
  for (const run of runs.sort((a, b) => a.fromMs - b.fromMs)) {
    const key = `${run.zoneId}|${run.fromMs}`;
    if (seen.has(key)) continue;
    seen.add(key);
    const scope = { zoneIds: [run.zoneId] };
    rows += await rollUpHours(db, new Date(run.fromMs), new Date(run.toMs), scope);
  }
  return rows;
}

const DAY_HOURS = 24;

export interface RollupMark {
  rolledUntil: Date;
  receivedThrough: Date;
}

/** The job's mark, or null before its first run (nothing rolled up yet). */
export async function readRollupMark(db: Db): Promise<RollupMark | null> {
  const result = await db.execute<{ rolled_until: Date | string; received_through: Date | string }>(
    sql`select rolled_until, received_through from reading_rollup_mark where id = 1`,
  );
  const r = result.rows[0];
  return r
    ? { rolledUntil: new Date(r.rolled_until), receivedThrough: new Date(r.received_through) }
    : null;
}

export async function writeRollupMark(db: Db, mark: RollupMark): Promise<void> {
  await db.execute(sql`
    insert into reading_rollup_mark (id, rolled_until, received_through)
    values (1, ${mark.rolledUntil}, ${mark.receivedThrough})
    on conflict (id) do update set rolled_until = excluded.rolled_until,
      received_through = excluded.received_through`);
}

/** Hours before the mark are rolled up; null when none are (the readers then read raw). */
export async function rolledUntil(db: Db): Promise<Date | null> {
  return (await readRollupMark(db))?.rolledUntil ?? null;
}

/** The oldest and newest stored reading, or null without any: the backfill's range. */
export async function readingSpan(db: Db): Promise<{ from: Date; to: Date } | null> {
  const result = await db.execute<{ lo: Date | string | null; hi: Date | string | null }>(
    sql`select min(at) as lo, max(at) as hi from readings`,
  );
  const r = result.rows[0];
  return r?.lo && r.hi ? { from: new Date(r.lo), to: new Date(r.hi) } : null;
}

/**
 * The UTC hours (ms) that readings received at or after `since` change, before `beforeHour`:
 * each reading's own hour, the hour a cap earlier (a reading just before it now stands only
 * until it), and the hours of the zone's and the sensor's previous readings before the earliest
 * new one of each hour (a gap before it now ends there; later new readings of the hour follow a
 * reading of an hour re-rolled anyway). Received-at is read through its BRIN index (see
 * db/schema/sensing.ts); the previous readings through the (zone_id, at) index and the primary
 * key, one probe per zone-hour and sensor-hour, so a CSV import of months costs thousands of
 * probes, not millions.
 */
export async function hoursTouchedSince(db: Db, since: Date, beforeHour: Date): Promise<number[]> {
  const hourOf = (col: SQL) => sql`date_bin('1 hour', ${col}, timestamptz '2000-01-01T00:00:00Z')`;
  const result = await db.execute<{ hour_ms: number | string }>(sql`
    with fresh as (
      select zone_id, sensor_id, at from readings where received_at >= ${since}::timestamptz
    ), zone_hours as (
      select distinct on (zone_id, ${hourOf(sql`at`)}) zone_id, sensor_id, at
      from fresh order by zone_id, ${hourOf(sql`at`)}, at, sensor_id
    ), sensor_hours as (
      select sensor_id, min(at) as at from fresh group by sensor_id, ${hourOf(sql`at`)}
    ), touched as (
      select at from sensor_hours
      union all
      select at - make_interval(secs => ${TOW_MAX_GAP_MS / 1000}) from sensor_hours
      union all
      select (select x.at from readings x
              where x.zone_id = f.zone_id and x.at <= f.at
                and (x.at, x.sensor_id) < (f.at, f.sensor_id)
              order by x.at desc, x.sensor_id desc limit 1) from zone_hours f
      union all
      select (select x.at from readings x where x.sensor_id = f.sensor_id and x.at < f.at
              order by x.at desc limit 1) from sensor_hours f
    )
    select distinct round(date_part('epoch', ${hourOf(sql`at`)}) * 1000) as hour_ms
    from touched
    where at is not null and at < ${beforeHour}::timestamptz
    order by 1`);
  return result.rows.map((r) => Number(r.hour_ms));
}

/** Ids as a list of uuid literals, for `array[…]` and `in (…)`. */
export const uuidList = (ids: readonly string[]) =>
  sql.join(
    ids.map((id) => sql`${id}::uuid`),
    sql`, `,
  );

/**
 * Runs of consecutive hours as [from, to) ranges, none longer than `maxHours`: one roll-up
 * statement per run, each well inside the statement timeout.
 */
export function hourRuns(
  hoursMs: readonly number[],
  maxHours = 24,
): { fromMs: number; toMs: number }[] {
  const runs: { fromMs: number; toMs: number }[] = [];
  for (const h of [...hoursMs].sort((a, b) => a - b)) {
    const last = runs[runs.length - 1];
    if (last && h < last.toMs) continue;
    if (last && h === last.toMs && last.toMs - last.fromMs < maxHours * HOUR_MS) {
      last.toMs = h + HOUR_MS;
    } else runs.push({ fromMs: h, toMs: h + HOUR_MS });
  }
  return runs;
}

/**
 * The whole hours of [from, to) that a long-range reader takes from the roll-ups: from the first
 * whole hour to the last whole hour ending `edgeMs` or more before `to` that the job has rolled;
 * null when there is none (a range of 7 days or less, or a job that has not run yet) and the
 * reader reads raw readings only.
 */
export function rolledHours(
  from: Date,
  to: Date,
  mark: Date | null,
  options: { edgeMs?: number } = {},
): { h1: Date; h2: Date } | null {
  if (!mark || to.getTime() - from.getTime() <= ROLLUP_RANGE_MS) return null;
  const h1 = ceilHourMs(from.getTime());
  const h2 = Math.min(floorHourMs(to.getTime() - (options.edgeMs ?? 0)), mark.getTime());
  return h2 > h1 ? { h1: new Date(h1), h2: new Date(h2) } : null;
}

/** A chart point as SQL returns it (a reading or a bucket), as readings.ts querySeries maps it. */
export interface SeriesSqlRow extends Record<string, unknown> {
  at: Date | string;
  air_c: number | string;
  rh_pct: number | string;
  surface_c: number | string | null;
  dew_point_c: number | string | null;
  margin_k: number | string | null;
  margin_min: number | string | null;
  margin_max: number | string | null;
  emc_pct: number | string | null;
  level: Level;
  n: number;
}

/**
 * A zone's chart buckets over [from, to] from the roll-ups of the hours [h1, h2) and the raw
 * readings at the edges, in one statement. The plan's buckets are whole hours from a whole hour
 * (server/readings/bucketPlan.ts), so every rolled hour falls in exactly one bucket; the means
 * are sums over counts, exactly the raw avg() but for the order of the float additions.
 */
export async function seriesFromRollups(
  db: Db,
  q: {
    zoneId: string;
    from: Date;
    to: Date;
    hours: { h1: Date; h2: Date };
    plan: { bucketSeconds: number; originMs: number };
  },
): Promise<SeriesSqlRow[]> {
  const width = sql`make_interval(secs => ${q.plan.bucketSeconds})`;
  const origin = sql`${new Date(q.plan.originMs)}::timestamptz`;
  const raw = (lo: SQL, hi: SQL) => sql`
    select date_bin(${width}, at, ${origin}) as b, 1 as n, air_c as air_s, rh_pct as rh_s,
           (surface_c is not null)::int as surface_n, surface_c as surface_s,
           (dew_point_c is not null)::int as dew_n, dew_point_c as dew_s,
           (margin_k is not null)::int as margin_n, margin_k as margin_s,
           margin_k as margin_min, margin_k as margin_max,
           (emc_pct is not null)::int as emc_n, emc_pct as emc_s, level
    from readings where zone_id = ${q.zoneId} and ${lo} and ${hi}`;
  const result = await db.execute<SeriesSqlRow>(sql`
    select b as at, sum(air_s) / sum(n) as air_c, sum(rh_s) / sum(n) as rh_pct,
           sum(surface_s) / nullif(sum(surface_n), 0) as surface_c,
           sum(dew_s) / nullif(sum(dew_n), 0) as dew_point_c,
           sum(margin_s) / nullif(sum(margin_n), 0) as margin_k,
           min(margin_min) as margin_min, max(margin_max) as margin_max,
           sum(emc_s) / nullif(sum(emc_n), 0) as emc_pct,
           sum(n)::int as n,
           (array['unknown', 'dry', 'close', 'wet']::level[])[
             max(case level when 'wet' then 4 when 'close' then 3 when 'dry' then 2 else 1 end)
           ] as level
    from (
      select date_bin(${width}, hour, ${origin}) as b, n, air_sum_c as air_s,
             rh_sum_pct as rh_s, surface_n, surface_sum_c as surface_s,
             dew_point_n as dew_n, dew_point_sum_c as dew_s, margin_n, margin_sum_k as margin_s,
             margin_min_k as margin_min, margin_max_k as margin_max,
             emc_n, emc_sum_pct as emc_s, level
      from readings_hourly
      where shop_id = (select shop_id from zones where id = ${q.zoneId})
        and zone_id = ${q.zoneId} and hour >= ${q.hours.h1} and hour < ${q.hours.h2}
      union all
      ${raw(sql`at >= ${q.from}`, sql`at < ${q.hours.h1}`)}
      union all
      ${raw(sql`at >= ${q.hours.h2}`, sql`at <= ${q.to}`)}
    ) p
    group by 1
    order by 1`);
  return result.rows;
}

/** When a zone's first reading was taken by its roll-ups (raw readings may be gone), or null. */
export async function firstRolledAt(db: Db, zoneId: string): Promise<Date | null> {
  const result = await db.execute<{ ms: number | string | null }>(sql`
    select min(first_at_ms) as ms from readings_hourly
    where shop_id = (select shop_id from zones where id = ${zoneId}) and zone_id = ${zoneId}
      and hour = (select min(hour) from readings_hourly
                  where shop_id = (select shop_id from zones where id = ${zoneId})
                    and zone_id = ${zoneId})`);
  const ms = result.rows[0]?.ms;
  return ms === null || ms === undefined ? null : new Date(Number(ms));
}

/**
 * The week report's per-zone aggregate (db/queries/reports.ts zoneWeekFigures, same columns and
 * the same rule) over [from, end) with the hours [h1, h2) taken from the roll-ups and the edges
 * from raw readings. h2 is at most end − cap, so every rolled reading's share (which runs to its
 * next reading, capped) is what the raw rule gives it too; the head's last reading looks up the
 * zone's (or sensor's) first reading at or after h1, as the raw window would see it. Sums are
 * then equal to the raw ones but for the order of the float additions; a gap's end, kept as the
 * next reading known when its hour was rolled, is cut at `end` as the raw rule cuts it.
 */
export async function figuresFromRollups(
  db: Db,
  zoneIds: readonly string[],
  period: ReportPeriod,
  hours: { h1: Date; h2: Date },
): Promise<FigureSqlRow[]> {
  const from = new Date(period.fromMs);
  const end = new Date(period.endMs);
  const cap = period.maxGapMs;
  const ids = uuidList(zoneIds);
  const own = period.sensorId !== undefined;
  const bySensor = (alias: string) =>
    own ? sql`and ${sql.raw(alias)}.sensor_id = ${period.sensorId}::uuid` : sql``;
  const cols = sql`at, sensor_id, air_c, rh_pct, margin_k, emc_pct, level`;
  // One reading as a part: its share until `until_ms`, capped, and its gap past the cap.
  const readingPart = sql`
    select 1 as n, ms, air_c as air_min, air_c as air_max, air_c * ms as air_ms,
           rh_pct as rh_min, rh_pct as rh_max, rh_pct * ms as rh_ms,
           emc_pct as emc_min, emc_pct as emc_max,
           coalesce(emc_pct * ms, 0) as emc_msv, case when emc_pct is null then 0 else ms end as emc_ms,
           case when level = 'dry' then ms else 0 end as dry_ms,
           case when level = 'close' then ms else 0 end as close_ms,
           case when level = 'wet' then ms else 0 end as wet_ms,
           case when rh_pct > ${TOW_RH_ABOVE_PCT}::float8 and air_c > ${TOW_AIR_ABOVE_C}::float8
             then ms else 0 end as tow_ms,
           at_ms as first_at, margin_k as margin_min, at_ms as margin_min_at,
           case when until_ms - at_ms > ${cap}::float8 then
             jsonb_build_array(jsonb_build_object('f', at_ms + ${cap}::float8, 't', until_ms))
           end as gaps`;
  const timed = (rows: SQL) => sql`
    select *, least(until_ms - at_ms, ${cap}::float8) as ms from (
      select *, round(date_part('epoch', at) * 1000) as at_ms,
             round(date_part('epoch', coalesce(lead(at) over w, ${end}::timestamptz)) * 1000)
               as until_ms
      from (${rows}) u
      window w as (order by at, sensor_id)
    ) t`;
  const p = own ? 'own' : 'zone';
  const c = (name: string) => sql.raw(`${p}_${name}`);
  const result = await db.execute<FigureSqlRow>(sql`
    select z.id as zone_id, f.*
    from unnest(array[${ids}]) as z(id)
    cross join lateral (
      with parts as (
        ${readingPart} from (${timed(sql`
          select ${cols} from readings r
          where r.zone_id = z.id and r.at >= ${from}::timestamptz
            and r.at < ${hours.h1}::timestamptz ${bySensor('r')}
          union all
          (select ${cols} from readings r
           where r.zone_id = z.id and r.at >= ${hours.h1}::timestamptz
             and r.at < ${end}::timestamptz ${bySensor('r')}
           order by at, sensor_id limit 1)`)}) head
        where head.at < ${hours.h1}::timestamptz
        union all
        ${readingPart} from (${timed(sql`
          select ${cols} from readings r
          where r.zone_id = z.id and r.at >= ${hours.h2}::timestamptz
            and r.at < ${end}::timestamptz ${bySensor('r')}`)}) tail
        union all
        select n, ${c('covered_ms')}, air_min_c, air_max_c, ${c('air_ms_c')},
               rh_min_pct, rh_max_pct, ${c('rh_ms_pct')}, emc_min_pct, emc_max_pct,
               ${c('emc_ms_pct')}, ${c('emc_ms')}, ${c('dry_ms')}, ${c('close_ms')},
               ${c('wet_ms')}, ${c('tow_ms')}, first_at_ms, margin_min_k, margin_min_at_ms,
               ${c('gaps')}
        from readings_hourly h
        where h.shop_id = (select shop_id from zones where id = z.id) and h.zone_id = z.id
          and h.hour >= ${hours.h1}::timestamptz and h.hour < ${hours.h2}::timestamptz
          ${bySensor('h')}
      )
      select sum(n)::int as n, sum(ms) as covered_ms,
             min(air_min) as air_min, sum(air_ms) / nullif(sum(ms), 0) as air_mean,
             max(air_max) as air_max,
             min(rh_min) as rh_min, sum(rh_ms) / nullif(sum(ms), 0) as rh_mean,
             max(rh_max) as rh_max,
             min(emc_min) as emc_min, sum(emc_msv) / nullif(sum(emc_ms), 0) as emc_mean,
             max(emc_max) as emc_max,
             coalesce(sum(dry_ms), 0) as dry_ms, coalesce(sum(close_ms), 0) as close_ms,
             coalesce(sum(wet_ms), 0) as wet_ms, coalesce(sum(tow_ms), 0) as tow_ms,
             min(first_at) as first_at_ms,
             min(array[margin_min, margin_min_at::float8]) filter (where margin_min is not null)
               as low,
             (select json_agg(json_build_object('f', g.f, 't', g.t) order by g.f)
              from (select (e->>'f')::float8 as f,
                           least(coalesce((e->>'t')::float8, ${period.endMs}::float8),
                                 ${period.endMs}::float8) as t
                    from parts, jsonb_array_elements(parts.gaps) e) g
              where g.t > g.f) as silent
      from parts
    ) f
    where f.n > 0`);
  return result.rows;
}
