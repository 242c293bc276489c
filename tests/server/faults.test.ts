// PostgreSQL stopped and restarted while sensors keep posting. Requests during the outage get
// a prompt 503 (the sensor keeps its readings and retries); afterwards every reading that was
// ever answered 202 is in the database exactly once. This test runs its own PostgreSQL, since
// it stops it.
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createDatabase } from '@/db';
import { runMigrations } from '@/db/migrate';

import { ownerWithSensor } from '../support/app';
import { startInstance } from '../support/liveServer';

const run = promisify(execFile);
const PG_PORT = Number(process.env.TEST_PG_PORT ?? 54330) + 7;
const db = (cmd: 'start' | 'stop') =>
  run('bash', ['scripts/db.sh', cmd, 'faults', String(PG_PORT), 'drybench_faults']);

let url: string;
let instance: Awaited<ReturnType<typeof startInstance>>;

beforeAll(async () => {
  url = (await db('start')).stdout.trim();
  // A fresh database every run, as for the shared test database.
  const admin = createDatabase(url.replace(/\/drybench_faults$/, '/postgres'), { max: 1 });
  await admin.pool.query('drop database if exists drybench_faults with (force)');
  await admin.pool.query('create database drybench_faults');
  await admin.pool.end();
  const { pool, db: drizzleDb } = createDatabase(url, { max: 1 });
  await runMigrations(drizzleDb);
  await pool.end();
  instance = await startInstance({ databaseUrl: url, sensorRate: { ratePerS: 1e6, burst: 1e6 } });
}, 60_000);

afterAll(async () => {
  await instance?.close();
  await db('stop');
});

interface Outcome {
  at: string;
  status: number;
  ms: number;
}

describe('a database outage under load', () => {
  it('answers 503 promptly while PostgreSQL is down and loses no acknowledged reading', async () => {
    const o = await ownerWithSensor(instance.app);
    const outcomes: Outcome[] = [];
    let atMs = Date.now() - 3_600_000;
    let running = true;

    async function sensorLoop() {
      while (running) {
        const at = new Date((atMs += 10)).toISOString();
        const startedMs = Date.now();
        let status = 0;
        try {
          const res = await fetch(`${instance.baseUrl}/api/v1/ingest`, {
            method: 'POST',
            headers: { authorization: `Bearer ${o.token}`, 'content-type': 'application/json' },
            body: JSON.stringify({ at, air: 15, rh: 60, surface: 12 }),
          });
          status = res.status;
          await res.arrayBuffer();
        } catch {
          status = -1; // the server itself must stay up, so this fails the test below
        }
        outcomes.push({ at, status, ms: Date.now() - startedMs });
        if (status !== 202) await new Promise((r) => setTimeout(r, 20));
      }
    }

    const loops = Array.from({ length: 4 }, sensorLoop);
    await new Promise((r) => setTimeout(r, 1500));
    await db('stop');
    const downAtIndex = outcomes.length;
    await new Promise((r) => setTimeout(r, 2000));
    await db('start');
    const upAtIndex = outcomes.length;
    // Give the pool time to reconnect and the sensors time to post again.
    await new Promise((r) => setTimeout(r, 2500));
    running = false;
    await Promise.all(loops);

    const statuses = new Set(outcomes.map((x) => x.status));
    expect([...statuses].sort()).toEqual([202, 503]);
    const during = outcomes.slice(downAtIndex, upAtIndex);
    expect(during.filter((x) => x.status === 503).length).toBeGreaterThan(0);
    // Prompt: no request waits anywhere near a sensor's timeout.
    expect(Math.max(...outcomes.map((x) => x.ms))).toBeLessThan(5000);
    // Posting works again after the restart.
    expect(outcomes.slice(-5).every((x) => x.status === 202)).toBe(true);

    const acked = outcomes.filter((x) => x.status === 202).map((x) => x.at);
    const { pool } = createDatabase(url, { max: 1 });
    const stored = await pool.query<{ at: Date; n: number }>(
      `select at, count(*)::int as n from readings where sensor_id = $1 group by at`,
      [o.sensorId],
    );
    await pool.end();
    const storedAts = new Set(stored.rows.map((r) => r.at.toISOString()));
    expect(acked.filter((at) => !storedAts.has(at))).toEqual([]);
    expect(stored.rows.every((r) => r.n === 1)).toBe(true);
  }, 60_000);
});
