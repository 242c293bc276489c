/**
 * Drybench's tables. Every row that belongs to a shop carries `shop_id`, so every query can be
 * scoped by shop and the readings table can later be partitioned by time or distributed by
 * shop without a schema change.
 */
import { sql } from 'drizzle-orm';
import {
  doublePrecision,
  index,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core';

export const roleEnum = pgEnum('role', ['owner', 'member', 'viewer']);
export const levelEnum = pgEnum('level', ['dry', 'close', 'wet', 'unknown']);
export const surfaceSourceEnum = pgEnum('surface_source', ['probe', 'estimate']);

const createdAt = () => timestamp({ withTimezone: true }).notNull().defaultNow();

export const users = pgTable('users', {
  id: uuid().primaryKey().defaultRandom(),
  // Stored lower-cased so sign-in is case-insensitive and the unique index holds.
  email: text().notNull().unique(),
  name: text().notNull(),
  passwordHash: text().notNull(),
  createdAt: createdAt(),
});

export const shops = pgTable('shops', {
  id: uuid().primaryKey().defaultRandom(),
  name: text().notNull(),
  timeZone: text().notNull(),
  createdAt: createdAt(),
});

export const memberships = pgTable(
  'memberships',
  {
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: roleEnum().notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.userId] }), index().on(t.userId)],
);

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
    lastSeenAt: timestamp({ withTimezone: true }),
    batteryV: doublePrecision(),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.shopId), index().on(t.zoneId)],
);

export const readings = pgTable(
  'readings',
  {
    sensorId: uuid()
      .notNull()
      .references(() => sensors.id, { onDelete: 'cascade' }),
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
  (t) => [primaryKey({ columns: [t.sensorId, t.at] }), index().on(t.zoneId, t.at)],
);

export type Role = (typeof roleEnum.enumValues)[number];
