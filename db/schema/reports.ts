/** Week reports: which shop-weeks have had their Monday e-mail, so each goes out exactly once. */
import { date, integer, pgTable, primaryKey, timestamp, uuid } from 'drizzle-orm/pg-core';

import { createdAt } from './columns';
import { shops } from './people';

/**
 * One row per shop and week once its e-mail is claimed. The primary key is what makes the mail
 * go out once however many server instances run the schedule: the claim is an insert that only
 * one of them can win. `sentAt` stays null until the mail left, so a crash in between is seen.
 */
export const weekReportMails = pgTable(
  'week_report_mails',
  {
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    /** The Monday that starts the week, shop-local. */
    weekStart: date().notNull(),
    sentAt: timestamp({ withTimezone: true }),
    recipients: integer(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.weekStart] })],
);
