/**
 * PostgreSQL's CPU per one-reading request as the group writer's group grows, counted rather
 * than timed: the CPU time (utime + stime, /proc) of every process of the cluster — the writing
 * backend, the backend that feeds our LISTEN connection, the WAL writer and the rest — over K
 * groups of g requests, each group the writer's one statement (db/queries/readings.ts) with one
 * live message per request, committed with synchronous_commit on, one group at a time. Counted
 * work does not depend on how busy the machine is, which `npm run bench` figures do.
 *
 *   DATABASE_URL=postgres://…/an_empty_migrated_db npx tsx scripts/bench/groupCost.ts
 *
 * COST_SIZES (default 1,5,10,20,50) and COST_ROUNDS (3, sizes in alternating order) choose the
 * groups; COST_SILENT=1 adds each size without its live messages, to see what NOTIFY costs.
 *
 * It adds a shop, a zone and 60 sensors to that database and their readings; use a throwaway one.
 */
import { randomBytes, randomUUID } from 'node:crypto';
import fs from 'node:fs';

import pg from 'pg';

import { insertReadingGroup, type ReadingRow } from '@/db/queries/readings';
import { LIVE_CHANNEL } from '@/db/notify';
import { readingMessage } from '@/server/live/messages';

const GROUP_SIZES = (process.env.COST_SIZES ?? '1,5,10,20,50').split(',').map(Number);
const REQUESTS_PER_SIZE = 1000;
const ROUNDS = Number(process.env.COST_ROUNDS ?? 3);
const SENSORS = 60;
// Linux's USER_HZ: /proc/<pid>/stat counts CPU time in ticks of 10 ms.
const TICK_US = 10_000;

function cpuTicks(pid: number): number {
  const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  // utime and stime are fields 14 and 15 of stat(5); fields[0] here is field 3.
  return Number(fields[11]) + Number(fields[12]);
}

function parentOf(pid: number): number {
  return Number(fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')[1]);
}

/** Every process of the cluster: the postmaster's children (backends and helpers). */
function clusterPids(postmaster: number): number[] {
  return fs
    .readdirSync('/proc')
    .filter((d) => /^\d+$/.test(d))
    .map(Number)
    .filter((pid) => {
      try {
        return parentOf(pid) === postmaster;
      } catch {
        return false;
      }
    });
}

function ticksOf(pids: number[]): Map<number, number> {
  const out = new Map<number, number>();
  for (const pid of pids) {
    try {
      out.set(pid, cpuTicks(pid));
    } catch {
      // Ended meanwhile (a short-lived helper): its time is not counted on either side.
    }
  }
  return out;
}

async function main() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('set DATABASE_URL to a throwaway, migrated database');
  const writer = new pg.Client({ connectionString: url });
  const listener = new pg.Client({ connectionString: url });
  await writer.connect();
  await listener.connect();
  const writerPid = (await writer.query<{ pid: number }>('select pg_backend_pid() as pid')).rows[0]!
    .pid;
  const listenerPid = (await listener.query<{ pid: number }>('select pg_backend_pid() as pid'))
    .rows[0]!.pid;
  const postmaster = parentOf(writerPid);
  let heard = 0;
  listener.on('notification', () => heard++);
  await listener.query(`listen ${LIVE_CHANNEL}`);

  const shopId = randomUUID();
  const zoneId = randomUUID();
  await writer.query(
    `insert into shops (id, name, time_zone) values ($1, 'Tamarack cost', 'UTC')`,
    [shopId],
  );
  await writer.query(`insert into zones (id, shop_id, name) values ($1, $2, 'Machine room')`, [
    zoneId,
    shopId,
  ]);
  const sensorIds = Array.from({ length: SENSORS }, () => randomUUID());
  for (const [i, id] of sensorIds.entries()) {
    await writer.query(
      `insert into sensors (id, shop_id, zone_id, name, token_hash) values ($1, $2, $3, $4, $5)`,
      [id, shopId, zoneId, `cost ${i}`, randomBytes(16).toString('hex')],
    );
  }

  // A pool of one: insertReadingGroup takes a pool, and one client keeps one backend to watch.
  const pool = new pg.Pool({ connectionString: url, max: 1 });
  const poolPid = (await pool.query<{ pid: number }>('select pg_backend_pid() as pid')).rows[0]!
    .pid;
  let atMs = Date.now() - 3_600_000;
  const group = (g: number): { rows: ReadingRow[]; messages: string[] } => {
    const rows: ReadingRow[] = [];
    for (let i = 0; i < g; i++) {
      atMs += 1;
      const at = new Date(atMs);
      rows.push({
        sensorId: sensorIds[i % SENSORS]!,
        shopId,
        zoneId,
        at,
        atIso: at.toISOString(),
        airC: 14.2,
        rhPct: 61.5,
        surfaceC: 12.9,
        surfaceSource: 'probe',
        batteryV: 3.01,
        dewPointC: 6.8,
        marginK: 6.1,
        emcPct: 11.4,
        level: 'dry',
      });
    }
    // One live message per request, as the writer builds them.
    return { rows, messages: rows.map((r) => JSON.stringify(readingMessage([r]))) };
  };

  for (let round = 0; round < ROUNDS; round++) {
    const sizes = round % 2 === 0 ? GROUP_SIZES : [...GROUP_SIZES].reverse();
    for (const g of sizes) {
      for (const notifying of process.env.COST_SILENT ? [true, false] : [true]) {
        const groups = Math.ceil(REQUESTS_PER_SIZE / g);
        const pids = clusterPids(postmaster);
        const heardBefore = heard;
        const before = ticksOf(pids);
        const t0 = performance.now();
        for (let k = 0; k < groups; k++) {
          const { rows, messages } = group(g);
          await insertReadingGroup(pool, rows, notifying ? messages : []);
        }
        const wallMs = performance.now() - t0;
        // The listener's backend may still be sending: wait until every message is heard.
        while (notifying && heard - heardBefore < groups * g) {
          await new Promise((resolve) => setTimeout(resolve, 5));
        }
        const after = ticksOf(pids);
        let all = 0;
        for (const [pid, t] of after) all += t - (before.get(pid) ?? t);
        const of = (pid: number) => (after.get(pid) ?? 0) - (before.get(pid) ?? 0);
        const requests = groups * g;
        const key = `${String(g).padStart(2)} ${notifying ? 'notify ' : 'silent '}`;
        const perRequestUs = (ticks: number) => (ticks * TICK_US) / requests;
        const row = [
          perRequestUs(all),
          perRequestUs(of(poolPid)),
          perRequestUs(of(listenerPid)),
          perRequestUs(all - of(poolPid) - of(listenerPid)),
          wallMs / groups,
        ];
        console.log(
          `round ${round + 1}, ${key}: PostgreSQL ${row[0]!.toFixed(0)} µs/request (writer ${row[1]!.toFixed(0)}, ` +
            `listener ${row[2]!.toFixed(0)}, others ${row[3]!.toFixed(0)}), ${row[4]!.toFixed(2)} ms/statement`,
        );
      }
    }
  }
  await pool.end();
  await writer.end();
  await listener.end();
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
