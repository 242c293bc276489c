// One sensor's bad readings must never fail another sensor's: the group writer puts concurrent
// requests from different shops into one statement, so a row the database refuses has to be
// traced back to its own request. Also what a slow database does to ingest: a bounded queue
// (503 busy with Retry-After) and statement timeouts (503 storage_unavailable), never a hang.
import http from 'node:http';
import type { AddressInfo } from 'node:net';

import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { ReadingRow } from '@/db/queries/readings';
import { createReadingWriter } from '@/server/readings/writer';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';

const FAST = { ratePerS: 1e6, burst: 1e6 };

let t: TestApp;
let server: http.Server;
let baseUrl: string;

beforeAll(async () => {
  t = makeTestApp({ sensorRate: FAST });
  // One real server, so concurrent posts really are concurrent on one app and one writer.
  server = http.createServer(t.app).listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(async () => {
  server.closeAllConnections();
  await new Promise((resolve) => server.close(resolve));
  await t.pool.end();
});

type Owner = Awaited<ReturnType<typeof ownerWithSensor>>;

function row(o: Owner, at: Date): ReadingRow {
  return {
    sensorId: o.sensorId,
    shopId: o.shopId,
    zoneId: o.zoneId,
    at,
    airC: 15,
    rhPct: 60,
    surfaceC: 12,
    surfaceSource: 'probe',
    batteryV: null,
    dewPointC: 7.3,
    marginK: 4.7,
    emcPct: 11,
    level: 'dry',
  };
}

async function storedCount(sensorId: string): Promise<number> {
  const r = await t.pool.query<{ n: number }>(
    'select count(*)::int as n from readings where sensor_id = $1',
    [sensorId],
  );
  return r.rows[0]!.n;
}

/** A second connection that holds an exclusive lock on readings: inserts wait, reads pass. */
async function lockReadings() {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  await client.query('begin');
  await client.query('lock table readings in exclusive mode');
  let released = false;
  return {
    async release() {
      if (released) return;
      released = true;
      await client.query('rollback');
      await client.end();
    },
  };
}

describe('a group statement that fails', () => {
  it("fails only the request whose rows the database refused; the others' rows are stored", async () => {
    const bad = await ownerWithSensor(t);
    const good = await ownerWithSensor(t);
    const writer = createReadingWriter(t.pool);
    const base = Date.now() - 3_600_000;
    // Before PostgreSQL's timestamptz range (4713 BC): the ingest checks would stop it, so it
    // is handed to the writer directly, as a value the checks do not yet know of would be.
    const unstorable = new Date(Date.UTC(-5000, 0, 1));
    // Written in the same tick, so all three go into one group statement.
    const results = await Promise.allSettled([
      writer.write([row(good, new Date(base)), row(good, new Date(base + 1000))]),
      writer.write([row(bad, new Date(base)), row(bad, unstorable)]),
      writer.write([row(good, new Date(base + 2000))]),
    ]);
    await writer.close();

    expect(results[0]).toMatchObject({ status: 'fulfilled' });
    expect(results[2]).toMatchObject({ status: 'fulfilled' });
    if (results[0].status === 'fulfilled') expect(results[0].value.insertedMs.size).toBe(2);
    expect(results[1]).toMatchObject({
      status: 'rejected',
      reason: { status: 422, code: 'unstorable_reading' },
    });
    expect(await storedCount(good.sensorId)).toBe(3);
    // The bad request's statement failed whole: its storable row was not stored either.
    expect(await storedCount(bad.sensorId)).toBe(0);
  });

  it('rejects the whole group, without retrying each request, when the database is away', async () => {
    // Nothing listens on port 1: every connection is refused at once (ECONNREFUSED).
    const away = new pg.Pool({
      connectionString: 'postgres://postgres@127.0.0.1:1/none',
      connectionTimeoutMillis: 500,
    });
    const real = away.query.bind(away) as (...args: unknown[]) => unknown;
    let statements = 0;
    (away as unknown as { query: (...args: unknown[]) => unknown }).query = (...args) => {
      statements++;
      return real(...args);
    };
    const o = await ownerWithSensor(t);
    const writer = createReadingWriter(away);
    const at = Date.now() - 60_000;
    const results = await Promise.allSettled([
      writer.write([row(o, new Date(at))]),
      writer.write([row(o, new Date(at + 1000))]),
    ]);
    await writer.close();
    await away.end();
    for (const r of results) {
      expect(r).toMatchObject({ status: 'rejected', reason: { code: 'ECONNREFUSED' } });
    }
    // A transient failure is not the data's fault: one attempt for the group, no retries.
    expect(statements).toBe(1);
  });

  it('keeps one shop posting year-1 readings from failing another shop: 20 of 20 stored', async () => {
    const attacker = await ownerWithSensor(t);
    const victim = await ownerWithSensor(t);
    const base = Date.now() - 3_600_000;
    const rounds = await Promise.all(
      Array.from({ length: 20 }, (_, i) =>
        Promise.all([
          postIngest(baseUrl, attacker.token, { at: -62167219200, air: 14, rh: 60 }),
          postIngest(baseUrl, victim.token, {
            at: new Date(base + i * 60_000).toISOString(),
            air: 14,
            rh: 60,
            surface: 11,
          }),
        ]),
      ),
    );
    const victimStatuses = rounds.map(([, v]) => v.status);
    expect(victimStatuses.filter((s) => s === 202)).toHaveLength(20);
    for (const [a] of rounds) {
      expect(a.status).toBe(202);
      expect(a.body).toMatchObject({ stored: 0, rejected: [{ index: 0, code: 'time_too_early' }] });
    }
    expect(await storedCount(victim.sensorId)).toBe(20);
    expect(await storedCount(attacker.sensorId)).toBe(0);
  });
});

describe('a slow database', () => {
  it('answers 503 busy with Retry-After past the writer bound, and stores what it accepted', async () => {
    const bounded = makeTestApp({ sensorRate: FAST, writer: { maxPendingRows: 3 } });
    const o = await ownerWithSensor(bounded);
    const lock = await lockReadings();
    try {
      const base = Date.now() - 3_600_000;
      const posts = Array.from({ length: 10 }, (_, i) =>
        postIngest(bounded.app, o.token, {
          at: new Date(base + i * 60_000).toISOString(),
          air: 14,
          rh: 60,
          surface: 11,
        }).then((res) => res),
      );
      // The refused ones answer while the lock still holds the accepted ones back.
      const early = await Promise.race([
        Promise.all(posts),
        new Promise<null>((resolve) => setTimeout(() => resolve(null), 1500)),
      ]);
      expect(early, 'every post waited for the lock: the queue has no bound').toBeNull();
      await lock.release();
      const answers = await Promise.all(posts);
      const busy = answers.filter((r) => r.status === 503);
      expect(answers.filter((r) => r.status === 202)).toHaveLength(3);
      expect(busy).toHaveLength(7);
      for (const r of busy) {
        expect(r.headers['retry-after']).toMatch(/^\d+$/);
        expect(r.body).toMatchObject({
          error: {
            code: 'busy',
            message: expect.stringMatching(/retry/),
            // Every 5xx names its request, so an operator can find the log line.
            details: [{ path: 'requestId', message: r.headers['x-request-id'] }],
          },
        });
      }
      expect(await storedCount(o.sensorId)).toBe(3);
    } finally {
      await lock.release();
      await bounded.pool.end();
    }
  });

  it.each([
    ['statement_timeout', { statementTimeoutMs: 300 }],
    ['query_timeout (client side)', { statementTimeoutMs: 60_000, queryTimeoutMs: 300 }],
  ])('answers 503 storage_unavailable within a bound when %s fires', async (_name, timeouts) => {
    const slow = makeTestApp({ sensorRate: FAST, ...timeouts });
    const o = await ownerWithSensor(slow);
    const lock = await lockReadings();
    // Without a timeout the post would wait for the lock; it goes after 5 s whatever happens.
    const unlock = setTimeout(() => void lock.release(), 5000);
    try {
      const startedMs = Date.now();
      const res = await postIngest(slow.app, o.token, { air: 14, rh: 60, surface: 11 });
      const tookMs = Date.now() - startedMs;
      expect(res.status, res.text).toBe(503);
      expect(res.body).toMatchObject({ error: { code: 'storage_unavailable' } });
      expect(tookMs).toBeLessThan(3000);
    } finally {
      clearTimeout(unlock);
      await lock.release();
      await slow.pool.end();
    }
  });
});
