import { sql } from 'drizzle-orm';

import type { Level } from '@/ingest';

import type { Db } from '../index';
import { readings, sensors } from '../schema';

export interface ReadingRow {
  sensorId: string;
  shopId: string;
  zoneId: string;
  at: Date;
  airC: number;
  rhPct: number;
  surfaceC: number | null;
  surfaceSource: 'probe' | 'estimate' | null;
  batteryV: number | null;
  dewPointC: number | null;
  marginK: number | null;
  emcPct: number | null;
  level: Level;
}

/** The channel every server instance LISTENs on for live fan-out. */
export const LIVE_CHANNEL = 'drybench_live';

/**
 * Stores readings once (the (sensor, at) key makes retries harmless), updates the sensor's
 * last-seen and battery, and queues a live notification — all in one transaction, so
 * PostgreSQL delivers the notification only if the rows committed.
 * Returns the `at` of the rows actually inserted.
 */
export async function storeReadings(
  db: Db,
  rows: ReadingRow[],
  livePayload: (inserted: ReadingRow[]) => string | null,
): Promise<Set<number>> {
  if (rows.length === 0) return new Set();
  return db.transaction(async (tx) => {
    const inserted = await tx
      .insert(readings)
      .values(rows)
      .onConflictDoNothing({ target: [readings.sensorId, readings.at] })
      .returning({ at: readings.at });
    const insertedMs = new Set(inserted.map((r) => r.at.getTime()));
    const first = rows[0]!;
    const newest = rows.reduce((a, b) => (b.at > a.at ? b : a));
    await tx.execute(sql`
      update ${sensors}
      set last_seen_at = greatest(coalesce(last_seen_at, ${newest.at}), ${newest.at}),
          battery_v = coalesce(${newest.batteryV}, battery_v)
      where id = ${first.sensorId}`);
    const payload = livePayload(rows.filter((r) => insertedMs.has(r.at.getTime())));
    if (payload) await tx.execute(sql`select pg_notify(${LIVE_CHANNEL}, ${payload})`);
    return insertedMs;
  });
}

export interface SeriesPoint {
  at: string;
  air: number;
  rh: number;
  surface: number | null;
  dewPoint: number | null;
  margin: number | null;
  marginMin: number | null;
  emc: number | null;
  level: Level;
  count: number;
}

/**
 * A zone's series between two times: raw readings when they fit in `points`, else buckets
 * of equal width (date_bin) that average the values but keep each bucket's lowest margin,
 * because the closest approach to the dew point is what a chart must never smooth away.
 * The bucket's level is the level of that lowest margin, decided by the caller's limits.
 */
export async function querySeries(
  db: Db,
  q: {
    zoneId: string;
    from: Date;
    to: Date;
    points: number;
    levelOf: (marginK: number | null) => Level;
  },
): Promise<{ bucketSeconds: number; points: SeriesPoint[] }> {
  const countResult = await db.execute<{ n: number }>(sql`
    select count(*)::int as n from readings
    where zone_id = ${q.zoneId} and at >= ${q.from} and at <= ${q.to}`);
  const total = countResult.rows[0]?.n ?? 0;

  if (total <= q.points) {
    const raw = await db.execute<RawRow>(sql`
      select at, air_c, rh_pct, surface_c, dew_point_c, margin_k, margin_k as margin_min,
             emc_pct, 1 as n
      from readings
      where zone_id = ${q.zoneId} and at >= ${q.from} and at <= ${q.to}
      order by at`);
    return { bucketSeconds: 0, points: raw.rows.map((r) => toPoint(r, q.levelOf)) };
  }

  const spanS = (q.to.getTime() - q.from.getTime()) / 1000;
  const bucketSeconds = Math.max(1, Math.ceil(spanS / q.points));
  const bucketed = await db.execute<RawRow>(sql`
    select date_bin(make_interval(secs => ${bucketSeconds}), at, ${q.from}::timestamptz) as at,
           avg(air_c) as air_c, avg(rh_pct) as rh_pct, avg(surface_c) as surface_c,
           avg(dew_point_c) as dew_point_c, avg(margin_k) as margin_k,
           min(margin_k) as margin_min, avg(emc_pct) as emc_pct, count(*)::int as n
    from readings
    where zone_id = ${q.zoneId} and at >= ${q.from} and at <= ${q.to}
    group by 1
    order by 1`);
  return { bucketSeconds, points: bucketed.rows.map((r) => toPoint(r, q.levelOf)) };
}

interface RawRow extends Record<string, unknown> {
  at: Date | string;
  air_c: number | string;
  rh_pct: number | string;
  surface_c: number | string | null;
  dew_point_c: number | string | null;
  margin_k: number | string | null;
  margin_min: number | string | null;
  emc_pct: number | string | null;
  n: number;
}

// avg() of double precision comes back as double, but be strict: pg may hand back strings.
const num = (v: number | string) => (typeof v === 'number' ? v : Number(v));
const numOrNull = (v: number | string | null) => (v === null ? null : num(v));

function toPoint(r: RawRow, levelOf: (marginK: number | null) => Level): SeriesPoint {
  const marginMin = numOrNull(r.margin_min);
  return {
    at: new Date(r.at).toISOString(),
    air: num(r.air_c),
    rh: num(r.rh_pct),
    surface: numOrNull(r.surface_c),
    dewPoint: numOrNull(r.dew_point_c),
    margin: numOrNull(r.margin_k),
    marginMin,
    emc: numOrNull(r.emc_pct),
    level: levelOf(marginMin),
    count: r.n,
  };
}
