/**
 * The Monday week-report e-mail: which shops are due for which week, the claim that makes each
 * shop-week's mail go out once however many instances sweep, and who receives it.
 */
import { and, eq, lt, sql } from 'drizzle-orm';

import type { Db } from '../index';
import { shops, weekReportMails } from '../schema';

import { mailRecipients } from './memberships';

export type WeekReportMailRow = typeof weekReportMails.$inferSelect;

/** The time zones shops are in: the sweep works out the due week once per zone. */
export async function shopTimeZones(db: Db): Promise<string[]> {
  const rows = await db.selectDistinct({ timeZone: shops.timeZone }).from(shops);
  return rows.map((r) => r.timeZone);
}

/**
 * Shops in `timeZone` whose mail for the week starting `weekStart` has not been claimed. A shop
 * made after the week ended has no such week (`createdBefore`, the week's end); one made during
 * it gets its first report.
 */
export async function shopsDueForWeekReport(
  db: Db,
  input: { timeZone: string; weekStart: string; createdBefore: Date },
): Promise<string[]> {
  const rows = await db
    .select({ id: shops.id })
    .from(shops)
    .where(
      and(
        eq(shops.timeZone, input.timeZone),
        lt(shops.createdAt, input.createdBefore),
        sql`not exists (select 1 from ${weekReportMails}
              where ${weekReportMails.shopId} = ${shops.id}
                and ${weekReportMails.weekStart} = ${input.weekStart})`,
      ),
    )
    .orderBy(shops.id);
  return rows.map((r) => r.id);
}

/**
 * Claims a shop-week inside the caller's transaction: true for the one transaction whose insert
 * wins the primary key. A second instance's insert waits on the first's uncommitted row and then
 * finds it (false), or takes over if the first rolled back (a crash before the mail left).
 */
export async function claimWeekReportMail(
  tx: Db,
  shopId: string,
  weekStart: string,
): Promise<boolean> {
  const rows = await tx
    .insert(weekReportMails)
    .values({ shopId, weekStart })
    .onConflictDoNothing()
    .returning({ shopId: weekReportMails.shopId });
  return rows.length === 1;
}

/** Records that the mail left (to `recipients` people; 0 when the shop had nobody to mail). */
export async function markWeekReportMailSent(
  tx: Db,
  input: { shopId: string; weekStart: string; sentAt: Date; recipients: number },
): Promise<void> {
  await tx
    .update(weekReportMails)
    .set({ sentAt: input.sentAt, recipients: input.recipients })
    .where(
      and(eq(weekReportMails.shopId, input.shopId), eq(weekReportMails.weekStart, input.weekStart)),
    );
}

export async function findWeekReportMail(
  db: Db,
  shopId: string,
  weekStart: string,
): Promise<WeekReportMailRow | null> {
  const [row] = await db
    .select()
    .from(weekReportMails)
    .where(and(eq(weekReportMails.shopId, shopId), eq(weekReportMails.weekStart, weekStart)));
  return row ?? null;
}

/** Who gets the shop's week report e-mails (memberships.ts mailRecipients). */
export const weekReportRecipients = (db: Db, shopId: string) =>
  mailRecipients(db, shopId, 'weekReportMail');
