/** People and shops: accounts, shops and who may do what in each. */
import { index, pgEnum, pgTable, primaryKey, text, uuid } from 'drizzle-orm/pg-core';

import { createdAt } from './columns';

export const roleEnum = pgEnum('role', ['owner', 'member', 'viewer']);

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

export type Role = (typeof roleEnum.enumValues)[number];
