/**
 * People and shops: accounts, shops, who may do what in each, invitations, resets and e-mail
 * verification links.
 */
import {
  boolean,
  index,
  integer,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core';

import { ROLES, UNIT_PREFS } from '@/ingest/wire/people';
import { PAPER_SIZES } from '@/ingest/wire/reports';

import { createdAt } from './columns';

export const roleEnum = pgEnum('role', ROLES);
export const temperatureUnitEnum = pgEnum('temperature_unit', UNIT_PREFS);
export const paperSizeEnum = pgEnum('paper_size', PAPER_SIZES);

export const users = pgTable('users', {
  id: uuid().primaryKey().defaultRandom(),
  // Stored lower-cased so sign-in is case-insensitive and the unique index holds.
  email: text().notNull().unique(),
  name: text().notNull(),
  passwordHash: text().notNull(),
  // Every session token carries the version it was signed with; sign-out and a password
  // change bump it, so every older token stops working on every server instance at once.
  sessionVersion: integer().notNull().default(0),
  // How the app shows temperatures to this person; the API always speaks °C and K.
  unitPref: temperatureUnitEnum().notNull().default('C'),
  // Alarm e-mails (server/alarms/mailDecision.ts) go to owners and members unless they turn them off.
  alarmMail: boolean().notNull().default(true),
  // The Monday week report e-mail (server/jobs/weekReportJob.ts); on unless the person turns it off.
  weekReportMail: boolean().notNull().default(true),
  // When the person proved they read this address (a verification or invitation link); null
  // until then. Alarm e-mails wait for it, so a mistyped address never gets a shop's alarms.
  emailVerifiedAt: timestamp({ withTimezone: true }),
  createdAt: createdAt(),
});

export const shops = pgTable('shops', {
  id: uuid().primaryKey().defaultRandom(),
  name: text().notNull(),
  timeZone: text().notNull(),
  // The sheet the week report's PDF is laid out on.
  paperSize: paperSizeEnum().notNull().default('a4'),
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

/** An owner's invitation of an e-mail address to a shop; the link carries the only token. */
export const invitations = pgTable(
  'invitations',
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    email: text().notNull(),
    role: roleEnum().notNull(),
    // SHA-256 of the token in the link, hex; the token itself is only in the e-mail.
    tokenHash: text().notNull().unique(),
    invitedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    acceptedAt: timestamp({ withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.shopId)],
);

/** A password-reset link: single use, short-lived, stored as a hash like sensor tokens. */
export const passwordResets = pgTable(
  'password_resets',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    tokenHash: text().notNull().unique(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    usedAt: timestamp({ withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.userId)],
);

/** A link proving an account's e-mail address: single use, 24 h, stored as a hash. */
export const emailVerifications = pgTable(
  'email_verifications',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    tokenHash: text().notNull().unique(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    usedAt: timestamp({ withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.userId)],
);

export type Role = (typeof roleEnum.enumValues)[number];
export type TemperatureUnitPref = (typeof temperatureUnitEnum.enumValues)[number];
