/**
 * Alarms in PostgreSQL: the engine's per-zone state under a row lock, open alarms and their
 * history, the view the API and the live push share, acknowledgements, and the sensors a
 * silent-sensor sweep looks at. Live notifications go out inside the writing transaction, so
 * PostgreSQL delivers them only when the change commits.
 */
import { and, desc, eq, getTableColumns, inArray, isNull, sql, type SQL } from 'drizzle-orm';

import type pg from 'pg';

import type { MarginSample } from '@/ingest';

import type { Db } from '../index';
import {
  alarmEvents,
  alarms,
  alarmZoneStates,
  sensors,
  users,
  zones,
  type AlarmKind,
} from '../schema';

import { LIVE_CHANNEL, notify as notifyOn } from '../notify';
import { withTransaction } from '../transaction';

export type AlarmRow = typeof alarms.$inferSelect;
export type NewAlarmEvent = typeof alarmEvents.$inferInsert;
/** A Drizzle handle inside a transaction (db/transaction.ts). */
export type Tx = Db;

/** The columns that describe an alarm's condition; each kind fills its own pair. */
export const ALARM_VALUE_KEYS = [
  'worstMarginK',
  'latestMarginK',
  'minutesToWet',
  'peakRhPct',
  'latestRhPct',
  'lowestBatteryV',
  'latestBatteryV',
] as const;
export type AlarmValues = Pick<AlarmRow, (typeof ALARM_VALUE_KEYS)[number]>;

export function alarmValuesOf(row: AlarmValues): AlarmValues {
  return Object.fromEntries(ALARM_VALUE_KEYS.map((key) => [key, row[key]])) as AlarmValues;
}

/** An alarm as the API answers it and the live push carries it. Times ISO 8601, margins K. */
export interface AlarmView extends AlarmValues {
  id: string;
  kind: AlarmKind;
  state: 'open' | 'cleared';
  zone: { id: string; name: string };
  sensor: { id: string; name: string } | null;
  sinceAt: string;
  openedAt: string;
  updatedAt: string;
  clearedAt: string | null;
  acknowledgement: { by: { id: string; name: string } | null; at: string; note: string } | null;
}

const viewColumns = {
  ...getTableColumns(alarms),
  zoneName: zones.name,
  sensorName: sensors.name,
  acknowledgedByName: users.name,
};

async function selectViews(ex: Db, where: SQL | undefined, limit = 100) {
  const rows = await ex
    .select(viewColumns)
    .from(alarms)
    .innerJoin(zones, eq(zones.id, alarms.zoneId))
    .leftJoin(sensors, eq(sensors.id, alarms.sensorId))
    .leftJoin(users, eq(users.id, alarms.acknowledgedBy))
    .where(where)
    // Open alarms first, then the newest.
    .orderBy(sql`${alarms.clearedAt} is null desc`, desc(alarms.openedAt))
    .limit(limit);
  return rows.map((r): AlarmView => ({
    id: r.id,
    kind: r.kind,
    state: r.clearedAt ? 'cleared' : 'open',
    zone: { id: r.zoneId, name: r.zoneName },
    sensor: r.sensorId && r.sensorName ? { id: r.sensorId, name: r.sensorName } : null,
    sinceAt: r.sinceAt.toISOString(),
    openedAt: r.openedAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
    clearedAt: r.clearedAt?.toISOString() ?? null,
    worstMarginK: r.worstMarginK,
    latestMarginK: r.latestMarginK,
    minutesToWet: r.minutesToWet,
    peakRhPct: r.peakRhPct,
    latestRhPct: r.latestRhPct,
    lowestBatteryV: r.lowestBatteryV,
    latestBatteryV: r.latestBatteryV,
    acknowledgement: r.acknowledgedAt
      ? {
          by: r.acknowledgedBy ? { id: r.acknowledgedBy, name: r.acknowledgedByName ?? '' } : null,
          at: r.acknowledgedAt.toISOString(),
          note: r.ackNote ?? '',
        }
      : null,
  }));
}

/** A shop's open alarms, or open and recent ones (`all`), at most `limit`. */
export function listAlarms(db: Db, shopId: string, state: 'open' | 'all', limit = 100) {
  const open = state === 'open' ? isNull(alarms.clearedAt) : undefined;
  return selectViews(db, and(eq(alarms.shopId, shopId), open), limit);
}

function notify(ex: Db, payloads: string[]) {
  return notifyOn(ex, LIVE_CHANNEL, payloads);
}

export interface ZoneAlarmSettings {
  cautionK: number;
  wetK: number;
  humidRhPct: number;
}

/**
 * Takes a zone's engine state for this transaction (SELECT … FOR UPDATE), creating it on first
 * use, so two requests for one zone step it one after the other. Null when the zone is gone.
 */
export async function lockZoneState(tx: Tx, zoneId: string, shopId: string) {
  await tx.insert(alarmZoneStates).values({ zoneId, shopId }).onConflictDoNothing();
  const [row] = await tx
    .select({
      state: alarmZoneStates.state,
      cautionK: zones.cautionK,
      wetK: zones.wetK,
      humidRhPct: zones.humidRhPct,
    })
    .from(alarmZoneStates)
    .innerJoin(zones, eq(zones.id, alarmZoneStates.zoneId))
    .where(eq(alarmZoneStates.zoneId, zoneId))
    .for('update', { of: alarmZoneStates });
  if (!row) return null;
  const { state, ...settings } = row;
  return { state, settings: settings satisfies ZoneAlarmSettings };
}

export async function saveZoneState(tx: Tx, zoneId: string, state: object) {
  await tx
    .update(alarmZoneStates)
    .set({ state: state as Record<string, unknown>, updatedAt: sql`now()` })
    .where(eq(alarmZoneStates.zoneId, zoneId));
}

/** The open alarms of a zone, its own and its sensors'. */
export function openAlarmsOfZone(tx: Tx, zoneId: string): Promise<AlarmRow[]> {
  return tx
    .select()
    .from(alarms)
    .where(and(eq(alarms.zoneId, zoneId), isNull(alarms.clearedAt)));
}

/** A zone's stored dew margins in [from, to], oldest first: the early warning's input. */
export async function zoneMargins(tx: Tx, zoneId: string, from: Date, to: Date) {
  const rows = await tx.execute<{ at: Date | string; margin_k: number }>(sql`
    select at, margin_k from readings
    where zone_id = ${zoneId} and at >= ${from} and at <= ${to} and margin_k is not null
    order by at`);
  return rows.rows.map((r): MarginSample => ({
    atMs: new Date(r.at).getTime(),
    marginK: Number(r.margin_k),
  }));
}

/** The columns the engine owns; an acknowledgement written meanwhile is never overwritten. */
function engineColumns(row: AlarmRow) {
  return { updatedAt: row.updatedAt, clearedAt: row.clearedAt, ...alarmValuesOf(row) };
}

/**
 * Writes what the engine changed — new alarms, changed ones, their events — and pushes one live
 * message per changed alarm, built by `notificationsFor` from the alarms as now stored.
 */
export async function saveAlarmChanges(
  tx: Tx,
  changes: { inserted: AlarmRow[]; updated: AlarmRow[]; events: NewAlarmEvent[] },
  notificationsFor: (views: AlarmView[]) => string[],
) {
  if (changes.events.length === 0) return;
  // Clears before opens: a batch that clears an alarm and opens its successor (same subject and
  // kind) would otherwise meet the one-open-alarm-per-subject index with both open.
  for (const row of changes.updated) {
    await tx.update(alarms).set(engineColumns(row)).where(eq(alarms.id, row.id));
  }
  if (changes.inserted.length > 0) {
    await tx.insert(alarms).values(changes.inserted.map(({ createdAt: _, ...row }) => row));
  }
  await tx.insert(alarmEvents).values(changes.events);
  const ids = [...changes.inserted, ...changes.updated].map((r) => r.id);
  const views = await selectViews(tx, inArray(alarms.id, ids), ids.length);
  await notify(tx, notificationsFor(views));
}

export type AckOutcome =
  | { ok: true; alarm: AlarmView }
  | { ok: false; reason: 'not_found' | 'already_acknowledged'; alarm?: AlarmView };

/** Records who acknowledged an alarm of this shop, when, and what they did; once per alarm. */
export async function acknowledgeAlarm(
  pool: pg.Pool,
  input: { shopId: string; alarmId: string; userId: string; note: string; at: Date },
  notificationFor: (view: AlarmView) => string,
): Promise<AckOutcome> {
  return withTransaction(pool, async (tx) => {
    const inShop = and(eq(alarms.id, input.alarmId), eq(alarms.shopId, input.shopId));
    const [updated] = await tx
      .update(alarms)
      .set({ acknowledgedBy: input.userId, acknowledgedAt: input.at, ackNote: input.note })
      .where(and(inShop, isNull(alarms.acknowledgedAt)))
      .returning({ id: alarms.id });
    const [view] = await selectViews(tx, inShop, 1);
    if (!view) return { ok: false, reason: 'not_found' };
    if (!updated) return { ok: false, reason: 'already_acknowledged', alarm: view };
    await tx.insert(alarmEvents).values({
      alarmId: view.id,
      shopId: input.shopId,
      change: 'acknowledged',
      at: input.at,
      actorId: input.userId,
      note: input.note,
      snapshot: { note: input.note },
    });
    await notify(tx, [notificationFor(view)]);
    return { ok: true, alarm: view };
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

export interface SweepCandidate {
  sensorId: string;
  shopId: string;
  zoneId: string;
  lastSeenAt: Date;
  revoked: boolean;
  /** Times of its newest readings (up to gaps + 1), for the posting interval. */
  recentAtMs: number[];
  openSilentAlarmId: string | null;
}

/**
 * Sensors a silent-sensor sweep must judge: every active sensor that has ever posted, and every
 * revoked one still holding an open silent alarm (to close it). Optionally one shop only.
 */
export async function sweepCandidates(db: Db, readingsUsed: number, shopId?: string) {
  const result = await db.execute<{
    sensor_id: string;
    shop_id: string;
    zone_id: string;
    last_seen_at: Date | string;
    revoked: boolean;
    recent_ms: (string | number)[] | null;
    open_silent_alarm_id: string | null;
  }>(sql`
    select s.id as sensor_id, s.shop_id, s.zone_id, s.last_seen_at,
      s.revoked_at is not null as revoked,
      (select array_agg((extract(epoch from r.at) * 1000)::float8) from (
         select at from readings where sensor_id = s.id order by at desc limit ${readingsUsed}
       ) r) as recent_ms,
      a.id as open_silent_alarm_id
    from sensors s
    left join alarms a
      on a.subject_id = s.id and a.kind = 'sensor_silent' and a.cleared_at is null
    where s.last_seen_at is not null
      and (s.revoked_at is null or a.id is not null)
      ${shopId ? sql`and s.shop_id = ${shopId}` : sql``}`);
  return result.rows.map((r): SweepCandidate => ({
    sensorId: r.sensor_id,
    shopId: r.shop_id,
    zoneId: r.zone_id,
    lastSeenAt: new Date(r.last_seen_at),
    revoked: r.revoked,
    recentAtMs: (r.recent_ms ?? []).map(Number),
    openSilentAlarmId: r.open_silent_alarm_id,
  }));
}

/** A sensor's last reading time and whether it is revoked, read again under the zone's lock. */
export async function sensorSeen(tx: Tx, sensorId: string) {
  const [row] = await tx
    .select({ lastSeenAt: sensors.lastSeenAt, revokedAt: sensors.revokedAt })
    .from(sensors)
    .where(eq(sensors.id, sensorId));
  return row ?? null;
}
