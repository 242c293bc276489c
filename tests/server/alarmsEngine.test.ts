// The engine between instances: each zone's state is a row in PostgreSQL that an evaluation
// locks, so an instance waits for another's step and continues from it; and a request never
// waits long for its alarms, even when the row is held.
import type pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createDatabase } from '@/db';
import type { ReadingRow } from '@/db/queries/readings';
import { createAlarmEngine, evaluateZone, readZoneState, zoneLevelOf } from '@/server/alarms';
import { createAlarmQueue } from '@/server/alarms/queue';

import { iso, MINUTE_MS, onlyAlarm, seriesStartMs } from '../support/alarms';
import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { captureLogs } from '../support/logs';

let t: TestApp;
beforeAll(() => void (t = makeTestApp()));
afterAll(() => t.pool.end());

type Owner = Awaited<ReturnType<typeof ownerWithSensor>>;

/** A stored reading as ingest hands it to the engine: 0.5 K below the dew point (wet). */
function wetRow(o: Owner, atMs: number): ReadingRow {
  return {
    sensorId: o.sensorId,
    shopId: o.shopId,
    zoneId: o.zoneId,
    at: new Date(atMs),
    airC: 20,
    rhPct: 50,
    surfaceC: 8.8,
    surfaceSource: 'probe',
    batteryV: null,
    dewPointC: 9.3,
    marginK: -0.5,
    emcPct: 9.2,
    level: 'wet',
  };
}

/** Holds a zone's state row as another instance's evaluation would, until `release`. */
async function holdZone(zoneId: string) {
  const other: pg.PoolClient = await t.pool.connect();
  await other.query('begin');
  const held = await other.query<{ state: Record<string, unknown> }>(
    'select state from alarm_zone_states where zone_id = $1 for update',
    [zoneId],
  );
  return {
    state: held.rows[0]!.state,
    async release(newState?: object) {
      if (newState) {
        await other.query('update alarm_zone_states set state = $2 where zone_id = $1', [
          zoneId,
          JSON.stringify(newState),
        ]);
      }
      await other.query('commit');
      other.release();
    },
  };
}

/** Until some backend waits for a lock on the zone states. */
async function someoneWaitsForTheRow() {
  await expect
    .poll(async () => {
      const waiting = await t.pool.query(
        `select 1 from pg_stat_activity
         where wait_event_type = 'Lock' and query ilike '%alarm_zone_states%'`,
      );
      return waiting.rowCount;
    })
    .toBeGreaterThan(0);
}

describe('two instances stepping one zone', () => {
  it('waits for the zone’s state row and continues from what the other instance wrote', async () => {
    const o = await ownerWithSensor(t);
    const startMs = seriesStartMs();
    const logs = captureLogs();
    const engine = createAlarmEngine({ db: t.db, pool: t.pool, logger: logs.logger });
    await engine.judge(o, [{ ...wetRow(o, startMs), marginK: 6, level: 'dry' }]);

    // "The other instance" steps the zone through three wet readings (enough to confirm wet)
    // and commits only after this instance has started waiting for the row.
    const other = await holdZone(o.zoneId);
    const stepped = evaluateZone(
      readZoneState(other.state),
      o.zoneId,
      [1, 2, 3].map((i) => ({
        ...wetRow(o, startMs + i * MINUTE_MS),
        atMs: startMs + i * MINUTE_MS,
      })),
      [],
      { limits: { cautionK: 3, wetK: 1 }, humidRhPct: 60 },
    ).state;
    expect(zoneLevelOf(stepped, startMs + 3 * MINUTE_MS).level).toBe('wet');
    const evaluation = engine.judge(o, [wetRow(o, startMs + 4 * MINUTE_MS)]);
    await someoneWaitsForTheRow();
    await other.release(stepped);
    await evaluation;

    // This instance saw the confirmed wet level: its one wet reading keeps it wet, so it opens
    // the alarm. Had it read the row before the other committed, one reading confirms nothing.
    expect(logs.lines()).toEqual([]);
    const wet = await onlyAlarm(o.agent, o.shopId, 'wet_surface');
    expect(wet.openedAt).toBe(iso(startMs + 4 * MINUTE_MS));
  });
});

describe('a zone the engine cannot judge', () => {
  it('logs the failure as the alarms component, with the zone and sensor, and does not throw', async () => {
    const o = await ownerWithSensor(t);
    // A pool that has been closed: every query fails, as when the database goes away mid-judge.
    const closed = createDatabase(process.env.DATABASE_URL!, { max: 1 });
    await closed.pool.end();
    const logs = captureLogs();
    const engine = createAlarmEngine({ ...closed, logger: logs.logger });

    await expect(engine.judge(o, [wetRow(o, seriesStartMs())])).resolves.toBeUndefined();
    expect(logs.lines()).toEqual([
      expect.objectContaining({
        level: 50,
        component: 'alarms',
        zoneId: o.zoneId,
        sensorId: o.sensorId,
        msg: 'alarm engine: judging a zone failed',
        err: expect.objectContaining({ message: expect.any(String) }),
      }),
    ]);
  });
});

describe('a zone that falls behind in the alarm queue', () => {
  it('warns, as the alarms component, how many readings it skipped judging', async () => {
    const o = await ownerWithSensor(t);
    const logs = captureLogs();
    const queue = createAlarmQueue(t.alarms, logs.logger, { maxRowsPerZone: 2, minIntervalMs: 0 });
    const startMs = seriesStartMs();
    // The first request's row is being judged; the next three wait, and only two are kept.
    const first = queue.add(o, [wetRow(o, startMs)]);
    const rest = queue.add(
      o,
      [1, 2, 3].map((i) => wetRow(o, startMs + i * MINUTE_MS)),
    );
    await Promise.all([first, rest]);
    expect(logs.lines()).toEqual([
      expect.objectContaining({
        level: 40,
        component: 'alarms',
        zoneId: o.zoneId,
        dropped: 1,
        kept: 2,
      }),
    ]);
  });
});
