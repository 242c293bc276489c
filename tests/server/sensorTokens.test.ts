// The sensor token cache: an unknown token costs one query per interval, not one per post; a
// token created afterwards works at once; removing a sensor keeps its readings as history.
import { randomUUID } from 'node:crypto';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { startNotificationListener } from '@/db/listener';
import { insertSensor, revokeSensorToken } from '@/db/queries/sensors';
import { createSensorTokenCache, hashToken, newSensorToken } from '@/server/auth/sensorTokens';
import { silentLogger } from '@/server/logger';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp({ sensorRate: { ratePerS: 1e6, burst: 1e6 } });
});
afterAll(() => t.pool.end());

/**
 * Counts the statements that look a sensor up by token hash, by observing the pool every query
 * of the app goes through; returns the counter and a function that stops observing.
 */
function countTokenLookups() {
  const pool = t.pool as unknown as { query: (...args: unknown[]) => unknown };
  const original = pool.query;
  const counter = { n: 0 };
  pool.query = function (this: unknown, ...args: unknown[]) {
    const first = args[0];
    const text = typeof first === 'string' ? first : (first as { text?: string }).text;
    if (text && /"token_hash" = \$1/.test(text)) counter.n++;
    return original.apply(this, args);
  };
  return { counter, stop: () => void (pool.query = original) };
}

describe('unknown sensor tokens', () => {
  it('cost at most one lookup for 100 posts with the same unknown token', async () => {
    const unknown = newSensorToken();
    const { counter, stop } = countTokenLookups();
    try {
      const body = { air: 12, rh: 60 };
      // Half at once (they share one lookup in flight), half one after another (remembered).
      const together = await Promise.all(
        Array.from({ length: 50 }, () => postIngest(t.app, unknown, body)),
      );
      const inTurn = [];
      for (let i = 0; i < 50; i++) inTurn.push(await postIngest(t.app, unknown, body));
      for (const res of [...together, ...inTurn]) {
        expect(res.status).toBe(401);
        expect(res.body.error.code).toBe('invalid_token');
      }
      expect(counter.n).toBeLessThanOrEqual(1);
    } finally {
      stop();
    }
  });

  it("lets a freshly created sensor's token work at once", async () => {
    const o = await ownerWithSensor(t);
    await postIngest(t.app, o.token, { air: 12, rh: 60, surface: 10 }).expect(202);
  });

  it('forgets an unknown hash when a token with that hash is created (invalidate)', async () => {
    const o = await ownerWithSensor(t);
    const tokens = createSensorTokenCache(t.db);
    const token = newSensorToken();
    expect(await tokens.resolve(token)).toBeNull();
    await insertSensor(t.db, {
      shopId: o.shopId,
      zoneId: o.zoneId,
      name: 'Late probe',
      tokenHash: hashToken(token),
    });
    // Still remembered as unknown: the negative entry is what spares the database.
    expect(await tokens.resolve(token)).toBeNull();
    await tokens.invalidate(hashToken(token));
    expect(await tokens.resolve(token)).toMatchObject({ shopId: o.shopId, zoneId: o.zoneId });
  });

  it('asks again after the interval, and keeps at most maxUnknown hashes (oldest out)', async () => {
    let nowMs = 1_000_000;
    const tokens = createSensorTokenCache(t.db, {
      unknownTtlMs: 30_000,
      maxUnknown: 2,
      now: () => nowMs,
    });
    const [x, y, z] = [newSensorToken(), newSensorToken(), newSensorToken()];
    const { counter, stop } = countTokenLookups();
    try {
      await tokens.resolve(x);
      await tokens.resolve(x);
      expect(counter.n).toBe(1);
      nowMs += 30_001;
      await tokens.resolve(x);
      expect(counter.n).toBe(2);
      await tokens.resolve(y);
      await tokens.resolve(z); // x, the oldest, leaves
      expect(counter.n).toBe(4);
      await tokens.resolve(z);
      await tokens.resolve(y);
      expect(counter.n).toBe(4);
      await tokens.resolve(x);
      expect(counter.n).toBe(5);
    } finally {
      stop();
    }
  });
});

describe('a known token past half its TTL', () => {
  // Our own rule (server/auth/sensorTokens.ts): a busy sensor never waits for the re-check, and
  // no answer is older than the TTL. The clock is frozen, so each step is exact.
  it('is answered from the cache while one re-check runs behind it, and a revocation it finds bites', async () => {
    const o = await ownerWithSensor(t);
    let nowMs = 5_000_000;
    const tokens = createSensorTokenCache(t.db, { ttlMs: 1000, now: () => nowMs });
    const { counter, stop } = countTokenLookups();
    const settle = () => new Promise((resolve) => setTimeout(resolve, 200));
    try {
      expect(await tokens.resolve(o.token)).toMatchObject({ sensorId: o.sensorId });
      expect(counter.n).toBe(1);
      nowMs += 400; // under half its life: no query
      await tokens.resolve(o.token);
      expect(counter.n).toBe(1);

      nowMs += 200; // 600 ms old: answered now, one re-check started however many ask
      const answers = await Promise.all([1, 2, 3].map(() => tokens.resolve(o.token)));
      for (const a of answers) expect(a).toMatchObject({ sensorId: o.sensorId });
      expect(counter.n).toBe(2);
      await settle();

      // Revoked without telling this cache: the entry refreshed at 600 ms is believed until
      // its next re-check, which finds the revocation.
      await revokeSensorToken(t.db, o.shopId, o.sensorId);
      nowMs += 600; // 600 ms into the refreshed entry: answered, and re-checked behind it
      expect(await tokens.resolve(o.token)).toMatchObject({ sensorId: o.sensorId });
      expect(counter.n).toBe(3);
      await settle();
      expect(await tokens.resolve(o.token)).toBeNull();
    } finally {
      stop();
    }
  });
});

describe('removing a sensor', () => {
  it('takes it off the list and refuses its token, but keeps its readings', async () => {
    const o = await ownerWithSensor(t);
    const at = new Date(Date.now() - 60_000).toISOString();
    await postIngest(t.app, o.token, { at, air: 12, rh: 60, surface: 10 }).expect(202);
    const path = `/api/v1/shops/${o.shopId}/sensors/${o.sensorId}`;
    await o.agent.delete(path).expect(204);

    await postIngest(t.app, o.token, { air: 12, rh: 60 }).expect(401);
    const list = await o.agent.get(`/api/v1/shops/${o.shopId}/sensors`).expect(200);
    expect(list.body.sensors).toEqual([]);
    const series = await o.agent
      .get(`/api/v1/shops/${o.shopId}/zones/${o.zoneId}/readings`)
      .query({ from: new Date(Date.now() - 3_600_000).toISOString(), to: new Date().toISOString() })
      .expect(200);
    expect(series.body.points.map((p: { at: string }) => p.at)).toEqual([at]);

    // Gone for every other action: a second removal, a new token, a rename.
    const again = await o.agent.delete(path).expect(404);
    expect(again.body.error).toMatchObject({ code: 'not_found' });
    await o.agent.post(`${path}/token`).expect(404);
    await o.agent.patch(path).send({ name: 'Back again' }).expect(404);
  });

  it('answers 404 for an id that is not a sensor of the shop', async () => {
    const o = await ownerWithSensor(t);
    await o.agent.delete(`/api/v1/shops/${o.shopId}/sensors/not-a-uuid`).expect(404);
    await o.agent
      .delete(`/api/v1/shops/${o.shopId}/sensors/00000000-0000-4000-8000-000000000000`)
      .expect(404);
  });
});

describe('after the LISTEN connection comes back', () => {
  it('forgets cached tokens, so a revocation sent while it was down takes effect', async () => {
    const name = `drybench-tokens-${randomUUID().slice(0, 8)}`;
    const url = new URL(process.env.DATABASE_URL!);
    url.searchParams.set('application_name', name);
    const listener = startNotificationListener(url.toString(), silentLogger());
    try {
      await listener.ready;
      // A long TTL: without the reconnect rule the revoked token would be served from cache.
      const cache = createSensorTokenCache(t.db, { listener, ttlMs: 3_600_000 });
      const o = await ownerWithSensor(t);
      expect(await cache.resolve(o.token)).not.toBeNull();

      const backends = () =>
        t.pool.query('select pid from pg_stat_activity where application_name = $1', [name]);
      const before = (await backends()).rows[0]?.pid as number;
      await t.pool.query('select pg_terminate_backend($1)', [before]);
      // Revoked while nobody listens: no notification reaches this instance.
      await t.pool.query('update sensors set revoked_at = now() where id = $1', [o.sensorId]);
      const deadline = Date.now() + 10_000;
      for (;;) {
        const pid = (await backends()).rows[0]?.pid as number | undefined;
        if (pid !== undefined && pid !== before && (await cache.resolve(o.token)) === null) break;
        if (Date.now() > deadline) throw new Error('the revoked token was still served');
        await new Promise((r) => setTimeout(r, 50));
      }
    } finally {
      await listener.close();
    }
  });
});
