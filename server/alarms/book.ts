/**
 * The alarm book of one zone inside one transaction: it starts from the zone's open alarms and
 * turns signals into changes — open once per (subject, kind), update while it lasts (only when
 * the change is one a person would see), clear — each with an event for the history.
 */
import { randomUUID } from 'node:crypto';

import { alarmValuesOf, type AlarmRow, type NewAlarmEvent } from '@/db/queries/alarms';
import type { AlarmChange } from '@/db/schema';

import type { Signal, SignalSink } from './evaluate';
import { isMaterialUpdate, mergeValues, NO_VALUES } from './rules';

/** The values an event keeps: the non-empty ones, plus when the condition began. */
function snapshotOf(row: AlarmRow): Record<string, unknown> {
  const values = Object.entries(alarmValuesOf(row)).filter(([, v]) => v !== null);
  return { sinceAt: row.sinceAt.toISOString(), ...Object.fromEntries(values) };
}

export interface AlarmBook extends SignalSink {
  apply(signal: Signal): void;
  changes(): { inserted: AlarmRow[]; updated: AlarmRow[]; events: NewAlarmEvent[] };
}

export function createAlarmBook(
  where: { shopId: string; zoneId: string },
  open: AlarmRow[],
): AlarmBook {
  const key = (subjectId: string, kind: string) => `${subjectId}|${kind}`;
  const openByKey = new Map(open.map((row) => [key(row.subjectId, row.kind), row]));
  const fresh = new Map<string, AlarmRow>();
  const touched = new Map<string, AlarmRow>();
  const events: NewAlarmEvent[] = [];

  function record(row: AlarmRow, change: AlarmChange, atMs: number) {
    (fresh.has(row.id) ? fresh : touched).set(row.id, row);
    events.push({
      alarmId: row.id,
      shopId: row.shopId,
      change,
      at: new Date(atMs),
      snapshot: snapshotOf(row),
    });
  }

  function open_(signal: Signal) {
    const at = new Date(signal.atMs);
    const row: AlarmRow = {
      id: randomUUID(),
      shopId: where.shopId,
      zoneId: where.zoneId,
      sensorId: signal.sensorId,
      subjectId: signal.subjectId,
      kind: signal.kind,
      sinceAt: new Date(Math.min(signal.sinceMs, signal.atMs)),
      openedAt: at,
      updatedAt: at,
      clearedAt: null,
      ...mergeValues(signal.kind, NO_VALUES, signal.sample),
      acknowledgedBy: null,
      acknowledgedAt: null,
      ackNote: null,
      createdAt: at,
    };
    fresh.set(row.id, row);
    openByKey.set(key(row.subjectId, row.kind), row);
    record(row, 'opened', signal.atMs);
  }

  return {
    // What apply ignores: an inactive signal about an alarm that is not open.
    wants(subjectId, kind, active) {
      return active || (openByKey.size > 0 && openByKey.has(key(subjectId, kind)));
    },
    apply(signal) {
      const k = key(signal.subjectId, signal.kind);
      const row = openByKey.get(k);
      if (!row) {
        if (signal.active) open_(signal);
        return;
      }
      const updatedMs = row.updatedAt.getTime();
      if (signal.kind === 'sensor_silent') {
        // A silence ends with any reading taken after the last one we had; it may have been
        // buffered by the sensor and arrive after the sweep, so the clear is dated no earlier.
        if (signal.active || signal.atMs <= row.sinceAt.getTime()) return;
        const atMs = Math.max(signal.atMs, updatedMs);
        Object.assign(row, { clearedAt: new Date(atMs), updatedAt: new Date(atMs) });
        openByKey.delete(k);
        return record(row, 'cleared', atMs);
      }
      // Readings older than the alarm's last change (another sensor's backlog) change nothing.
      if (signal.atMs < updatedMs) return;
      const stored = alarmValuesOf(row);
      const next = mergeValues(signal.kind, stored, signal.sample);
      const at = new Date(signal.atMs);
      if (!signal.active) {
        Object.assign(row, next, { clearedAt: at, updatedAt: at });
        openByKey.delete(k);
        return record(row, 'cleared', signal.atMs);
      }
      if (isMaterialUpdate(stored, next, signal.atMs - updatedMs)) {
        Object.assign(row, next, { updatedAt: at });
        record(row, 'updated', signal.atMs);
      }
    },
    changes() {
      return { inserted: [...fresh.values()], updated: [...touched.values()], events };
    },
  };
}
