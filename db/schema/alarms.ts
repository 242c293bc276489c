/**
 * Alarms: open conditions of a zone (dew risk, wet surface, humid air) or of a sensor (silent,
 * battery low), the history of every change to them, and the alarm engine's per-zone state.
 * The state lives here rather than in a server's memory because several server instances share
 * one database: whichever instance receives a zone's readings locks that zone's state row,
 * steps it and writes it back in the same transaction.
 */
import { sql } from 'drizzle-orm';
import {
  doublePrecision,
  index,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';

import { ALARM_KINDS } from '@/ingest/alarmKinds';

import { createdAt } from './columns';
import { shops, users } from './people';
import { sensors, zones } from './sensing';

export const alarmKindEnum = pgEnum('alarm_kind', ALARM_KINDS);
export const alarmChangeEnum = pgEnum('alarm_change', [
  'opened',
  'updated',
  'acknowledged',
  'cleared',
]);

const at = () => timestamp({ withTimezone: true });

export const alarms = pgTable(
  'alarms',
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    zoneId: uuid()
      .notNull()
      .references(() => zones.id, { onDelete: 'cascade' }),
    // Set for the sensor kinds (silent, battery low); null for the zone kinds.
    sensorId: uuid().references(() => sensors.id, { onDelete: 'cascade' }),
    // The zone or the sensor the alarm is about: at most one open alarm per subject and kind.
    subjectId: uuid().notNull(),
    kind: alarmKindEnum().notNull(),
    // When the condition began (the first reading of the run; for a silent sensor its last reading).
    sinceAt: at().notNull(),
    // Engine changes carry the time of the reading (or sweep) that caused them, not the clock at
    // which a backlog happened to arrive.
    openedAt: at().notNull(),
    updatedAt: at().notNull(),
    clearedAt: at(),
    worstMarginK: doublePrecision(),
    latestMarginK: doublePrecision(),
    minutesToWet: doublePrecision(),
    peakRhPct: doublePrecision(),
    latestRhPct: doublePrecision(),
    lowestBatteryV: doublePrecision(),
    latestBatteryV: doublePrecision(),
    acknowledgedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    acknowledgedAt: at(),
    ackNote: text(),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('alarms_one_open_per_subject')
      .on(t.subjectId, t.kind)
      .where(sql`${t.clearedAt} is null`),
    index().on(t.shopId, t.openedAt),
    index()
      .on(t.zoneId)
      .where(sql`${t.clearedAt} is null`),
  ],
);

export const alarmEvents = pgTable(
  'alarm_events',
  {
    id: uuid().primaryKey().defaultRandom(),
    alarmId: uuid()
      .notNull()
      .references(() => alarms.id, { onDelete: 'cascade' }),
    shopId: uuid().notNull(),
    change: alarmChangeEnum().notNull(),
    // When the change took effect: the reading's time for the engine, the clock for an ack.
    at: at().notNull(),
    actorId: uuid().references(() => users.id, { onDelete: 'set null' }),
    note: text(),
    // The alarm's values right after the change, so the history reads without the alarm row.
    snapshot: jsonb().$type<Record<string, unknown>>().notNull(),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.alarmId, t.at), index().on(t.shopId, t.at)],
);

/** The engine's memory for one zone (hysteresis runs, holds), stepped under a row lock. */
export const alarmZoneStates = pgTable('alarm_zone_states', {
  zoneId: uuid()
    .primaryKey()
    .references(() => zones.id, { onDelete: 'cascade' }),
  shopId: uuid().notNull(),
  state: jsonb().$type<Record<string, unknown>>().notNull().default({}),
  updatedAt: at().notNull().defaultNow(),
});

/**
 * What became of an alarm's e-mail: `sending` until every recipient has it (a retry skips those
 * in `sent_to`), `sent`, or why none went out — `capped` (a mail for the zone and kind went
 * within the cap), `covered` (dew risk while the zone's surface is wet: the wet mail says more),
 * `stale` (a backlog's old alarm), `cleared` (over before it was sent), `nobody` (no owner or
 * member wants alarm mail).
 */
export const alarmMailOutcomeEnum = pgEnum('alarm_mail_outcome', [
  'sending',
  'sent',
  'capped',
  'covered',
  'stale',
  'cleared',
  'nobody',
]);

/** One row per alarm whose mail was decided; the row is the mail job's claim and its record. */
export const alarmMails = pgTable(
  'alarm_mails',
  {
    alarmId: uuid()
      .primaryKey()
      .references(() => alarms.id, { onDelete: 'cascade' }),
    shopId: uuid().notNull(),
    zoneId: uuid().notNull(),
    kind: alarmKindEnum().notNull(),
    // The alarm's opening time (its reading's), which the per-zone-and-kind cap compares.
    openedAt: at().notNull(),
    outcome: alarmMailOutcomeEnum().notNull(),
    sentTo: uuid()
      .array()
      .notNull()
      .default(sql`'{}'::uuid[]`),
    decidedAt: at().notNull(),
    sentAt: at(),
  },
  (t) => [index().on(t.zoneId, t.kind, t.openedAt)],
);

export type AlarmKind = (typeof alarmKindEnum.enumValues)[number];
export type AlarmMailOutcome = (typeof alarmMailOutcomeEnum.enumValues)[number];
export type AlarmChange = (typeof alarmChangeEnum.enumValues)[number];
