/**
 * Protection trials: a shop compares treatments of its cast iron over tests, ranking every
 * treatment in each. Every row carries shop_id so each query is scoped by shop on its own.
 */
import {
  index,
  integer,
  numeric,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  unique,
  uuid,
} from 'drizzle-orm/pg-core';

import { TRIAL_TEST_KINDS } from '@/ingest/wire/trials';

import { createdAt } from './columns';
import { shops, users } from './people';
import { sensors, zones } from './sensing';

export const trialTestKindEnum = pgEnum('trial_test_kind', TRIAL_TEST_KINDS);

export const trials = pgTable(
  'trials',
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.shopId)],
);

export const trialTreatments = pgTable(
  'trial_treatments',
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    trialId: uuid()
      .notNull()
      .references(() => trials.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    /** The order the treatments were given in, kept for lists and standings. */
    position: integer().notNull(),
  },
  (t) => [unique().on(t.trialId, t.name), index().on(t.shopId)],
);

export const trialTests = pgTable(
  'trial_tests',
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    trialId: uuid()
      .notNull()
      .references(() => trials.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    kind: trialTestKindEnum().notNull(),
    from: timestamp('starts_at', { withTimezone: true }).notNull(),
    to: timestamp('ends_at', { withTimezone: true }).notNull(),
    // Where the conditions came from; a removed zone leaves the test and its ranks standing.
    zoneId: uuid().references(() => zones.id, { onDelete: 'set null' }),
    sensorId: uuid().references(() => sensors.id, { onDelete: 'set null' }),
    notes: text(),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.trialId), index().on(t.shopId)],
);

export const trialRanks = pgTable(
  'trial_ranks',
  {
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    testId: uuid()
      .notNull()
      .references(() => trialTests.id, { onDelete: 'cascade' }),
    treatmentId: uuid()
      .notNull()
      .references(() => trialTreatments.id, { onDelete: 'cascade' }),
    // numeric: a person may enter a shared rank as 1.5 for a tie.
    rank: numeric({ mode: 'number' }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.testId, t.treatmentId] }), index().on(t.shopId)],
);
