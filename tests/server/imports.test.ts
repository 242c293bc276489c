// CSV import end to end (issue 14): upload over real HTTP, the file in a real S3 fake, the job
// through pg-boss, the rows through COPY into the test database, progress on a real WebSocket.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { IMPORT_ROW_REASONS } from '@/ingest/words/importReasons';
import type { ImportMapping } from '@/ingest/wire/imports';

import { ownerWithSensor } from '../support/app';
import { postIngest } from '../support/ingest';
import { importFile, importsPath, startImportWorld, type ImportWorld } from '../support/imports';
import { connectLive } from '../support/liveClient';

let w: ImportWorld;
beforeAll(async () => {
  w = await startImportWorld('pgboss_imports');
});
afterAll(() => w.close());

const UTC_MAPPING: ImportMapping = {
  timeColumn: 'time',
  airColumn: 'air',
  rhColumn: 'rh',
  surfaceColumn: null,
  temperatureUnit: 'C',
  timeFormat: 'iso',
  timeZone: 'UTC',
};

/** Readings of one sensor as stored, oldest first. */
async function storedRows(sensorId: string) {
  const { rows } = await w.t.pool.query(
    `select at, air_c, rh_pct, surface_c, surface_source, dew_point_c, margin_k, emc_pct, level
     from readings where sensor_id = $1 order by at`,
    [sensorId],
  );
  return rows as {
    at: Date;
    air_c: number;
    rh_pct: number;
    surface_c: number | null;
    surface_source: string | null;
    dew_point_c: number;
    margin_k: number | null;
    emc_pct: number | null;
    level: string;
  }[];
}

/** `n` lines ten minutes apart from 2025-06-01T00:00Z, with a gently moving air. */
function series(n: number) {
  const startMs = Date.UTC(2025, 5, 1);
  return Array.from({ length: n }, (_, i) => ({
    at: new Date(startMs + i * 600_000).toISOString(),
    air: Math.round((14 + 4 * Math.sin(i / 9)) * 10) / 10,
    rh: Math.round((70 + 10 * Math.cos(i / 7)) * 10) / 10,
    // Every third line without a probe value: those are estimated, as live.
    surface: i % 3 === 0 ? null : Math.round((12 + 3 * Math.sin(i / 11)) * 10) / 10,
  }));
}
const csvOf = (rows: ReturnType<typeof series>) =>
  ['time,air,rh,surface', ...rows.map((r) => `${r.at},${r.air},${r.rh},${r.surface ?? ''}`)].join(
    '\n',
  );

describe('CSV import', () => {
  it('stores a file once: the same file again stores nothing new and counts duplicates', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const text = csvOf(series(300));
    const first = await importFile(o.agent, o.shopId, o.sensorId, text, UTC_MAPPING);
    expect(first).toMatchObject({
      status: 'done',
      rowsRead: 300,
      rowsStored: 300,
      rowsDuplicate: 0,
      rowsRejected: 0,
      firstAt: '2025-06-01T00:00:00.000Z',
      lastAt: new Date(Date.UTC(2025, 5, 1) + 299 * 600_000).toISOString(),
    });
    const second = await importFile(o.agent, o.shopId, o.sensorId, text, UTC_MAPPING);
    expect(second).toMatchObject({ status: 'done', rowsStored: 0, rowsDuplicate: 300 });
    expect(await storedRows(o.sensorId)).toHaveLength(300);
    // The file is let go once the import ended.
    expect(await w.s3.keys(`shops/${o.shopId}/imports/`)).toEqual([]);
    const list = await o.agent.get(importsPath(o.shopId, o.sensorId)).expect(200);
    expect(list.body.imports.map((i: { id: string }) => i.id)).toEqual([second.id, first.id]);
  });

  it('keeps bad lines out with their line numbers and reasons, for rejected.csv', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const lines = [
      'time;air;rh', // line 1
      '2025-06-01T00:00:00Z;12,5;80', // 2: fine (a decimal comma under ; delimiters)
      '2025-06-01T00:10:00Z;12.6', // 3: a column short
      'yesterday;12.6;80', // 4: no time
      '1999-12-31T23:00:00Z;12.6;80', // 5: before 2000
      '2099-01-01T00:00:00Z;12.6;80', // 6: the future
      '2025-06-01T00:40:00Z;120;80', // 7: air out of range
      '2025-06-01T00:50:00Z;12.6;wet', // 8: RH not a number
      '2025-06-01T01:00:00Z;12.6;101', // 9: RH out of range
      '', // 10: a blank line, skipped
      '2025-06-01T01:10:00Z;12.7;81', // 11: fine
    ];
    const done = await importFile(o.agent, o.shopId, o.sensorId, lines.join('\r\n'), UTC_MAPPING);
    expect(done).toMatchObject({ status: 'done', rowsRead: 9, rowsStored: 2, rowsRejected: 7 });
    expect((await storedRows(o.sensorId)).map((r) => r.air_c)).toEqual([12.5, 12.7]);
    const csv = await o.agent
      .get(`${importsPath(o.shopId, o.sensorId)}/${done.id}/rejected.csv`)
      .expect(200)
      .expect('content-type', /text\/csv/);
    const rows = csv.text.trim().split('\r\n');
    expect(rows[0]).toBe('line,reason,row');
    const reasons = rows.slice(1).map((r) => r.split(',')[0] + ' ' + r.slice(r.indexOf(',') + 1));
    const expected: [number, keyof typeof IMPORT_ROW_REASONS][] = [
      [3, 'column_count'],
      [4, 'time_unreadable'],
      [5, 'time_too_early'],
      [6, 'time_in_future'],
      [7, 'air_out_of_range'],
      [8, 'rh_unreadable'],
      [9, 'rh_out_of_range'],
    ];
    expect(reasons).toHaveLength(expected.length);
    expected.forEach(([line, reason], i) => {
      expect(reasons[i]).toContain(`${line} `);
      expect(reasons[i]).toContain(IMPORT_ROW_REASONS[reason].slice(0, 30));
    });
    expect(rows[1]).toContain('2025-06-01T00:10:00Z;12.6');
  });

  // The IANA tz database (northamerica, Rule US): America/Chicago leaves CDT (UTC−5) for CST
  // (UTC−6) at 02:00 CDT on the first Sunday of November, 2025-11-02, so the wall clock shows
  // 01:00–01:59 twice. A logger on local time writes that hour twice; read in file order, the
  // first pass is CDT (date-fns-tz's rule for an ambiguous wall time: the earlier instant) and
  // the second, after the clock went back, CST.
  it('reads a day-first Chicago file across the autumn clock change, the repeated hour twice', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const walls = ['00:30', '01:00', '01:30', '01:45', '01:00', '01:30', '01:45', '02:00', '02:30'];
    const text = [
      'Date Time,Temp C,RH %',
      ...walls.map((t, i) => `02/11/2025 ${t},${10 + i / 10},70`),
    ].join('\n');
    const done = await importFile(o.agent, o.shopId, o.sensorId, text, {
      timeColumn: 'Date Time',
      airColumn: 'Temp C',
      rhColumn: 'RH %',
      surfaceColumn: null,
      temperatureUnit: 'C',
      timeFormat: 'day-first',
      timeZone: 'America/Chicago',
    });
    expect(done).toMatchObject({ status: 'done', rowsStored: 9, rowsDuplicate: 0 });
    const stored = await storedRows(o.sensorId);
    expect(stored.map((r) => r.at.toISOString())).toEqual([
      '2025-11-02T05:30:00.000Z', // 00:30 CDT
      '2025-11-02T06:00:00.000Z', // 01:00 CDT, first pass
      '2025-11-02T06:30:00.000Z',
      '2025-11-02T06:45:00.000Z',
      '2025-11-02T07:00:00.000Z', // 01:00 CST, second pass
      '2025-11-02T07:30:00.000Z',
      '2025-11-02T07:45:00.000Z',
      '2025-11-02T08:00:00.000Z', // 02:00 CST
      '2025-11-02T08:30:00.000Z',
    ]);
    // Each line's own value at its instant: the second pass did not overwrite the first.
    expect(stored.map((r) => r.air_c)).toEqual(walls.map((_, i) => 10 + i / 10));
  });

  it('derives each row exactly as the same readings posted to /api/v1/ingest', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const live = await o.agent
      .post(`/api/v1/shops/${o.shopId}/sensors`)
      .send({ name: 'Twin probe', zoneId: o.zoneId })
      .expect(201);
    const rows = series(120);
    await postIngest(w.t.app, live.body.token, {
      unit: 'C',
      readings: rows.map((r) => ({ at: r.at, air: r.air, rh: r.rh, surface: r.surface })),
    }).expect(202);
    const done = await importFile(o.agent, o.shopId, o.sensorId, csvOf(rows), {
      ...UTC_MAPPING,
      surfaceColumn: 'surface',
    });
    expect(done).toMatchObject({ status: 'done', rowsStored: 120 });
    const imported = await storedRows(o.sensorId);
    const posted = await storedRows(live.body.id);
    expect(imported).toHaveLength(120);
    // Equal to the last bit: the same functions on the same numbers.
    expect(imported).toEqual(posted);
    expect(imported.filter((r) => r.surface_source === 'estimate')).toHaveLength(40);
  });

  it('converts °F columns as the ingest route does', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const done = await importFile(
      o.agent,
      o.shopId,
      o.sensorId,
      'time,air,rh\n1748736000,50,80\n1748736600,212,80\n',
      { ...UTC_MAPPING, timeFormat: 'epoch-s', temperatureUnit: 'F' },
    );
    // 50 °F = 10 °C exactly ((50 − 32) × 5/9); 212 °F = 100 °C is past the 85 °C limit.
    expect(done).toMatchObject({ rowsStored: 1, rowsRejected: 1 });
    const [row] = await storedRows(o.sensorId);
    expect(row!.at.toISOString()).toBe('2025-06-01T00:00:00.000Z');
    expect(row!.air_c).toBeCloseTo(10, 12);
  });

  it('raises no alarm (so queues no alarm mail) for imported readings that would alarm live', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    // Two hours of a surface 2 K below the dew point: wet by any limit (DESIGN.md levels).
    const nowMs = Date.now() - 3 * 3_600_000;
    const lines = Array.from({ length: 24 }, (_, i) => {
      const at = new Date(nowMs + i * 300_000).toISOString();
      return `${at},20,90,16`; // dew point of 20 °C, 90 % ≈ 18.3 °C (Magnus, Alduchov–Eskridge)
    });
    const done = await importFile(
      o.agent,
      o.shopId,
      o.sensorId,
      ['time,air,rh,surface', ...lines].join('\n'),
      { ...UTC_MAPPING, surfaceColumn: 'surface' },
    );
    expect(done.rowsStored).toBe(24);
    const levels = new Set((await storedRows(o.sensorId)).map((r) => r.level));
    expect([...levels]).toEqual(['wet']);
    const alarms = await w.t.pool.query(
      'select count(*)::int as n from alarms where shop_id = $1',
      [o.shopId],
    );
    expect(alarms.rows[0].n).toBe(0);

    // The same readings posted live do open an alarm: the check above could have failed.
    const twin = await o.agent
      .post(`/api/v1/shops/${o.shopId}/sensors`)
      .send({ name: 'Live twin', zoneId: o.zoneId })
      .expect(201);
    await postIngest(w.t.app, twin.body.token, {
      readings: lines.map((l) => {
        const [at, air, rh, surface] = l.split(',');
        return { at, air: Number(air), rh: Number(rh), surface: Number(surface) };
      }),
    }).expect(202);
    const after = await w.t.pool.query('select count(*)::int as n from alarms where shop_id = $1', [
      o.shopId,
    ]);
    expect(after.rows[0].n).toBeGreaterThan(0);
  });

  it('sends its progress and each status on the shop live socket', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const socket = await connectLive(w.baseUrl, { email: o.email, password: o.password });
    try {
      const done = await importFile(o.agent, o.shopId, o.sensorId, csvOf(series(50)), UTC_MAPPING);
      type Msg = { type: string; shopId: string; import: { id: string; status: string } };
      const of =
        (status: string) =>
        (m: unknown): m is Msg =>
          (m as Msg).type === 'import' &&
          (m as Msg).import?.id === done.id &&
          (m as Msg).import.status === status;
      expect((await socket.next(of('queued'), 5000)).shopId).toBe(o.shopId);
      await socket.next(of('running'), 5000);
      const last = await socket.next(of('done'), 5000);
      expect(last.import).toMatchObject({ rowsStored: 50, rowsRead: 50 });
    } finally {
      socket.close();
    }
  });
});
