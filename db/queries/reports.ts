/**
 * The week report's figures, aggregated in PostgreSQL: a week of one-minute data is ~10,000
 * readings per zone, so the rows never travel to JavaScript. The rule is the one written in
 * ingest/reportWeek.ts (weekFiguresFromReadings), which a test holds this file to:
 * readings of a zone merged in (at, sensor_id) order, each standing until the zone's next
 * reading or the period end, capped at `maxGapMs`; time beyond the cap is a gap.
 */
import { sql } from 'drizzle-orm';

import type { AlarmKind } from '@/ingest/alarmKinds';
import type { WeekFigures } from '@/ingest/reportWeek';
import { TOW_AIR_ABOVE_C, TOW_MAX_GAP_MS, TOW_RH_ABOVE_PCT } from '@/ingest/wetness';
import type { PaperSize } from '@/ingest/wire/reports';
import type { ZonePurpose } from '@/ingest/wire/zones';

import type { Db } from '../index';
import {
  figuresFromRollups,
  ROLLUP_RANGE_MS,
  rolledHours,
  rolledUntil,
  uuidList,
} from './readingRollups';

export interface ReportPeriod {
  fromMs: number;
  endMs: number;
  maxGapMs: number;
  /**
   * Only this sensor's readings (a probe on one surface, for the care log's exposure); without
   * it, the whole zone's, as the week report reads them.
   */
  sensorId?: string;
}

export interface ReportZoneRow {
  id: string;
  name: string;
  purpose: ZonePurpose;
}

export interface ReportShopRow {
  id: string;
  name: string;
  timeZone: string;
  paperSize: PaperSize;
}

/** The shop as the report names it: its time zone sets the week, its paper size the PDF. */
export async function reportShop(db: Db, shopId: string): Promise<ReportShopRow | null> {
  const result = await db.execute<{
    id: string;
    name: string;
    time_zone: string;
    paper_size: ReportShopRow['paperSize'];
  }>(sql`select id, name, time_zone, paper_size from shops where id = ${shopId}`);
  const r = result.rows[0];
  return r ? { id: r.id, name: r.name, timeZone: r.time_zone, paperSize: r.paper_size } : null;
}

/** The shop's zones, oldest first (the order the app lists them when nothing is at risk). */
export async function reportZones(db: Db, shopId: string): Promise<ReportZoneRow[]> {
  const result = await db.execute<{ id: string; name: string; purpose: ReportZoneRow['purpose'] }>(
    sql`select id, name, purpose from zones where shop_id = ${shopId} order by created_at, id`,
  );
  return result.rows.map((r) => ({ id: r.id, name: r.name, purpose: r.purpose }));
}

type Num = number | string | null;
const num = (v: Num) => (v === null ? null : Number(v));
const num0 = (v: Num) => (v === null ? 0 : Number(v));

export interface FigureSqlRow extends Record<string, unknown> {
  zone_id: string;
  n: number;
  covered_ms: Num;
  air_min: Num;
  air_mean: Num;
  air_max: Num;
  rh_min: Num;
  rh_mean: Num;
  rh_max: Num;
  emc_min: Num;
  emc_mean: Num;
  emc_max: Num;
  dry_ms: Num;
  close_ms: Num;
  wet_ms: Num;
  tow_ms: Num;
  first_at_ms: Num;
  /** [margin K, at ms] */
  low: Num[] | null;
  silent: { f: number; t: number }[] | null;
}

/**
 * Week figures for each zone, keyed by zone id; a zone without readings is absent (the caller
 * fills in its empty figures). One statement over the (zone_id, at) index.
 */
export async function zoneWeekFigures(
  db: Db,
  zoneIds: readonly string[],
  period: ReportPeriod,
): Promise<Map<string, Omit<WeekFigures, 'periodMs' | 'annualWetHours'>>> {
  if (zoneIds.length === 0) return new Map();
  // Over 7 days, the whole hours the roll-up job has done come from readings_hourly; the last
  // cap before `end` stays raw, so the rolled readings' shares are the raw rule's. Roll-ups
  // carry shares capped at TOW_MAX_GAP_MS: another cap reads raw.
  // The mark is asked for only when the range could use it (over 7 days): a week report's
  // statements then start without a round trip first.
  const hours =
    period.maxGapMs === TOW_MAX_GAP_MS && period.endMs - period.fromMs > ROLLUP_RANGE_MS
      ? rolledHours(new Date(period.fromMs), new Date(period.endMs), await rolledUntil(db), {
          edgeMs: period.maxGapMs,
        })
      : null;
  const rows = hours
    ? await figuresFromRollups(db, zoneIds, period, hours)
    : await rawFigures(db, zoneIds, period);
  return toFigures(rows, period);
}

/** The figures from raw readings only: the rule itself, for any range. */
async function rawFigures(db: Db, zoneIds: readonly string[], period: ReportPeriod) {
  const from = new Date(period.fromMs);
  const end = new Date(period.endMs);
  const cap = period.maxGapMs;
  const ids = uuidList(zoneIds);
  // Zone by zone through the (zone_id, at) index (a lateral per zone): each zone's ~10,000 rows
  // of a week sort in memory for the window, instead of the shop's 100,000 spilling to disk. If
  // the index INCLUDEs sensor_id and the value columns, the scan is index-only and already in
  // time order, so only ties get sorted (measured here: 10 zones' week 166 → 79 ms of CPU).
  // Times are whole milliseconds (readings are stored from JavaScript dates), so the rounded
  // float epoch is exact and the interval sums match the JavaScript reference.
  const result = await db.execute<FigureSqlRow>(sql`
    select z.id as zone_id, f.*
    from unnest(array[${ids}]) as z(id)
    cross join lateral (
      select count(*)::int as n, sum(ms) as covered_ms,
             min(air_c) as air_min, sum(air_c * ms) / nullif(sum(ms), 0) as air_mean,
             max(air_c) as air_max,
             min(rh_pct) as rh_min, sum(rh_pct * ms) / nullif(sum(ms), 0) as rh_mean,
             max(rh_pct) as rh_max,
             min(emc_pct) as emc_min,
             sum(emc_pct * ms) filter (where emc_pct is not null)
               / nullif(sum(ms) filter (where emc_pct is not null), 0) as emc_mean,
             max(emc_pct) as emc_max,
             coalesce(sum(ms) filter (where level = 'dry'), 0) as dry_ms,
             coalesce(sum(ms) filter (where level = 'close'), 0) as close_ms,
             coalesce(sum(ms) filter (where level = 'wet'), 0) as wet_ms,
             -- ISO 9223 time of wetness: both limits strict (ingest/wetness.ts isWetIso9223).
             coalesce(sum(ms) filter (
               where rh_pct > ${TOW_RH_ABOVE_PCT}::float8 and air_c > ${TOW_AIR_ABOVE_C}::float8
             ), 0) as tow_ms,
             min(at_ms) as first_at_ms,
             -- The lowest margin and the earliest time it was seen: arrays compare element by
             -- element, so one pass finds both (no second scan, no window over the whole zone).
             min(array[margin_k, at_ms]) filter (where margin_k is not null) as low,
             json_agg(json_build_object('f', at_ms + ${cap}::float8, 't', until_ms) order by at_ms)
               filter (where until_ms - at_ms > ${cap}::float8) as silent
      from (
        select *, least(until_ms - at_ms, ${cap}::float8) as ms
        from (
          select air_c, rh_pct, margin_k, emc_pct, level,
                 round(date_part('epoch', at) * 1000) as at_ms,
                 round(date_part('epoch', coalesce(lead(at) over w, ${end}::timestamptz)) * 1000)
                   as until_ms
          from readings
          where zone_id = z.id and at >= ${from}::timestamptz and at < ${end}::timestamptz
            ${period.sensorId ? sql`and sensor_id = ${period.sensorId}::uuid` : sql``}
          window w as (order by at, sensor_id)
        ) r
      ) w
    ) f
    where f.n > 0`);
  return result.rows;
}

function toFigures(rows: FigureSqlRow[], period: ReportPeriod) {
  const cap = period.maxGapMs;
  const periodMs = period.endMs - period.fromMs;
  const figures = new Map<string, Omit<WeekFigures, 'periodMs' | 'annualWetHours'>>();
  for (const r of rows) {
    const coveredMs = num0(r.covered_ms);
    const dry = num0(r.dry_ms);
    const close = num0(r.close_ms);
    const wet = num0(r.wet_ms);
    const firstAtMs = num0(r.first_at_ms);
    const silentPeriods = (r.silent ?? []).map((p) => ({ fromMs: p.f, toMs: p.t }));
    if (firstAtMs - period.fromMs > cap) {
      silentPeriods.unshift({ fromMs: period.fromMs, toMs: firstAtMs });
    }
    figures.set(r.zone_id, {
      readings: r.n,
      coveredMs,
      airC: { min: num(r.air_min), mean: num(r.air_mean), max: num(r.air_max) },
      rhPct: { min: num(r.rh_min), mean: num(r.rh_mean), max: num(r.rh_max) },
      emcPct: { min: num(r.emc_min), mean: num(r.emc_mean), max: num(r.emc_max) },
      lowestMargin: r.low ? { marginK: Number(r.low[0]), atMs: Number(r.low[1]) } : null,
      levelMs: { dry, close, wet, unknown: periodMs - dry - close - wet },
      wetnessMs: num0(r.tow_ms),
      silentPeriods,
    });
  }
  return figures;
}

export interface AlarmWeekRow {
  zoneId: string;
  openedByKind: Partial<Record<AlarmKind, number>>;
  opened: number;
  acknowledged: number;
  medianAckMinutes: number | null;
  longestAckMinutes: number | null;
  unacknowledged: number;
}

/**
 * Alarms of the shop opened in [from, end), per zone, and how fast they were acknowledged (up
 * to `now`). Minutes to acknowledge run from the opening (the reading's time) to the ack; an
 * ack can't come before its alarm's reading, but a backlog's readings can, so it is floored at 0.
 * The last row, zoneId null, is the whole shop (its median is over all its alarms).
 */
export async function alarmWeekFigures(
  db: Db,
  shopId: string,
  period: { fromMs: number; endMs: number; nowMs: number },
): Promise<{ zones: AlarmWeekRow[]; shop: AlarmWeekRow }> {
  const result = await db.execute<{
    zone_id: string | null;
    by_kind: Record<string, number> | null;
    opened: number;
    acknowledged: number;
    median_min: Num;
    longest_min: Num;
    unacknowledged: number;
  }>(sql`
    with a as (
      select zone_id, kind,
             case when acknowledged_at <= ${new Date(period.nowMs)}::timestamptz
               then greatest(0, extract(epoch from acknowledged_at - opened_at) / 60)::float8
             end as ack_min
      from alarms
      where shop_id = ${shopId}
        and opened_at >= ${new Date(period.fromMs)}::timestamptz
        and opened_at < ${new Date(period.endMs)}::timestamptz
    ), k as (
      select zone_id, kind, count(*)::int as n from a group by grouping sets ((zone_id, kind), (kind))
    )
    select g.zone_id,
           (select json_object_agg(k.kind, k.n) from k
             where k.zone_id is not distinct from g.zone_id) as by_kind,
           g.opened, g.acknowledged, g.median_min, g.longest_min, g.unacknowledged
    from (
      select zone_id, count(*)::int as opened, count(ack_min)::int as acknowledged,
             percentile_cont(0.5) within group (order by ack_min) as median_min,
             max(ack_min) as longest_min,
             (count(*) - count(ack_min))::int as unacknowledged
      from a group by grouping sets ((zone_id), ())
    ) g`);
  const toRow = (r: (typeof result.rows)[number]): AlarmWeekRow => ({
    zoneId: r.zone_id ?? '',
    openedByKind: (r.by_kind ?? {}) as Partial<Record<AlarmKind, number>>,
    opened: r.opened,
    acknowledged: r.acknowledged,
    medianAckMinutes: num(r.median_min),
    longestAckMinutes: num(r.longest_min),
    unacknowledged: r.unacknowledged,
  });
  const shopRow = result.rows.find((r) => r.zone_id === null);
  return {
    zones: result.rows.filter((r) => r.zone_id !== null).map(toRow),
    shop: shopRow
      ? toRow(shopRow)
      : {
          zoneId: '',
          openedByKind: {},
          opened: 0,
          acknowledged: 0,
          medianAckMinutes: null,
          longestAckMinutes: null,
          unacknowledged: 0,
        },
  };
}
