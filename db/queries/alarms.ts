/**
 * Alarms in PostgreSQL as people see them: a shop's alarms with the names of their zone, sensor
 * and acknowledger (rows in our naming; server/alarms/wire.ts makes the API's shape of them),
 * acknowledgements, and an alarm's history. The engine's own state is in alarmState.ts, the
 * silent-sensor sweep's look-ups in alarmSweep.ts. Live notifications go out inside the writing
 * transaction, so PostgreSQL delivers them only when the change commits.
 */
import { and, desc, eq, getTableColumns, isNull, sql, type SQL } from 'drizzle-orm';

import type pg from 'pg';

import { ALARM_VALUE_KEYS } from '@/ingest/wire/alarms';

import type { Db } from '../index';
import { alarmEvents, alarms, sensors, users, zones } from '../schema';

import { LIVE_CHANNEL, notify as notifyOn } from '../notify';
import { withTransaction } from '../transaction';

export type AlarmRow = typeof alarms.$inferSelect;
export type NewAlarmEvent = typeof alarmEvents.$inferInsert;
/** A Drizzle handle inside a transaction (db/transaction.ts). */
export type Tx = Db;

/** The columns that describe an alarm's condition (ingest/wire/alarms.ts names them). */
export type AlarmValues = Pick<AlarmRow, (typeof ALARM_VALUE_KEYS)[number]>;

export function alarmValuesOf(row: AlarmValues): AlarmValues {
  return Object.fromEntries(ALARM_VALUE_KEYS.map((key) => [key, row[key]])) as AlarmValues;
}

const viewColumns = {
  ...getTableColumns(alarms),
  zoneName: zones.name,
  sensorName: sensors.name,
  acknowledgedByName: users.name,
};

/** An alarm row with the names people read beside it (null when that sensor or person is gone). */
export type AlarmViewRow = AlarmRow & {
  zoneName: string;
  sensorName: string | null;
  acknowledgedByName: string | null;
};

/** Alarms with their names, open ones first, then the newest. */
export function selectAlarmViewRows(
  ex: Db,
  where: SQL | undefined,
  limit = 100,
): Promise<AlarmViewRow[]> {
  return (
    ex
      .select(viewColumns)
      .from(alarms)
      .innerJoin(zones, eq(zones.id, alarms.zoneId))
      .leftJoin(sensors, eq(sensors.id, alarms.sensorId))
      .leftJoin(users, eq(users.id, alarms.acknowledgedBy))
      .where(where)
      // Open alarms first, then the newest.
      .orderBy(sql`${alarms.clearedAt} is null desc`, desc(alarms.openedAt))
      .limit(limit)
  );
}

/** A shop's open alarms, or open and recent ones (`all`), at most `limit`. */
export function listAlarms(db: Db, shopId: string, state: 'open' | 'all', limit = 100) {
  const open = state === 'open' ? isNull(alarms.clearedAt) : undefined;
  return selectAlarmViewRows(db, and(eq(alarms.shopId, shopId), open), limit);
}

/** Sends live messages on commit of the transaction `ex` belongs to. */
export function notify(ex: Db, payloads: string[]) {
  return notifyOn(ex, LIVE_CHANNEL, payloads);
}

export type AckOutcome =
  | { ok: true; alarm: AlarmViewRow }
  | { ok: false; reason: 'not_found' | 'already_acknowledged'; alarm?: AlarmViewRow };

/** Records who acknowledged an alarm of this shop, when, and what they did; once per alarm. */
export async function acknowledgeAlarm(
  pool: pg.Pool,
  input: { shopId: string; alarmId: string; userId: string; note: string; at: Date },
  notificationFor: (row: AlarmViewRow) => string,
): Promise<AckOutcome> {
  return withTransaction(pool, async (tx) => {
    const inShop = and(eq(alarms.id, input.alarmId), eq(alarms.shopId, input.shopId));
    const [updated] = await tx
      .update(alarms)
      .set({ acknowledgedBy: input.userId, acknowledgedAt: input.at, ackNote: input.note })
      .where(and(inShop, isNull(alarms.acknowledgedAt)))
      .returning({ id: alarms.id });
    const [row] = await selectAlarmViewRows(tx, inShop, 1);
    if (!row) return { ok: false, reason: 'not_found' };
    if (!updated) return { ok: false, reason: 'already_acknowledged', alarm: row };
    await tx.insert(alarmEvents).values({
      alarmId: row.id,
      shopId: input.shopId,
      change: 'acknowledged',
      at: input.at,
      actorId: input.userId,
      note: input.note,
      snapshot: { note: input.note },
    });
    await notify(tx, [notificationFor(row)]);
    return { ok: true, alarm: row };
  });
}

/** The history of one alarm, oldest first. */
export function alarmEventsOf(db: Db, alarmId: string) {
  return db
    .select({
      change: alarmEvents.change,
      at: alarmEvents.at,
      actorId: alarmEvents.actorId,
      note: alarmEvents.note,
      snapshot: alarmEvents.snapshot,
    })
    .from(alarmEvents)
    .where(eq(alarmEvents.alarmId, alarmId))
    .orderBy(alarmEvents.at, alarmEvents.createdAt);
}
