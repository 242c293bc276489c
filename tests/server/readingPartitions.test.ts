// Readings partitioned by month (migration 0014, db/queries/readingPartitions.ts), on databases
// of their own: the migration of a populated table, partitions made for old readings (never the
// default partition), the writer asking only outside its covered span, and retention dropping
// whole months. Month boundaries are UTC months; the expected partition of a reading is computed
// here from its time with PostgreSQL's own to_char, and the retention rule is pg_partman 4.x's
// documented one (a partition goes when its end is older than now minus the retention).
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import { migrate } from 'drizzle-orm/node-postgres/migrator';
import type pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createDatabase, type Database } from '@/db';
import { runMigrations } from '@/db/migrate';
import {
  ensureReadingPartitions,
  readingPartitions,
  readingsInDefaultPartition,
  runReadingPartitionMaintenance,
} from '@/db/queries/readingPartitions';
import { insertReadingGroup, type ReadingRow } from '@/db/queries/readings';
import { readConfig } from '@/server/config';
import {
  READING_PARTITIONS_QUEUE,
  scheduleReadingPartitionMaintenance,
  startJobRunner,
} from '@/server/jobs';
import { createReadingWriter } from '@/server/readings/writer';

import { captureLogs } from '../support/logs';

const baseUrl = process.env.DATABASE_URL!;
const adminUrl = baseUrl.replace(/\/[^/]+$/, '/postgres');
const urlOf = (name: string) => baseUrl.replace(/\/[^/]+$/, `/${name}`);
const MIGRATED_DB = 'drybench_partitions_migrated';
const FRESH_DB = 'drybench_partitions_fresh';

async function admin(statement: string) {
  const a = createDatabase(adminUrl, { max: 1 });
  try {
    await a.pool.query(statement);
  } finally {
    await a.pool.end();
  }
}

async function freshDatabase(name: string) {
  await admin(`drop database if exists ${name} with (force)`);
  await admin(`create database ${name}`);
}

/** The committed migrations up to and including `lastTag`, as the database had them then. */
function migrationsUpTo(lastTag: string): string {
  const source = path.join(process.cwd(), 'db/migrations');
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'drybench-migrations-'));
  const journal = JSON.parse(fs.readFileSync(path.join(source, 'meta/_journal.json'), 'utf8')) as {
    entries: { tag: string }[];
  };
  const last = journal.entries.findIndex((e) => e.tag === lastTag);
  if (last < 0) throw new Error(`no migration ${lastTag}`);
  journal.entries = journal.entries.slice(0, last + 1);
  fs.mkdirSync(path.join(dir, 'meta'));
  fs.writeFileSync(path.join(dir, 'meta/_journal.json'), JSON.stringify(journal));
  for (const e of journal.entries) {
    fs.copyFileSync(path.join(source, `${e.tag}.sql`), path.join(dir, `${e.tag}.sql`));
  }
  return dir;
}

interface Place {
  shopId: string;
  zoneId: string;
  sensorIds: string[];
}

async function makeShop(pool: pg.Pool, name: string, sensors = 2): Promise<Place> {
  const shop = await pool.query<{ id: string }>(
    `insert into shops (name, time_zone) values ($1, 'America/Chicago') returning id`,
    [name],
  );
  const shopId = shop.rows[0]!.id;
  const zone = await pool.query<{ id: string }>(
    `insert into zones (shop_id, name) values ($1, 'Machine room') returning id`,
    [shopId],
  );
  const zoneId = zone.rows[0]!.id;
  const sensorIds: string[] = [];
  for (let i = 0; i < sensors; i++) {
    const s = await pool.query<{ id: string }>(
      `insert into sensors (shop_id, zone_id, name, token_hash)
       values ($1, $2, $3, md5(random()::text)) returning id`,
      [shopId, zoneId, `Probe ${i + 1}`],
    );
    sensorIds.push(s.rows[0]!.id);
  }
  return { shopId, zoneId, sensorIds };
}

function rowAt(place: Place, sensorId: string, at: Date): ReadingRow {
  return {
    sensorId,
    shopId: place.shopId,
    zoneId: place.zoneId,
    at,
    airC: 14,
    rhPct: 70,
    surfaceC: 11,
    surfaceSource: 'probe',
    batteryV: 3.0,
    dewPointC: 8.6,
    marginK: 2.4,
    emcPct: 13.3,
    level: 'close',
  };
}

/** Rows whose partition is not the one named after their UTC month (none, when all is well). */
async function misplaced(pool: pg.Pool) {
  const r = await pool.query<{ n: number }>(`
    select count(*)::int as n from readings
    where tableoid::regclass::text <> 'readings_p' || to_char(at at time zone 'UTC', 'YYYY_MM')`);
  return r.rows[0]!.n;
}

const count = async (pool: pg.Pool, where = 'true', params: unknown[] = []) =>
  (
    await pool.query<{ n: number }>(
      `select count(*)::int as n from readings where ${where}`,
      params,
    )
  ).rows[0]!.n;

const monthName = (ms: number) => {
  const d = new Date(ms);
  return `readings_p${d.getUTCFullYear()}_${String(d.getUTCMonth() + 1).padStart(2, '0')}`;
};
const monthsFrom = (ms: number, months: number) => {
  const d = new Date(ms);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + months, 1);
};

/** True when the partitions follow each other month after month with no gap. */
const contiguous = (parts: { startMs: number; endMs: number }[]) =>
  parts.every((p, i) => i === 0 || parts[i - 1]!.endMs === p.startMs);

describe('migration 0014 on a populated readings table', () => {
  let db: Database;
  let place: Place;
  const nowMs = Date.now();
  // Several months back, this month, and one far in the past (a logger's history of 2001).
  const times = [
    Date.UTC(2001, 4, 17, 6, 30),
    nowMs - 150 * 86_400_000,
    nowMs - 62 * 86_400_000,
    nowMs - 31 * 86_400_000,
    nowMs - 3_600_000,
    nowMs - 60_000,
  ].map((ms) => new Date(ms));

  beforeAll(async () => {
    await freshDatabase(MIGRATED_DB);
    db = createDatabase(urlOf(MIGRATED_DB), { max: 2 });
    await migrate(db.db, { migrationsFolder: migrationsUpTo('0013_photos') });
    place = await makeShop(db.pool, 'Tamarack Joinery');
    // As the 0013 writer stored them: key (sensor_id, at), foreign key to sensors.
    for (const sensorId of place.sensorIds) {
      for (const at of times) {
        await db.pool.query(
          `insert into readings (sensor_id, at, shop_id, zone_id, air_c, rh_pct, level)
           values ($1, $2, $3, $4, 14, 70, 'unknown') on conflict (sensor_id, at) do nothing`,
          [sensorId, at, place.shopId, place.zoneId],
        );
      }
    }
    // The app's own path: scripts/migrate.ts applies what is missing (0014).
    execFileSync('npx', ['tsx', 'scripts/migrate.ts'], {
      env: { ...process.env, DATABASE_URL: urlOf(MIGRATED_DB) },
      stdio: 'pipe',
    });
  }, 180_000);
  afterAll(async () => {
    await db.pool.end();
    await admin(`drop database if exists ${MIGRATED_DB} with (force)`);
  });

  it('keeps every row, each in its own month, none in the default partition', async () => {
    expect(await count(db.pool)).toBe(times.length * place.sensorIds.length);
    expect(await misplaced(db.pool)).toBe(0);
    expect(await readingsInDefaultPartition(db.db)).toBe(0);
    const far = await db.pool.query<{ p: string }>(
      `select tableoid::regclass::text as p from readings where at = $1`,
      [times[0]],
    );
    expect(far.rows.map((r) => r.p)).toEqual(['readings_p2001_05', 'readings_p2001_05']);
  });

  it('has one partition per month from the oldest reading to three months ahead', async () => {
    const parts = await readingPartitions(db.db);
    expect(parts[0]!.name).toBe('readings_p2001_05');
    expect(parts.at(-1)!.name).toBe(monthName(monthsFrom(nowMs, 3)));
    expect(contiguous(parts)).toBe(true);
    const config = await db.pool.query(
      `select partition_interval, premake, infinite_time_partitions, retention_keep_table
       from partman.part_config where parent_table = 'public.readings'`,
    );
    expect(config.rows).toEqual([
      {
        partition_interval: '1 mon',
        premake: 3,
        infinite_time_partitions: true,
        retention_keep_table: false,
      },
    ]);
  });

  it('keys readings by (shop, sensor, at) and keeps the covering zone index', async () => {
    const defs = await db.pool.query<{ def: string }>(`
      select pg_get_indexdef(indexrelid) as def from pg_index
      where indrelid = 'readings'::regclass order by 1`);
    expect(defs.rows.map((r) => r.def)).toEqual([
      // Migration 0015's: how the roll-up job finds hours that received late readings.
      'CREATE INDEX readings_received_at_index ON ONLY public.readings USING brin (received_at)',
      'CREATE INDEX readings_zone_id_at_index ON ONLY public.readings USING btree (zone_id, at) INCLUDE (sensor_id, air_c, rh_pct, surface_c, dew_point_c, margin_k, emc_pct, level)',
      'CREATE UNIQUE INDEX readings_shop_id_sensor_id_at_pk ON ONLY public.readings USING btree (shop_id, sensor_id, at)',
    ]);
    const fks = await db.pool.query(
      `select conname from pg_constraint where conrelid = 'readings'::regclass and contype = 'f'`,
    );
    expect(fks.rows).toEqual([]);
  });

  it("keeps the writer's retries idempotent on the new key", async () => {
    const again = place.sensorIds.flatMap((id) => times.map((at) => rowAt(place, id, at)));
    expect((await insertReadingGroup(db.pool, again, [])).size).toBe(0);
    const fresh = rowAt(place, place.sensorIds[0]!, new Date(nowMs - 30_000));
    expect((await insertReadingGroup(db.pool, [fresh, fresh], [])).size).toBe(1);
    expect((await insertReadingGroup(db.pool, [fresh], [])).size).toBe(0);
    expect(await count(db.pool)).toBe(times.length * place.sensorIds.length + 1);
  });

  it('stores nothing for a sensor that does not exist, and deleting a shop removes its readings', async () => {
    const ghost = rowAt(place, '00000000-0000-4000-8000-000000000000', new Date(nowMs - 20_000));
    expect((await insertReadingGroup(db.pool, [ghost], [])).size).toBe(0);
    const other = await makeShop(db.pool, 'Birch Hollow Woodshop', 1);
    await insertReadingGroup(db.pool, [rowAt(other, other.sensorIds[0]!, new Date(nowMs))], []);

    await db.pool.query('delete from shops where id = $1', [place.shopId]);
    expect(await count(db.pool, 'shop_id = $1', [place.shopId])).toBe(0);
    expect(await count(db.pool, 'shop_id = $1', [other.shopId])).toBe(1);
  });
});

describe('partitions for old readings, the writer, and retention', () => {
  let db: Database;
  let place: Place;
  const nowMs = Date.now();

  beforeAll(async () => {
    await freshDatabase(FRESH_DB);
    db = createDatabase(urlOf(FRESH_DB), { max: 4 });
    await runMigrations(db.db);
    place = await makeShop(db.pool, 'Tamarack Joinery');
  }, 120_000);
  afterAll(async () => {
    await db.pool.end();
    await admin(`drop database if exists ${FRESH_DB} with (force)`);
  });

  it('makes the months of a 2019 import and every month up to the existing ones', async () => {
    const span = await ensureReadingPartitions(
      db.db,
      new Date('2019-03-05T00:00:00Z'),
      new Date('2019-04-20T12:00:00Z'),
    );
    const parts = await readingPartitions(db.db);
    expect(parts[0]!.name).toBe('readings_p2019_03');
    expect(contiguous(parts)).toBe(true);
    expect(span).toEqual({ fromMs: Date.UTC(2019, 2, 1), toMs: parts.at(-1)!.endMs });

    const rows = ['2019-03-05T00:00:00Z', '2019-03-31T23:59:59.999Z', '2019-04-20T12:00:00Z'].map(
      (at) => rowAt(place, place.sensorIds[0]!, new Date(at)),
    );
    expect((await insertReadingGroup(db.pool, rows, [])).size).toBe(3);
    expect(await misplaced(db.pool)).toBe(0);
    expect(await readingsInDefaultPartition(db.db)).toBe(0);
  });

  it('is idempotent and makes nothing when the months exist', async () => {
    const relations = async () =>
      (await db.pool.query<{ n: number }>('select count(*)::int as n from pg_class')).rows[0]!.n;
    const before = await relations();
    const span = await ensureReadingPartitions(
      db.db,
      new Date('2019-04-01T00:00:00Z'),
      new Date(nowMs),
    );
    expect(await relations()).toBe(before);
    expect(span.fromMs).toBe(Date.UTC(2019, 2, 1));
  });

  it('moves rows found in the default partition into their month first', async () => {
    // Beyond the premade months: only a hand-made row can land there (ingest refuses the future).
    const farAhead = new Date(monthsFrom(nowMs, 7) + 86_400_000);
    await insertReadingGroup(db.pool, [rowAt(place, place.sensorIds[1]!, farAhead)], []);
    expect(await readingsInDefaultPartition(db.db)).toBe(1);

    await ensureReadingPartitions(db.db, farAhead, farAhead);
    expect(await readingsInDefaultPartition(db.db)).toBe(0);
    expect(await misplaced(db.pool)).toBe(0);
    const parts = await readingPartitions(db.db);
    expect(parts.at(-1)!.name).toBe(monthName(farAhead.getTime()));
    expect(contiguous(parts)).toBe(true);
  });

  it("routes rows to a month made after the group statement's plan was kept", async () => {
    // The group statement is named (db/queries/readings.ts): each connection prepares it once
    // and keeps its plan. A month's partition attached since must still get that month's rows
    // through the same connection; PostgreSQL's partition bounds (tableoid) are the check.
    const one = createDatabase(urlOf(FRESH_DB), { max: 1 });
    try {
      const sensorId = place.sensorIds[0]!;
      const now = rowAt(place, sensorId, new Date(nowMs - 3_600_000));
      expect((await insertReadingGroup(one.pool, [now], [])).size).toBe(1);
      const prepared = await one.pool.query<{ name: string }>(
        'select name from pg_prepared_statements',
      );
      expect(prepared.rows.map((r) => r.name)).toContain('insert-reading-group');

      const ahead = new Date(monthsFrom(nowMs, 9) + 86_400_000);
      await ensureReadingPartitions(db.db, ahead, ahead);
      expect((await insertReadingGroup(one.pool, [rowAt(place, sensorId, ahead)], [])).size).toBe(
        1,
      );
      expect(await readingsInDefaultPartition(db.db)).toBe(0);
      expect(await misplaced(db.pool)).toBe(0);
    } finally {
      await one.pool.end();
    }
  });

  it('has the writer make the months of an old backlog, and ask nothing inside its span', async () => {
    let statements = 0;
    const counted = new Proxy(db.pool, {
      get(target, key, receiver) {
        if (key === 'query') {
          return (...args: unknown[]) => {
            statements++;
            return (target.query as (...a: unknown[]) => unknown).apply(target, args);
          };
        }
        const value: unknown = Reflect.get(target, key, receiver);
        return typeof value === 'function' ? (value as () => unknown).bind(target) : value;
      },
    });
    const writer = createReadingWriter(counted);
    // A sensor's buffer from 2018, older than the oldest partition.
    const old = await writer.write([
      rowAt(place, place.sensorIds[0]!, new Date('2018-06-02T08:00:00Z')),
      rowAt(place, place.sensorIds[0]!, new Date('2018-06-02T08:01:00Z')),
    ]);
    expect(old.insertedMs.size).toBe(2);
    expect((await readingPartitions(db.db))[0]!.name).toBe('readings_p2018_06');
    expect(await misplaced(db.pool)).toBe(0);
    expect(await readingsInDefaultPartition(db.db)).toBe(0);

    statements = 0;
    const recent = await writer.write([rowAt(place, place.sensorIds[0]!, new Date(nowMs - 5000))]);
    expect(recent.insertedMs.size).toBe(1);
    // The one group statement: no catalog query, no partition made.
    expect(statements).toBe(1);
    await writer.close();
  });

  it('drops whole months past the retention, keeps the recent ones and the months ahead', async () => {
    const recentRows = [nowMs - 40 * 86_400_000, nowMs - 10_000].map((ms) =>
      rowAt(place, place.sensorIds[1]!, new Date(ms)),
    );
    await ensureReadingPartitions(db.db, recentRows[0]!.at, recentRows[1]!.at);
    await insertReadingGroup(db.pool, recentRows, []);
    const keepMonths = 3;
    const outcome = await runReadingPartitionMaintenance(db.db, { keepMonths });

    // pg_partman 4.x: a partition goes when its end is before now − retention.
    const cutoff = await db.pool.query<{ at: Date }>(
      `select now() - make_interval(months => $1) as at`,
      [keepMonths],
    );
    const cutoffMs = cutoff.rows[0]!.at.getTime();
    const parts = await readingPartitions(db.db);
    expect(outcome.dropped).toContain('readings_p2018_06');
    expect(outcome.dropped).toContain('readings_p2019_03');
    expect(parts.every((p) => p.endMs >= cutoffMs)).toBe(true);
    expect(parts[0]!.startMs).toBeLessThanOrEqual(cutoffMs);
    expect(contiguous(parts)).toBe(true);
    expect(parts.at(-1)!.startMs).toBeGreaterThanOrEqual(monthsFrom(nowMs, 3));
    expect(await count(db.pool, `at < '2020-01-01'`)).toBe(0);
    for (const r of recentRows) expect(await count(db.pool, 'at = $1', [r.at])).toBe(1);
    expect(await readingsInDefaultPartition(db.db)).toBe(0);

    const again = await runReadingPartitionMaintenance(db.db, { keepMonths });
    expect(again).toEqual({ created: [], dropped: [] });
  });

  it('runs as the daily pg-boss job, its before step first', async () => {
    const logs = captureLogs();
    // This database's own pg-boss schema, without cron: the job is sent by hand.
    const boss = await startJobRunner({
      databaseUrl: urlOf(FRESH_DB),
      logger: logs.logger,
      cron: false,
    });
    const order: string[] = [];
    try {
      await scheduleReadingPartitionMaintenance(boss, {
        db: db.db,
        logger: logs.logger,
        keepMonths: 2,
        before: async () => {
          order.push(`before, oldest ${(await readingPartitions(db.db))[0]!.name}`);
        },
        schedule: false,
        pollingIntervalSeconds: 0.5,
      });
      const id = await boss.send(READING_PARTITIONS_QUEUE, {});
      await expect
        .poll(async () => (await boss.getJobById(READING_PARTITIONS_QUEUE, id!))?.state, {
          timeout: 30_000,
          interval: 250,
        })
        .toBe('completed');
    } finally {
      await boss.stop({ graceful: false });
    }
    const oldestBefore = monthName(monthsFrom(Date.now(), -3));
    // The before step saw the 3-month window's oldest month, which the 2-month job then dropped.
    expect(order).toEqual([`before, oldest ${oldestBefore}`]);
    const done = logs.lines().find((l) => l.msg === 'reading partitions: maintenance done');
    expect(done).toMatchObject({ keepMonths: 2, dropped: [oldestBefore] });
  });

  it('refuses a keep window under a month', async () => {
    await expect(runReadingPartitionMaintenance(db.db, { keepMonths: 0 })).rejects.toThrow(
      /keepMonths/,
    );
  });
});

describe('RAW_READINGS_KEEP_MONTHS', () => {
  const env = {
    DATABASE_URL: 'postgres://postgres@127.0.0.1:1/none',
    SESSION_SECRET: 'x'.repeat(32),
  };
  it('keeps two years by default and refuses less than a whole month', () => {
    expect(readConfig(env).rawReadingsKeepMonths).toBe(24);
    expect(readConfig({ ...env, RAW_READINGS_KEEP_MONTHS: '6' }).rawReadingsKeepMonths).toBe(6);
    for (const bad of ['0', '1.5', 'two']) {
      expect(() => readConfig({ ...env, RAW_READINGS_KEEP_MONTHS: bad })).toThrow(
        /RAW_READINGS_KEEP_MONTHS/,
      );
    }
  });
});
