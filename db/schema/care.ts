/** The care of a shop's iron: its surfaces, what was done to them, and each coat's budget. */
import {
  check,
  doublePrecision,
  index,
  pgEnum,
  pgTable,
  primaryKey,
  smallint,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';

import { CARE_KINDS, COATING_TYPES } from '@/ingest/wire/surfaces';

import { createdAt } from './columns';
import { shops, users } from './people';
import { sensors, zones } from './sensing';

export const careKindEnum = pgEnum('care_kind', CARE_KINDS);
export const coatingTypeEnum = pgEnum('coating_type', COATING_TYPES);

/** A machine top, wing or fence that is looked after as one piece. */
export const surfaces = pgTable(
  'surfaces',
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    zoneId: uuid()
      .notNull()
      .references(() => zones.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    material: text(),
    // The probe on this surface: when set, only its readings count for the exposure.
    sensorId: uuid().references(() => sensors.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.shopId), index().on(t.zoneId)],
);

export const careEntries = pgTable(
  'care_entries',
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    surfaceId: uuid()
      .notNull()
      .references(() => surfaces.id, { onDelete: 'cascade' }),
    kind: careKindEnum().notNull(),
    at: timestamp({ withTimezone: true }).notNull(),
    // The log outlives a person's account: the entry stays, without a name.
    byUserId: uuid().references(() => users.id, { onDelete: 'set null' }),
    coatingType: coatingTypeEnum(),
    product: text(),
    // ISO 4628-3 degree of rusting, Ri 0–5.
    rusting: smallint(),
    note: text(),
    createdAt: createdAt(),
  },
  (t) => [
    // The care log and the last coat are both read newest first.
    index().on(t.surfaceId, t.at),
    check('care_entries_rusting_range', sql`${t.rusting} between 0 and 5`),
    check(
      'care_entries_coating_kind',
      sql`(${t.kind} = 'coating') = (${t.coatingType} is not null)`,
    ),
  ],
);

/** A shop's own budget for one coating type; a type without a row keeps ingest/care.ts's default. */
export const coatingBudgets = pgTable(
  'coating_budgets',
  {
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    coating: coatingTypeEnum().notNull(),
    hoursWet: doublePrecision().notNull(),
    hoursClose: doublePrecision().notNull(),
    towHours: doublePrecision().notNull(),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.coating] })],
);
