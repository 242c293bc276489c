/** What the sensors tell us: zones of a shop, the sensors in them and their readings. */
import { sql } from 'drizzle-orm';
import {
  doublePrecision,
  integer,
  index,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core';

import { LEVELS, SURFACE_SOURCES } from '@/ingest/wire/levels';
import { EMC_REGIONS, ZONE_PURPOSES } from '@/ingest/wire/zones';

import { createdAt } from './columns';
import { shops } from './people';

export const levelEnum = pgEnum('level', LEVELS);
export const surfaceSourceEnum = pgEnum('surface_source', SURFACE_SOURCES);
export const zonePurposeEnum = pgEnum('zone_purpose', ZONE_PURPOSES);
export const emcRegionEnum = pgEnum('emc_region', EMC_REGIONS);

export const zones = pgTable(
  'zones',
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    // Defaults: ISO 8502-4's 3 K before coating; 1 K wet is a rule of thumb (two ±0.5 K probes).
    cautionK: doublePrecision().notNull().default(3),
    wetK: doublePrecision().notNull().default(1),
    // 60 % RH is a rule of thumb of the trade for "corrosion speeds up", not a standard's value.
    humidRhPct: doublePrecision().notNull().default(60),
    // Zones made before purposes existed were machine rooms in practice: they keep leading with
    // the dew margin, as they did.
    purpose: zonePurposeEnum().notNull().default('machines'),
    emcRegion: emcRegionEnum().notNull().default('most'),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.shopId)],
);

export const sensors = pgTable(
  'sensors',
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    zoneId: uuid()
      .notNull()
      .references(() => zones.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    // SHA-256 of the bearer token, hex. The token itself is shown once and never stored.
    tokenHash: text().notNull().unique(),
    revokedAt: timestamp({ withTimezone: true }),
    // Removed by an owner: the row stays (revoked too) so its readings keep the zone's history
    // and old alarms keep its name; lists and token lookups leave it out.
    removedAt: timestamp({ withTimezone: true }),
    lastSeenAt: timestamp({ withTimezone: true }),
    batteryV: doublePrecision(),
    // How often the sensor posts, learnt from its readings (see insertReadingGroup).
    intervalS: doublePrecision(),
    // How often the owner says it posts (seconds), overriding the learnt interval when set.
    expectedIntervalS: integer(),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.shopId), index().on(t.zoneId)],
);

/**
 * Partitioned by month on `at` (migration 0014, pg_partman; db/queries/readingPartitions.ts):
 * drizzle's builder cannot say PARTITION BY, so the migration is written by hand and this is
 * the shape every partition shares.
 */
export const readings = pgTable(
  'readings',
  {
    // No foreign key to sensors: its check is one index probe and row lock per inserted row (about
    // 15 µs a row, 5,000 trigger calls per 5,000 rows, measured with EXPLAIN ANALYZE; ~3.7 % of
    // PostgreSQL's time under the ingest bench) and all it bought was the cascade. Sensors are
    // never deleted on their own (removedAt); a shop's deletion cascades to its sensors, whose
    // trigger `readings_follow_sensor` (migration 0014) deletes their readings through this
    // key's (shop_id, sensor_id) prefix; and the writer inserts only rows whose sensor row its
    // statement locked (db/queries/readings.ts), so no reading outlives a concurrent delete.
    sensorId: uuid().notNull(),
    at: timestamp({ withTimezone: true }).notNull(),
    shopId: uuid().notNull(),
    zoneId: uuid().notNull(),
    airC: doublePrecision().notNull(),
    rhPct: doublePrecision().notNull(),
    surfaceC: doublePrecision(),
    surfaceSource: surfaceSourceEnum(),
    batteryV: doublePrecision(),
    dewPointC: doublePrecision(),
    marginK: doublePrecision(),
    emcPct: doublePrecision(),
    level: levelEnum().notNull(),
    receivedAt: timestamp({ withTimezone: true })
      .notNull()
      .default(sql`now()`),
  },
  (t) => [
    // The shop leads the key so a distributed PostgreSQL can shard readings by shop without a
    // schema change; `at` is in it because a partitioned table's key must hold its partition
    // column. A sensor belongs to one shop, so (sensor, at) stays what identifies a reading.
    primaryKey({ columns: [t.shopId, t.sensorId, t.at] }),
    // Covers the chart's columns (INCLUDE air_c … level) since migration 0010, so a zone's
    // history is an index-only scan; drizzle's builder cannot say INCLUDE, the migration does.
    index().on(t.zoneId, t.at),
    // The roll-up job finds the hours that received readings since its last run through this
    // (db/queries/readingRollups.ts). BRIN: rows arrive in received_at order, so a summary per
    // 128 pages is enough, and an insert into unsummarised new pages costs next to nothing.
    index().using('brin', t.receivedAt),
  ],
);
