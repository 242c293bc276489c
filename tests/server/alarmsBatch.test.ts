// Many zones judged in one transaction (the alarm queue's batches, engine.judgeZones) must give
// each zone exactly what judging it alone gives. The reference is the engine's one-zone path
// (engine.judge), run on twin zones fed the same readings; the rules behind the expected alarms
// are ingest/alarmRules.ts's (battery 2.7 V held 15 min: a rule of thumb for two lithium cells,
// marked so there; the wet level confirmed by ingest/hysteresis.ts's persistence).
import { randomUUID } from 'node:crypto';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { ReadingRow } from '@/db/queries/readings';
import { createAlarmEngine } from '@/server/alarms';

import { iso, MINUTE_MS, seriesStartMs } from '../support/alarms';
import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { captureLogs } from '../support/logs';

let t: TestApp;
beforeAll(() => void (t = makeTestApp()));
afterAll(() => t.pool.end());

type Owner = Awaited<ReturnType<typeof ownerWithSensor>>;

/** A stored reading as ingest hands it to the engine, `marginK` above the dew point of 9.3 °C. */
function row(o: Owner, atMs: number, marginK: number, batteryV: number | null = null): ReadingRow {
  return {
    sensorId: o.sensorId,
    shopId: o.shopId,
    zoneId: o.zoneId,
    at: new Date(atMs),
    airC: 20,
    rhPct: 50,
    surfaceC: 9.3 + marginK,
    surfaceSource: 'probe',
    batteryV,
    dewPointC: 9.3,
    marginK,
    emcPct: 9.2,
    level: marginK < 1 ? 'wet' : marginK < 3 ? 'close' : 'dry',
  };
}

const minutes = (startMs: number, n: number) =>
  Array.from({ length: n }, (_, i) => startMs + i * MINUTE_MS);

/** Three series that open different alarms: wet, close (dew risk only), low battery. */
function seriesFor(startMs: number) {
  return [
    (o: Owner) => minutes(startMs, 4).map((at) => row(o, at, -0.5)),
    (o: Owner) => minutes(startMs, 3).map((at) => row(o, at, 2)),
    (o: Owner) => minutes(startMs, 17).map((at) => row(o, at, 6, 2.5)),
  ];
}

/** What the engine stored for a zone, without ids and zone-specific names. */
async function storedOf(zoneId: string) {
  const alarms = await t.pool.query(
    `select kind, since_at, opened_at, updated_at, cleared_at, worst_margin_k, latest_margin_k,
            minutes_to_wet, lowest_battery_v, latest_battery_v,
            (select array_agg(change order by at, created_at) from alarm_events e
              where e.alarm_id = a.id) as changes
       from alarms a where zone_id = $1 order by kind, opened_at`,
    [zoneId],
  );
  const state = await t.pool.query(`select state from alarm_zone_states where zone_id = $1`, [
    zoneId,
  ]);
  // Each zone's state keys its levels and batteries by its own sensor id: compare the values.
  const s = state.rows[0]?.state as { levels: object; batteries: object } | undefined;
  return {
    alarms: alarms.rows,
    state: s && { ...s, levels: Object.values(s.levels), batteries: Object.values(s.batteries) },
  };
}

describe('judging many zones at once', () => {
  it('gives each zone what judging it alone gives, and skips a zone that is gone', async () => {
    const startMs = seriesStartMs();
    const series = seriesFor(startMs);
    const alone = await Promise.all(series.map(() => ownerWithSensor(t)));
    const together = await Promise.all(series.map(() => ownerWithSensor(t)));
    const logs = captureLogs();
    const engine = createAlarmEngine({ db: t.db, pool: t.pool, logger: logs.logger });

    for (const [i, o] of alone.entries()) await engine.judge(o, series[i]!(o));
    const gone = { sensorId: randomUUID(), shopId: randomUUID(), zoneId: randomUUID() };
    await engine.judgeZones([
      ...together.map((o, i) => ({ where: o, rows: series[i]!(o) })),
      { where: gone, rows: [] },
    ]);

    expect(logs.lines()).toEqual([]);
    for (const [i, o] of together.entries()) {
      expect(await storedOf(o.zoneId)).toEqual(await storedOf(alone[i]!.zoneId));
    }
    // And what they hold is what the rules say: from no level, a run of three readings confirms
    // wet (and with it dew risk) or close (dew risk alone); the battery opens after its 15 min hold.
    const kinds = async (o: Owner) =>
      (await storedOf(o.zoneId)).alarms.map((a) => [a.kind, a.opened_at.toISOString()]);
    expect(await kinds(together[0]!)).toEqual([
      ['dew_risk', iso(startMs + 2 * MINUTE_MS)],
      ['wet_surface', iso(startMs + 2 * MINUTE_MS)],
    ]);
    expect(await kinds(together[1]!)).toEqual([['dew_risk', iso(startMs + 2 * MINUTE_MS)]]);
    expect(await kinds(together[2]!)).toEqual([['battery_low', iso(startMs + 15 * MINUTE_MS)]]);
  });

  it('lets two instances judge overlapping sets, named in opposite orders, without failing', async () => {
    const a = await ownerWithSensor(t);
    const b = await ownerWithSensor(t);
    const logs = captureLogs();
    const one = createAlarmEngine({ db: t.db, pool: t.pool, logger: logs.logger });
    const other = createAlarmEngine({ db: t.db, pool: t.pool, logger: logs.logger });
    const startMs = seriesStartMs();
    for (let round = 0; round < 6; round++) {
      const atMs = startMs + round * MINUTE_MS;
      await Promise.all([
        one.judgeZones([
          { where: a, rows: [row(a, atMs, 6)] },
          { where: b, rows: [row(b, atMs, 6)] },
        ]),
        other.judgeZones([
          { where: b, rows: [row(b, atMs + 30_000, 6)] },
          { where: a, rows: [row(a, atMs + 30_000, 6)] },
        ]),
      ]);
    }
    expect(logs.lines()).toEqual([]);
    // Every step was kept: each zone's level stands at the last reading either instance judged.
    for (const o of [a, b]) {
      const { state } = await storedOf(o.zoneId);
      expect(state?.levels).toEqual([
        expect.objectContaining({
          level: expect.objectContaining({ level: 'dry', atMs: startMs + 5 * MINUTE_MS + 30_000 }),
        }),
      ]);
    }
  });
});
