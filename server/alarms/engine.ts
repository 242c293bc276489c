/**
 * The alarm engine. After a request's readings commit, the instance that received them steps
 * the zone's alarm state — a row in PostgreSQL locked with SELECT … FOR UPDATE, so concurrent
 * requests and other instances take turns — and writes the opened, updated and cleared alarms,
 * their events and the live messages in one transaction. A scheduled sweep (server/jobs) opens
 * sensor-silent alarms, since silence is the absence of a request.
 */
import { isDeepStrictEqual } from 'node:util';

import type pg from 'pg';

import type { Db } from '@/db';
import { notify, type AlarmRow, type Tx } from '@/db/queries/alarms';
import {
  lockZoneState,
  openAlarmsOfZone,
  saveAlarmChanges,
  saveZoneState,
} from '@/db/queries/alarmState';
import { sensorSeen, sweepCandidates } from '@/db/queries/alarmSweep';
import { zoneMargins, type ReadingRow } from '@/db/queries/readings';
import { withTransaction } from '@/db/transaction';
import { DEFAULT_TREND } from '@/ingest';

import { alarmMessageJson } from '../live/messages';
import type { Logger } from '../logger';

import { createAlarmBook } from './book';
import { evaluateZone, readZoneState, type Signal } from './evaluate';
import { silentAfterMs } from './rules';
import { alarmOf } from './wire';

export interface SweepOutcome {
  opened: number;
  cleared: number;
}

export interface AlarmEngine {
  /**
   * Steps one zone through readings (from any of its sensors, oldest first) and writes what
   * changed. Never throws. Ingest reaches it through the alarm queue (server/readings/ingestReadings.ts).
   */
  judge(where: ZoneOf, rows: ReadingRow[]): Promise<void>;
  /** Opens sensor-silent alarms as of `nowMs`, and closes those of revoked sensors. */
  sweepSilent(input: { nowMs: number; shopId?: string }): Promise<SweepOutcome>;
}

/**
 * Called with the alarms a transaction opened, before it commits: what it writes commits with
 * them or not at all. It must not fail the transaction for its own sake (the alarms matter more).
 */
export type AlarmsOpenedHook = (tx: Tx, opened: AlarmRow[]) => Promise<void>;

/** The sensor whose readings these are, by where it sits. */
type ZoneOf = { sensorId: string; zoneId: string; shopId: string };

const NO_SAMPLE = { marginK: null, rhPct: null, batteryV: null, minutesToWet: null };

export function createAlarmEngine(deps: {
  db: Db;
  pool: pg.Pool;
  logger: Logger;
  /** Runs inside the transaction that opened alarms (it queues their e-mail; server/jobs). */
  onOpened?: AlarmsOpenedHook;
}): AlarmEngine {
  const { db, pool } = deps;
  const log = deps.logger.child({ component: 'alarms' });

  async function applySignals(
    tx: Tx,
    where: { shopId: string; zoneId: string },
    signals: Signal[],
  ): Promise<number> {
    const book = createAlarmBook(where, await openAlarmsOfZone(tx, where.zoneId));
    signals.forEach((signal) => book.apply(signal));
    const changes = book.changes();
    const changed = await saveAlarmChanges(tx, changes);
    // Sent on commit, with the alarms as stored: a rolled-back change is never announced.
    await notify(
      tx,
      changed.map((row) => alarmMessageJson(where.shopId, alarmOf(row))),
    );
    if (changes.inserted.length > 0) await deps.onOpened?.(tx, changes.inserted);
    return changes.events.length;
  }

  /** Steps the zone through the rows and writes what changed; failures are logged, not thrown. */
  async function judge(sensor: ZoneOf, rows: ReadingRow[]): Promise<void> {
    const where = { shopId: sensor.shopId, zoneId: sensor.zoneId };
    try {
      await withTransaction(pool, async (tx) => {
        const locked = await lockZoneState(tx, where.zoneId, where.shopId);
        if (!locked) return;
        const times = rows.map((r) => r.at.getTime());
        const firstMs = Math.min(...times);
        const lastMs = Math.max(...times);
        const margins = rows.some((r) => r.marginK !== null)
          ? await zoneMargins(
              tx,
              where.zoneId,
              new Date(firstMs - DEFAULT_TREND.windowMs),
              new Date(lastMs),
            )
          : [];
        const { settings } = locked;
        const { state, signals } = evaluateZone(
          readZoneState(locked.state),
          where.zoneId,
          rows.map((r) => ({
            sensorId: r.sensorId,
            atMs: r.at.getTime(),
            marginK: r.marginK,
            rhPct: r.rhPct,
            batteryV: r.batteryV,
          })),
          margins,
          {
            limits: { cautionK: settings.cautionK, wetK: settings.wetK },
            humidRhPct: settings.humidRhPct,
          },
        );
        // A step that changed nothing (the usual steady reading) writes nothing: no row
        // version, no WAL. Compared as values, since the stored jsonb has its own key order.
        if (!isDeepStrictEqual(state, locked.state)) await saveZoneState(tx, where.zoneId, state);
        await applySignals(tx, where, signals);
      });
    } catch (err) {
      // Not thrown: the readings are stored, and the zone's next reading is judged afresh.
      log.error(
        { err, zoneId: where.zoneId, sensorId: sensor.sensorId, readings: rows.length },
        'alarm engine: judging a zone failed',
      );
    }
  }

  return {
    judge,
    async sweepSilent({ nowMs, shopId }) {
      const outcome: SweepOutcome = { opened: 0, cleared: 0 };
      const candidates = await sweepCandidates(db, shopId);
      for (const c of candidates) {
        const allowedMs = silentAfterMs(c.expectedIntervalS, c.intervalS);
        const silent = !c.revoked && nowMs - c.lastSeenAt.getTime() > allowedMs;
        if (c.openSilentAlarmId ? !c.revoked : !silent) continue;
        const where = { shopId: c.shopId, zoneId: c.zoneId };
        const changed = await withTransaction(pool, async (tx) => {
          if (!(await lockZoneState(tx, c.zoneId, c.shopId))) return 0;
          // Judge again under the lock: a reading may have committed since the list was read.
          const seen = await sensorSeen(tx, c.sensorId);
          if (!seen?.lastSeenAt) return 0;
          const lastMs = seen.lastSeenAt.getTime();
          const active = seen.revokedAt === null && nowMs - lastMs > allowedMs;
          return applySignals(tx, where, [
            {
              kind: 'sensor_silent',
              subjectId: c.sensorId,
              sensorId: c.sensorId,
              active,
              atMs: nowMs,
              sinceMs: lastMs,
              sample: NO_SAMPLE,
            },
          ]);
        });
        if (changed > 0) outcome[silent ? 'opened' : 'cleared'] += 1;
      }
      return outcome;
    },
  };
}
