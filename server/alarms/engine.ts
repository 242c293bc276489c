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
import { LIVE_CHANNEL, notify } from '@/db/notify';
import type { AlarmRow, NewAlarmEvent, Tx } from '@/db/queries/alarms';
import {
  lockZoneStates,
  saveAlarmChanges,
  saveZoneStates,
  zoneInputs,
  type LockedZoneState,
} from '@/db/queries/alarmState';
import { sensorSeen, sweepCandidates } from '@/db/queries/alarmSweep';
import type { ReadingRow } from '@/db/queries/readings';
import { drizzleOn, inTransaction } from '@/db/transaction';
import { DEFAULT_TREND } from '@/ingest';

import { isDatabaseUnavailable } from '../errors';
import { alarmMessageJson } from '../live/messages';
import type { Logger } from '../logger';

import { createAlarmBook, type AlarmBook } from './book';
import { evaluateZone, readZoneState, type Signal } from './evaluate';
import { silentAfterMs } from './rules';
import { alarmOf } from './wire';

export interface SweepOutcome {
  opened: number;
  cleared: number;
}

/** One zone's share of a judgement: the sensor that sent the rows, and the rows. */
export interface ZoneJudgement {
  where: ZoneOf;
  rows: ReadingRow[];
}

export interface AlarmEngine {
  /**
   * Steps one zone through readings (from any of its sensors, oldest first) and writes what
   * changed. Never throws. Ingest reaches it through the alarm queue (server/readings/ingestReadings.ts).
   */
  judge(where: ZoneOf, rows: ReadingRow[]): Promise<void>;
  /**
   * The same for many zones (one entry per zone) in one transaction of set-based statements,
   * so the cost per busy second grows with the statements, not with the zones. Never throws.
   */
  judgeZones(judgements: readonly ZoneJudgement[]): Promise<void>;
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

const settingsOf = ({ settings }: LockedZoneState) => ({
  limits: { cautionK: settings.cautionK, wetK: settings.wetK },
  humidRhPct: settings.humidRhPct,
});

export function createAlarmEngine(deps: {
  db: Db;
  pool: pg.Pool;
  logger: Logger;
  /** Runs inside the transaction that opened alarms (it queues their e-mail; server/jobs). */
  onOpened?: AlarmsOpenedHook;
}): AlarmEngine {
  const { db, pool } = deps;
  const log = deps.logger.child({ component: 'alarms' });

  /**
   * Writes what each zone's alarm book gathered: one statement for the changed alarms, one for
   * the new ones and the events, then the live messages and the opened hook. Returns the number
   * of events per zone.
   */
  async function saveBooks(
    client: pg.PoolClient,
    books: readonly { zoneId: string; book: AlarmBook }[],
  ): Promise<Map<string, number>> {
    const all = {
      inserted: [] as AlarmRow[],
      updated: [] as AlarmRow[],
      events: [] as NewAlarmEvent[],
    };
    const eventsOf = new Map<string, number>();
    for (const { zoneId, book } of books) {
      const changes = book.changes();
      all.inserted.push(...changes.inserted);
      all.updated.push(...changes.updated);
      all.events.push(...changes.events);
      eventsOf.set(zoneId, changes.events.length);
    }
    const changed = await saveAlarmChanges(client, all);
    if (changed.length > 0) {
      // Sent on commit, with the alarms as stored: a rolled-back change is never announced.
      await notify(
        client,
        LIVE_CHANNEL,
        changed.map((row) => alarmMessageJson(row.shopId, alarmOf(row))),
      );
    }
    if (all.inserted.length > 0) await deps.onOpened?.(drizzleOn(client), all.inserted);
    return eventsOf;
  }

  /**
   * Judges the zones in one transaction: lock every state row (zone id order), read every
   * zone's margins and open alarms, step each zone, write the changed states and alarms.
   */
  async function judgeSet(judgements: readonly ZoneJudgement[]): Promise<void> {
    await inTransaction(pool, async (client) => {
      const locked = await lockZoneStates(
        client,
        judgements.map((j) => j.where.zoneId),
      );
      const present = judgements.filter((j) => locked.has(j.where.zoneId));
      if (present.length === 0) return;
      const windows = present.map(({ where, rows }) => {
        if (!rows.some((r) => r.marginK !== null))
          return { zoneId: where.zoneId, from: null, to: null };
        const times = rows.map((r) => r.at.getTime());
        return {
          zoneId: where.zoneId,
          from: new Date(Math.min(...times) - DEFAULT_TREND.windowMs),
          to: new Date(Math.max(...times)),
        };
      });
      const inputs = await zoneInputs(client, windows);
      const changedStates: { zoneId: string; state: object }[] = [];
      const books = present.map(({ where, rows }) => {
        const zone = locked.get(where.zoneId)!;
        const { margins, open } = inputs.get(where.zoneId) ?? { margins: [], open: [] };
        // The book takes each signal as it arises (server/alarms/evaluate.ts, SignalSink).
        const book = createAlarmBook({ shopId: zone.shopId, zoneId: where.zoneId }, open);
        const { state } = evaluateZone(
          readZoneState(zone.state),
          where.zoneId,
          rows.map((r) => ({
            sensorId: r.sensorId,
            atMs: r.at.getTime(),
            marginK: r.marginK,
            rhPct: r.rhPct,
            batteryV: r.batteryV,
          })),
          margins,
          settingsOf(zone),
          book,
        );
        // A step that changed nothing (the usual steady reading) writes nothing: no row
        // version, no WAL. Compared as values, since the stored jsonb has its own key order.
        if (!isDeepStrictEqual(state, zone.state))
          changedStates.push({ zoneId: where.zoneId, state });
        return { zoneId: where.zoneId, book };
      });
      await saveZoneStates(client, changedStates);
      await saveBooks(client, books);
    });
  }

  function logFailure(err: unknown, { where, rows }: ZoneJudgement) {
    // Not thrown: the readings are stored, and the zone's next reading is judged afresh.
    log.error(
      { err, zoneId: where.zoneId, sensorId: where.sensorId, readings: rows.length },
      'alarm engine: judging a zone failed',
    );
  }

  async function judgeZones(judgements: readonly ZoneJudgement[]): Promise<void> {
    if (judgements.length === 0) return;
    try {
      await judgeSet(judgements);
    } catch (err) {
      if (judgements.length === 1 || isDatabaseUnavailable(err)) {
        judgements.forEach((j) => logFailure(err, j));
        return;
      }
      // One zone's failure (a value the database refused, a deadlock on a zone's first row)
      // must not cost the others their alarms: each again alone, as the reading writer does.
      for (const j of judgements) await judgeZones([j]);
    }
  }

  return {
    judge: (where, rows) => judgeZones([{ where, rows }]),
    judgeZones,
    async sweepSilent({ nowMs, shopId }) {
      const outcome: SweepOutcome = { opened: 0, cleared: 0 };
      const candidates = await sweepCandidates(db, shopId);
      for (const c of candidates) {
        const allowedMs = silentAfterMs(c.expectedIntervalS, c.intervalS);
        const silent = !c.revoked && nowMs - c.lastSeenAt.getTime() > allowedMs;
        if (c.openSilentAlarmId ? !c.revoked : !silent) continue;
        const where = { shopId: c.shopId, zoneId: c.zoneId };
        const changed = await inTransaction(pool, async (client) => {
          if (!(await lockZoneStates(client, [c.zoneId])).has(c.zoneId)) return 0;
          // Judge again under the lock: a reading may have committed since the list was read.
          const seen = await sensorSeen(drizzleOn(client), c.sensorId);
          if (!seen?.lastSeenAt) return 0;
          const lastMs = seen.lastSeenAt.getTime();
          const active = seen.revokedAt === null && nowMs - lastMs > allowedMs;
          const inputs = await zoneInputs(client, [{ zoneId: c.zoneId, from: null, to: null }]);
          const open = inputs.get(c.zoneId)?.open ?? [];
          const signal: Signal = {
            kind: 'sensor_silent',
            subjectId: c.sensorId,
            sensorId: c.sensorId,
            active,
            atMs: nowMs,
            sinceMs: lastMs,
            sample: NO_SAMPLE,
          };
          const book = createAlarmBook(where, open);
          book.apply(signal);
          const events = await saveBooks(client, [{ zoneId: c.zoneId, book }]);
          return events.get(c.zoneId) ?? 0;
        });
        if (changed > 0) outcome[silent ? 'opened' : 'cleared'] += 1;
      }
      return outcome;
    },
  };
}
