// The roll-ups after a CSV import (server/imports/run.ts → rollUpStoredSpan): scoped to the
// import's zone and its time range, a day per statement, on the background pool.
// - A file of 13½ months yields hourly roll-ups whose count, min, max and mean of each value
//   equal a plain SQL GROUP BY over the stored readings (PostgreSQL's own count/min/max/avg,
//   computed here beside the code under test, not by it), and another shop's roll-ups in the
//   same hours are not rewritten.
// - While background roll-ups wait (held on a lock), a status poll is still answered: they wait
//   on their own pool, not the request pool. The same roll-ups on the request pool make the
//   poll answer 503 — the failure the busy bench runs showed.
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import {
  BACKGROUND_CONNECTION_TIMEOUT_MS,
  BACKGROUND_POOL_MAX,
  createDatabase,
  type Database,
} from '@/db';
import { rollUpHours, rollUpStoredSpan } from '@/db/queries/readingRollups';
import { runImport, type ImportRunDeps } from '@/server/imports/run';
import { silentLogger } from '@/server/logger';
import { createS3Storage, type Storage } from '@/server/storage';

import { ownerWithSensor } from '../support/app';
import {
  importsPath,
  ISO_MAPPING as MAPPING,
  startImportWorld,
  upload,
  type ImportWorld,
} from '../support/imports';

const HOUR_MS = 3_600_000;
/** Its sessions' application_name, to count them in pg_stat_activity. */
const BACKGROUND_APP = 'drybench-background-test';

let w: ImportWorld;
let storage: Storage;
let background: Database;
beforeAll(async () => {
  w = await startImportWorld('pgboss_import_rollups', { work: false });
  storage = createS3Storage(w.s3.config);
  // As server/index.ts makes it, with its own name.
  background = createDatabase(process.env.DATABASE_URL!, {
    max: BACKGROUND_POOL_MAX,
    // Longer than the server's 10 s: the tests below hold roll-ups on a lock on purpose.
    statementTimeoutMs: 60_000,
    connectionTimeoutMs: BACKGROUND_CONNECTION_TIMEOUT_MS,
    applicationName: BACKGROUND_APP,
    sessionOptions: '-c jit=off',
  });
});
afterAll(async () => {
  await background?.pool.end();
  await w?.close();
});

const deps = (): ImportRunDeps => ({
  db: w.t.db,
  pool: w.t.pool,
  background: background.db,
  storage,
  logger: silentLogger(),
});

type Person = Awaited<ReturnType<typeof ownerWithSensor>>;

/** Uploads and starts a file (queued, not worked); its import id. */
async function queued(o: Person, content: string) {
  const base = importsPath(o.shopId, o.sensorId);
  const up = await upload(o.agent, base, content).expect(201);
  const id = up.body.import.id as string;
  await o.agent.post(`${base}/${id}/start`).send({ mapping: MAPPING, remember: false }).expect(202);
  return id;
}

/** `n` lines `stepMin` minutes apart from `startMs`, values swinging by the hour and season. */
function csv(startMs: number, n: number, stepMin: number) {
  const lines = ['time,air,rh,surface'];
  for (let i = 0; i < n; i++) {
    const air = Math.round((12 + 8 * Math.sin(i / 500) + 3 * Math.sin(i / 7)) * 10) / 10;
    const rh = Math.round((65 + 20 * Math.cos(i / 300)) * 10) / 10;
    const surface = i % 5 === 0 ? '' : String(Math.round((air - 1.5 * Math.cos(i / 11)) * 10) / 10);
    lines.push(`${new Date(startMs + i * stepMin * 60_000).toISOString()},${air},${rh},${surface}`);
  }
  return lines.join('\n');
}

/** Per UTC hour of one sensor: PostgreSQL's own aggregates over the raw readings. */
async function rawHours(sensorId: string) {
  const { rows } = await w.t.pool.query(
    `select extract(epoch from date_bin('1 hour', at, timestamptz '2000-01-01T00:00:00Z'))::bigint
              * 1000 as hour_ms,
            count(*)::int as n,
            min(air_c) as air_min, max(air_c) as air_max, avg(air_c) as air_avg,
            min(rh_pct) as rh_min, max(rh_pct) as rh_max, avg(rh_pct) as rh_avg,
            count(surface_c)::int as surface_n, min(surface_c) as surface_min,
            max(surface_c) as surface_max, avg(surface_c) as surface_avg,
            count(margin_k)::int as margin_n, min(margin_k) as margin_min,
            max(margin_k) as margin_max, avg(margin_k) as margin_avg,
            count(emc_pct)::int as emc_n, min(emc_pct) as emc_min, max(emc_pct) as emc_max,
            avg(emc_pct) as emc_avg
     from readings where sensor_id = $1 group by 1 order by 1`,
    [sensorId],
  );
  return rows.map((r) => ({ ...r, hour_ms: Number(r.hour_ms) }));
}

/** The same figures from the roll-ups (means as sum / count, as the readers compute them). */
async function rolledHours(shopId: string, sensorId: string) {
  const { rows } = await w.t.pool.query(
    `select extract(epoch from hour)::bigint * 1000 as hour_ms, n,
            air_min_c as air_min, air_max_c as air_max, air_sum_c / n as air_avg,
            rh_min_pct as rh_min, rh_max_pct as rh_max, rh_sum_pct / n as rh_avg,
            surface_n, surface_min_c as surface_min, surface_max_c as surface_max,
            surface_sum_c / nullif(surface_n, 0) as surface_avg,
            margin_n, margin_min_k as margin_min, margin_max_k as margin_max,
            margin_sum_k / nullif(margin_n, 0) as margin_avg,
            emc_n, emc_min_pct as emc_min, emc_max_pct as emc_max,
            emc_sum_pct / nullif(emc_n, 0) as emc_avg
     from readings_hourly where shop_id = $1 and sensor_id = $2 order by hour`,
    [shopId, sensorId],
  );
  return rows.map((r) => ({ ...r, hour_ms: Number(r.hour_ms) }));
}

async function hourlyRowsOf(shopId: string) {
  const { rows } = await w.t.pool.query(
    `select sensor_id, hour, n, air_sum_c, zone_covered_ms, own_covered_ms, rolled_at
     from readings_hourly where shop_id = $1 order by sensor_id, hour`,
    [shopId],
  );
  return rows;
}

describe("an import's roll-ups", () => {
  it('over 13½ months equal the raw hourly aggregates and leave other shops alone', async () => {
    const startMs = Date.UTC(2024, 0, 1);
    // 45-minute lines: every 4th on the hour. 13,153 lines end on 2025-02-15T00:00Z exactly,
    // so the last reading's hour (a whole hour at the range's very end) must be rolled too.
    const n = 13_153;
    const lastMs = startMs + (n - 1) * 45 * 60_000;
    expect(new Date(lastMs).toISOString()).toBe('2025-02-15T00:00:00.000Z');

    // Another shop with readings inside the same year, rolled up before the big import.
    const other = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const otherId = await queued(other, csv(Date.UTC(2024, 5, 1), 200, 10));
    expect((await runImport(deps(), otherId))?.counts.rowsStored).toBe(200);
    await rollUpHours(w.t.db, new Date(Date.UTC(2024, 5, 1)), new Date(Date.UTC(2024, 5, 3)));
    const othersBefore = await hourlyRowsOf(other.shopId);
    expect(othersBefore.length).toBeGreaterThan(30);

    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const id = await queued(o, csv(startMs, n, 45));
    const outcome = await runImport(deps(), id);
    expect(outcome?.counts).toMatchObject({ rowsStored: n, rowsRejected: 0 });
    expect(outcome?.zoneId).toBe(o.zoneId);

    const raw = await rawHours(o.sensorId);
    const rolled = await rolledHours(o.shopId, o.sensorId);
    // 411 days of hours with a reading in each (45-min steps leave none empty), plus the last.
    expect(raw).toHaveLength(411 * 24 + 1);
    expect(rolled.map((r) => r.hour_ms)).toEqual(raw.map((r) => r.hour_ms));
    expect(rolled[0]!.hour_ms).toBe(startMs);
    expect(rolled[rolled.length - 1]!.hour_ms).toBe(lastMs);
    for (let i = 0; i < raw.length; i++) {
      const a = raw[i]!;
      const b = rolled[i]!;
      for (const key of ['n', 'surface_n', 'margin_n', 'emc_n'] as const) {
        expect(b[key], `${key} at ${new Date(a.hour_ms).toISOString()}`).toBe(a[key]);
      }
      for (const key of Object.keys(a).filter((k) => /_(min|max|avg)$/.test(k))) {
        if (a[key] === null) {
          expect(b[key], key).toBeNull();
          continue;
        }
        // Sums over counts against avg(): equal but for the order of float additions.
        expect(Math.abs(Number(b[key]) - Number(a[key])), key).toBeLessThan(1e-9);
      }
    }
    // The other shop's roll-ups in the same year were not rewritten (rolled_at unchanged): an
    // unscoped roll-up over the import's range would upsert them again.
    expect(await hourlyRowsOf(other.shopId)).toEqual(othersBefore);
  }, 240_000);

  it('reaches the hour of a gap before it, in the old zone too when the sensor moved', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    // One reading a week before the file: its own share was a gap to nowhere; after the import
    // its gap ends at the file's first reading, whose hour lies far outside the file's range.
    const early = await queued(o, csv(Date.UTC(2023, 2, 1, 10, 5), 1, 10));
    expect((await runImport(deps(), early))?.counts.rowsStored).toBe(1);
    const gapOf = async () =>
      (
        await w.t.pool.query(
          `select own_gaps from readings_hourly where sensor_id = $1 and hour = $2`,
          [o.sensorId, new Date(Date.UTC(2023, 2, 1, 10))],
        )
      ).rows[0]?.own_gaps as { f: number; t: number | null }[];
    expect((await gapOf())[0]!.t).toBeNull();
    const fileStartMs = Date.UTC(2023, 2, 8);
    const later = await queued(o, csv(fileStartMs, 20, 15));
    expect((await runImport(deps(), later))?.counts.rowsStored).toBe(20);
    expect((await gapOf())[0]!.t).toBe(fileStartMs);

    // Moved to another zone, then a later file: the previous reading's roll-up (in the old
    // zone) has its own gap end at the new file, though the new readings are in the new zone.
    const zone = await o.agent
      .post(`/api/v1/shops/${o.shopId}/zones`)
      .send({ name: 'Lumber rack' })
      .expect(201);
    await o.agent
      .patch(`/api/v1/shops/${o.shopId}/sensors/${o.sensorId}`)
      .send({ zoneId: zone.body.id })
      .expect(200);
    const lastOfOld = Date.UTC(2023, 2, 8) + 19 * 15 * 60_000;
    const movedStartMs = Date.UTC(2023, 3, 1);
    const moved = await queued(o, csv(movedStartMs, 4, 15));
    expect((await runImport(deps(), moved))?.counts.rowsStored).toBe(4);
    const { rows } = await w.t.pool.query(
      `select own_gaps, zone_id from readings_hourly where sensor_id = $1 and hour = $2`,
      [o.sensorId, new Date(Math.floor(lastOfOld / HOUR_MS) * HOUR_MS)],
    );
    expect(rows[0].zone_id).toBe(o.zoneId);
    expect(rows[0].own_gaps.at(-1).t).toBe(movedStartMs);
  }, 60_000);
});

describe('background roll-ups and requests', () => {
  /** Rolls a file in, then holds its sensor's roll-up rows: any roll-up of them waits. */
  async function heldRollups(o: Person, startMs: number) {
    const first = await queued(o, csv(startMs, 3 * 24 * 4, 15));
    expect((await runImport(deps(), first))?.counts.rowsStored).toBe(3 * 24 * 4);
    // Row locks on this sensor's hours only (other test files' roll-ups pass): an upsert of
    // them waits for this transaction, holding its connection — a slow roll-up made certain.
    const blocker = new pg.Client({ connectionString: process.env.DATABASE_URL });
    await blocker.connect();
    await blocker.query('begin');
    const locked = await blocker.query(
      'select 1 from readings_hourly where sensor_id = $1 for update',
      [o.sensorId],
    );
    expect(locked.rowCount).toBe(3 * 24);
    return blocker;
  }
  /** PostgreSQL's own count of the background pool's sessions waiting on a lock. */
  const waiting = async () =>
    Number(
      (
        await w.t.pool.query(
          `select count(*)::int as n from pg_stat_activity
           where application_name = $1 and wait_event_type = 'Lock'`,
          [BACKGROUND_APP],
        )
      ).rows[0].n,
    );

  it("a status poll is answered while the import's roll-up waits on its own pool", async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const base = importsPath(o.shopId, o.sensorId);
    const startMs = Date.UTC(2024, 8, 1);
    const blocker = await heldRollups(o, startMs);
    try {
      // A second file into the same hours, 5 minutes later: it lands (its transaction never
      // touches readings_hourly), then its roll-up waits; a dozen more roll-ups queue beside
      // it — more than the request pool has connections (5 in the test app).
      const id = await queued(o, csv(startMs + 5 * 60_000, 3 * 24 * 4, 15));
      const importing = runImport(deps(), id);
      const span = { zoneId: o.zoneId, sensorId: o.sensorId, from: new Date(startMs) };
      const more = Array.from({ length: 12 }, (_, i) =>
        rollUpStoredSpan(background.db, { ...span, to: new Date(startMs + i * HOUR_MS) }),
      );
      await expect.poll(waiting, { timeout: 30_000, interval: 100 }).toBe(BACKGROUND_POOL_MAX);
      await expect
        .poll(async () => (await o.agent.get(`${base}/${id}`)).body.import?.status, {
          timeout: 30_000,
          interval: 100,
        })
        .toBe('done');
      // Polls as the bench makes them, several at once: each answered, none left waiting 3 s
      // for a connection.
      const t0 = Date.now();
      const polls = await Promise.all(
        Array.from({ length: 8 }, () => o.agent.get(`${base}/${id}`)),
      );
      expect(polls.map((r) => r.status)).toEqual(Array(8).fill(200));
      expect(Date.now() - t0).toBeLessThan(2_500);
      // Still at most the background pool's share, however many roll-ups were asked for.
      expect(await waiting()).toBe(BACKGROUND_POOL_MAX);
      await blocker.query('commit');
      expect((await importing)?.counts.rowsStored).toBe(3 * 24 * 4);
      await Promise.all(more);
    } finally {
      await blocker.end();
    }
    // Every hour rolled with both files' readings once the lock went.
    const { rows } = await w.t.pool.query(
      'select count(*)::int as hours, min(n) as lo, max(n) as hi from readings_hourly where sensor_id = $1',
      [o.sensorId],
    );
    expect(rows[0]).toEqual({ hours: 3 * 24, lo: 8, hi: 8 });
  }, 120_000);

  it('the same roll-ups on the request pool leave a poll without a connection (503)', async () => {
    const o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const base = importsPath(o.shopId, o.sensorId);
    const startMs = Date.UTC(2024, 9, 1);
    const blocker = await heldRollups(o, startMs);
    const { rows } = await w.t.pool.query('select id from imports where sensor_id = $1', [
      o.sensorId,
    ]);
    try {
      const span = { zoneId: o.zoneId, sensorId: o.sensorId, from: new Date(startMs) };
      // Six waiting roll-ups on the test app's 5-connection request pool.
      const onRequestPool = Array.from({ length: 6 }, (_, i) =>
        rollUpStoredSpan(w.t.db, { ...span, to: new Date(startMs + i * HOUR_MS) }).then(
          () => true,
          () => false,
        ),
      );
      await new Promise((r) => setTimeout(r, 500));
      const res = await o.agent.get(`${base}/${rows[0].id}`);
      expect(res.status).toBe(503);
      expect(typeof res.body.error.code).toBe('string');
      await blocker.query('commit');
      // The sixth found no connection in 3 s either; the others land once the lock goes.
      const landed = await Promise.all(onRequestPool);
      expect(landed.filter(Boolean).length).toBeGreaterThanOrEqual(4);
    } finally {
      await blocker.end();
    }
  }, 60_000);
});
