/**
 * Hourly roll-ups of the readings, kept for ever while raw readings may be dropped after some
 * months: the long-range readers (history charts, care exposure, reports over 7 days) read these
 * for whole hours. One row per sensor and hour, keyed shop first so a distributed PostgreSQL can
 * shard by shop. Written only by db/queries/readingRollups.ts rollUpHours.
 *
 * Each reading's time share is carried by the hour it was taken in: it stands until the next
 * reading (capped at TOW_MAX_GAP_MS), even when that lies in the next hour, so sums over hours
 * equal the sums over the readings. `zone_*` columns follow the week report's rule (the zone's
 * next reading, any sensor, in (at, sensor_id) order); `own_*` columns the sensor's own next
 * reading, as the care exposure of a surface with its own probe reads it.
 */
import { sql } from 'drizzle-orm';
import {
  bigint,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core';

import { levelEnum } from './sensing';

/** A stretch longer than the gap cap after a reading: from (at + cap) to the next reading, ms. */
export interface RollupGap {
  f: number;
  t: number | null;
}

const ms = () => doublePrecision().notNull().default(0);

export const readingsHourly = pgTable(
  'readings_hourly',
  {
    shopId: uuid().notNull(),
    zoneId: uuid().notNull(),
    sensorId: uuid().notNull(),
    hour: timestamp({ withTimezone: true }).notNull(),
    n: integer().notNull(),
    firstAtMs: bigint({ mode: 'number' }).notNull(),
    airMinC: doublePrecision().notNull(),
    airMaxC: doublePrecision().notNull(),
    airSumC: doublePrecision().notNull(),
    rhMinPct: doublePrecision().notNull(),
    rhMaxPct: doublePrecision().notNull(),
    rhSumPct: doublePrecision().notNull(),
    // Nullable columns carry their own count: a mean is sum / count of the non-null values.
    surfaceN: integer().notNull(),
    surfaceMinC: doublePrecision(),
    surfaceMaxC: doublePrecision(),
    surfaceSumC: doublePrecision(),
    dewPointN: integer().notNull(),
    dewPointMinC: doublePrecision(),
    dewPointMaxC: doublePrecision(),
    dewPointSumC: doublePrecision(),
    marginN: integer().notNull(),
    marginMinK: doublePrecision(),
    marginMaxK: doublePrecision(),
    marginSumK: doublePrecision(),
    /** When the hour's lowest margin was first seen (the week report's "closest approach"). */
    marginMinAtMs: bigint({ mode: 'number' }),
    emcN: integer().notNull(),
    emcMinPct: doublePrecision(),
    emcMaxPct: doublePrecision(),
    emcSumPct: doublePrecision(),
    /** The worst level stored in the hour (wet over close over dry over unknown). */
    level: levelEnum().notNull(),
    // Time-weighted by the zone's next reading (week report, trials).
    zoneCoveredMs: ms(),
    zoneAirMsC: ms(),
    zoneRhMsPct: ms(),
    zoneEmcMsPct: ms(),
    zoneEmcMs: ms(),
    zoneDryMs: ms(),
    zoneCloseMs: ms(),
    zoneWetMs: ms(),
    zoneTowMs: ms(),
    zoneGaps: jsonb().$type<RollupGap[]>(),
    // Time-weighted by the sensor's own next reading (a surface probe's exposure).
    ownCoveredMs: ms(),
    ownAirMsC: ms(),
    ownRhMsPct: ms(),
    ownEmcMsPct: ms(),
    ownEmcMs: ms(),
    ownDryMs: ms(),
    ownCloseMs: ms(),
    ownWetMs: ms(),
    ownTowMs: ms(),
    ownGaps: jsonb().$type<RollupGap[]>(),
    rolledAt: timestamp({ withTimezone: true })
      .notNull()
      .default(sql`now()`),
  },
  (t) => [
    primaryKey({ columns: [t.shopId, t.zoneId, t.sensorId, t.hour] }),
    // A zone's hours across its sensors (charts, reports); the key serves one sensor's.
    index().on(t.shopId, t.zoneId, t.hour),
  ],
);

/**
 * How far the roll-up job has got: hours before `rolledUntil` are rolled up, and readings
 * received before `receivedThrough` are in them. One row.
 */
export const readingRollupMark = pgTable('reading_rollup_mark', {
  id: integer().primaryKey().default(1),
  rolledUntil: timestamp({ withTimezone: true }).notNull(),
  receivedThrough: timestamp({ withTimezone: true }).notNull(),
});
