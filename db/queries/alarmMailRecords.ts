/**
 * Alarm e-mails in PostgreSQL: the claim a mail job takes before sending — one row per alarm,
 * decided under a lock on the alarm's zone and kind so two instances cannot both pass the cap —
 * who has been sent it, the people who want it, and the alarm with the reading behind it.
 */
import { and, desc, eq, gt, inArray, isNull, lt, lte, sql } from 'drizzle-orm';
import type pg from 'pg';

import type { Db } from '../index';
import {
  alarmMails,
  alarms,
  readings,
  sensors,
  shops,
  zones,
  type AlarmMailOutcome,
} from '../schema';
import { withTransaction } from '../transaction';

import type { AlarmRow, Tx } from './alarms';

import { mailRecipients } from './memberships';

export type AlarmMailRow = typeof alarmMails.$inferSelect;

/** Outcomes that mean a mail went out (or is going): the ones the cap counts. */
const MAILING: AlarmMailOutcome[] = ['sending', 'sent'];

// First key of the two-key advisory lock: our own number for "alarm mail", so these locks
// never meet another use of advisory locks (pg-boss takes the one-key form).
const LOCK_CLASS = 0x6d61696c;

export interface MailDecisionInput {
  alarm: AlarmRow;
  /** A mail for the same zone and kind went, or is going, within `capMs` of this opening. */
  mailedNearby: boolean;
  /** The zone has a wet-surface alarm open. */
  wetOpen: boolean;
}

export type MailClaim =
  | { state: 'gone' }
  | { state: 'undecided' }
  | { state: 'decided'; row: AlarmMailRow; fresh: boolean };

/**
 * Decides an alarm's mail once. `decide` returns an outcome to store, or null to leave the alarm
 * undecided (not due yet). An alarm decided before comes back as stored, so a retry of a failed
 * send continues from its row.
 */
export async function claimAlarmMail(
  pool: pg.Pool,
  input: { alarmId: string; capMs: number; decidedAt: Date },
  decide: (facts: MailDecisionInput) => AlarmMailOutcome | null,
): Promise<MailClaim> {
  return withTransaction(pool, async (tx) => {
    const [alarm] = await tx.select().from(alarms).where(eq(alarms.id, input.alarmId));
    if (!alarm) return { state: 'gone' };
    const lockKey = `${alarm.zoneId}:${alarm.kind}`;
    await tx.execute(sql`select pg_advisory_xact_lock(${LOCK_CLASS}, hashtext(${lockKey}))`);
    const [stored] = await tx.select().from(alarmMails).where(eq(alarmMails.alarmId, alarm.id));
    if (stored) return { state: 'decided', row: stored, fresh: false };
    const { capMs } = input;
    const [nearby] = await tx
      .select({ alarmId: alarmMails.alarmId })
      .from(alarmMails)
      .where(
        and(
          eq(alarmMails.zoneId, alarm.zoneId),
          eq(alarmMails.kind, alarm.kind),
          inArray(alarmMails.outcome, MAILING),
          gt(alarmMails.openedAt, new Date(alarm.openedAt.getTime() - capMs)),
          lt(alarmMails.openedAt, new Date(alarm.openedAt.getTime() + capMs)),
        ),
      )
      .limit(1);
    const [wet] = await tx
      .select({ id: alarms.id })
      .from(alarms)
      .where(
        and(
          eq(alarms.zoneId, alarm.zoneId),
          eq(alarms.kind, 'wet_surface'),
          isNull(alarms.clearedAt),
        ),
      )
      .limit(1);
    const outcome = decide({
      alarm,
      mailedNearby: nearby !== undefined,
      wetOpen: wet !== undefined,
    });
    if (outcome === null) return { state: 'undecided' };
    const [row] = await tx
      .insert(alarmMails)
      .values({
        alarmId: alarm.id,
        shopId: alarm.shopId,
        zoneId: alarm.zoneId,
        kind: alarm.kind,
        openedAt: alarm.openedAt,
        outcome,
        decidedAt: input.decidedAt,
      })
      .returning();
    return { state: 'decided', row: row!, fresh: true };
  });
}

/** Records that one person has been sent the alarm's mail (a retry skips them). */
export async function markAlarmMailSentTo(db: Db, alarmId: string, userId: string) {
  await db
    .update(alarmMails)
    .set({ sentTo: sql`array_append(${alarmMails.sentTo}, ${userId}::uuid)` })
    .where(
      and(eq(alarmMails.alarmId, alarmId), sql`not (${userId}::uuid = any(${alarmMails.sentTo}))`),
    );
}

/** Closes a claim that was `sending`. */
export async function finishAlarmMail(
  db: Db,
  alarmId: string,
  outcome: Exclude<AlarmMailOutcome, 'sending'>,
  at: Date,
) {
  await db
    .update(alarmMails)
    .set({ outcome, sentAt: outcome === 'sent' ? at : null })
    .where(and(eq(alarmMails.alarmId, alarmId), eq(alarmMails.outcome, 'sending')));
}

export async function findAlarmMail(db: Db, alarmId: string): Promise<AlarmMailRow | null> {
  const [row] = await db.select().from(alarmMails).where(eq(alarmMails.alarmId, alarmId));
  return row ?? null;
}

/**
 * Takes an alarm's mail row for the rest of the transaction (SELECT … FOR UPDATE): a second run
 * of the same job (another instance, after an expiry) waits, then finds whom the first mailed.
 */
export async function lockAlarmMail(tx: Tx, alarmId: string): Promise<AlarmMailRow | null> {
  const [row] = await tx
    .select()
    .from(alarmMails)
    .where(eq(alarmMails.alarmId, alarmId))
    .for('update');
  return row ?? null;
}

/** Who gets the shop's alarm e-mails (memberships.ts mailRecipients). */
export const alarmMailRecipients = (db: Db, shopId: string) =>
  mailRecipients(db, shopId, 'alarmMail');

/** The alarm with its zone, sensor and shop names and the shop's time zone; null when gone. */
export async function alarmForMail(db: Db, alarmId: string) {
  const [row] = await db
    .select({
      alarm: alarms,
      zoneName: zones.name,
      // The zone's limits, for the rule the mail states (when the alarm opens and clears).
      cautionK: zones.cautionK,
      wetK: zones.wetK,
      humidRhPct: zones.humidRhPct,
      sensorName: sensors.name,
      shopName: shops.name,
      timeZone: shops.timeZone,
    })
    .from(alarms)
    .innerJoin(zones, eq(zones.id, alarms.zoneId))
    .innerJoin(shops, eq(shops.id, alarms.shopId))
    .leftJoin(sensors, eq(sensors.id, alarms.sensorId))
    .where(eq(alarms.id, alarmId));
  return row ?? null;
}

/**
 * The reading behind an alarm's values: the sensor's (sensor kinds) or the zone's newest reading
 * at or before the alarm's last change — a silent sensor's last one. A zone reading with a
 * margin is preferred where two sensors posted at the same instant.
 */
export async function readingBehindAlarm(db: Db, alarm: AlarmRow) {
  const scope = alarm.sensorId
    ? eq(readings.sensorId, alarm.sensorId)
    : eq(readings.zoneId, alarm.zoneId);
  const [row] = await db
    .select({
      at: readings.at,
      airC: readings.airC,
      rhPct: readings.rhPct,
      surfaceC: readings.surfaceC,
      surfaceSource: readings.surfaceSource,
      dewPointC: readings.dewPointC,
      marginK: readings.marginK,
      batteryV: readings.batteryV,
    })
    .from(readings)
    .where(and(scope, lte(readings.at, alarm.updatedAt)))
    .orderBy(desc(readings.at), sql`${readings.marginK} is null`)
    .limit(1);
  return row ?? null;
}
