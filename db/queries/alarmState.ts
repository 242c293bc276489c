/**
 * The alarm engine's state in PostgreSQL: a zone's state row, taken under a row lock so requests
 * and instances step a zone one after the other, its open alarms, and the write of what a step
 * changed (alarms, their events and the live messages, in the step's transaction).
 */
import { and, eq, inArray, isNull, sql } from 'drizzle-orm';

import { alarms, alarmEvents, alarmZoneStates, zones } from '../schema';

import {
  alarmValuesOf,
  selectAlarmViewRows,
  type AlarmRow,
  type AlarmViewRow,
  type NewAlarmEvent,
  type Tx,
} from './alarms';

export interface ZoneAlarmSettings {
  cautionK: number;
  wetK: number;
  humidRhPct: number;
}

/**
 * Takes a zone's engine state for this transaction (SELECT … FOR UPDATE), creating it on first
 * use, so two requests for one zone step it one after the other. Null when the zone is gone.
 * The row exists after a zone's first judgement, so the insert runs only when the lock finds
 * none: one statement per judgement instead of two.
 */
export async function lockZoneState(tx: Tx, zoneId: string, shopId: string) {
  const lock = () =>
    tx
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
  let [row] = await lock();
  if (!row) {
    await tx.insert(alarmZoneStates).values({ zoneId, shopId }).onConflictDoNothing();
    [row] = await lock();
  }
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

/** The columns the engine owns; an acknowledgement written meanwhile is never overwritten. */
function engineColumns(row: AlarmRow) {
  return { updatedAt: row.updatedAt, clearedAt: row.clearedAt, ...alarmValuesOf(row) };
}

/**
 * Writes what the engine changed — new alarms, changed ones, their events — and returns the
 * changed alarms as now stored, with their names, for the caller's live messages.
 */
export async function saveAlarmChanges(
  tx: Tx,
  changes: { inserted: AlarmRow[]; updated: AlarmRow[]; events: NewAlarmEvent[] },
): Promise<AlarmViewRow[]> {
  if (changes.events.length === 0) return [];
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
  return selectAlarmViewRows(tx, inArray(alarms.id, ids), ids.length);
}
