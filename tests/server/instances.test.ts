// Two server instances on one database, as behind a load balancer: live fan-out and token
// revocation go through PostgreSQL, so neither depends on which instance a request hits.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import WebSocket from 'ws';

import { ownerWithSensor } from '../support/app';
import { postIngest } from '../support/ingest';
import { startInstance } from '../support/liveServer';
import { signInCookie } from '../support/sessionCookie';

type Instance = Awaited<ReturnType<typeof startInstance>>;
let a: Instance;
let b: Instance;

beforeAll(async () => {
  [a, b] = await Promise.all([startInstance(), startInstance()]);
});
afterAll(async () => {
  await Promise.all([a?.close(), b?.close()]);
});

/** Signs in on an instance and returns the session cookie, as a browser would hold it. */
const sessionCookie = (baseUrl: string, email: string, password: string) =>
  signInCookie(baseUrl, { email, password });

function openSocket(
  baseUrl: string,
  cookie: string,
  query = '',
): Promise<{ ws: WebSocket; messages: unknown[] }> {
  const messages: unknown[] = [];
  const ws = new WebSocket(`${baseUrl.replace('http', 'ws')}/api/v1/live${query}`, {
    headers: { cookie },
  });
  ws.on('message', (data) => messages.push(JSON.parse(String(data))));
  return new Promise((resolve, reject) => {
    ws.on('open', () => resolve({ ws, messages }));
    ws.on('error', reject);
  });
}

async function waitFor<T>(probe: () => T | undefined, timeoutMs: number): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = probe();
    if (value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`nothing within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 10));
  }
}

describe('two instances on one database', () => {
  it('delivers a reading posted to one instance to a WebSocket client of the other', async () => {
    const o = await ownerWithSensor(a.app);
    const cookie = await sessionCookie(b.baseUrl, o.email, o.password);
    expect(cookie).toMatch(/^drybench_session=/);
    const { ws, messages } = await openSocket(b.baseUrl, cookie);
    try {
      const at = new Date(Date.now() - 1000).toISOString();
      await postIngest(a.baseUrl, o.token, { at, air: 16.5, rh: 64, surface: 12 }).expect(202);
      const message = await waitFor(
        () =>
          messages.find(
            (m): m is { type: string; zoneId: string; reading: { at: string; air: number } } =>
              (m as { type?: string }).type === 'reading',
          ),
        2000,
      );
      expect(message.zoneId).toBe(o.zoneId);
      expect(message.reading).toMatchObject({ at, air: 16.5 });
    } finally {
      ws.close();
    }
  });

  it("never sends a client another shop's readings", async () => {
    const mine = await ownerWithSensor(a.app);
    const theirs = await ownerWithSensor(a.app);
    const cookie = await sessionCookie(b.baseUrl, mine.email, mine.password);
    const { ws, messages } = await openSocket(b.baseUrl, cookie);
    try {
      await postIngest(a.baseUrl, theirs.token, { air: 20, rh: 40 }).expect(202);
      await postIngest(a.baseUrl, mine.token, { air: 21, rh: 41 }).expect(202);
      await waitFor(() => messages.find((m) => (m as { type?: string }).type === 'reading'), 2000);
      // Mine arrived after theirs was committed; theirs must not be among what came.
      const shops = messages
        .filter((m) => (m as { type?: string }).type === 'reading')
        .map((m) => (m as { shopId: string }).shopId);
      expect(shops).toEqual([mine.shopId]);
    } finally {
      ws.close();
    }
  });

  it('refuses a token revoked on one instance on the other within 1 s', async () => {
    const o = await ownerWithSensor(a.app);
    const post = () => postIngest(b.baseUrl, o.token, { air: 18, rh: 50 });
    // Instance B now holds the token in its cache.
    expect((await post()).status).toBe(202);
    await o.agent.delete(`/api/v1/shops/${o.shopId}/sensors/${o.sensorId}/token`).expect(204);
    const revokedAtMs = Date.now();
    let status = 0;
    while (Date.now() - revokedAtMs < 1000) {
      status = (await post()).status;
      if (status === 401) break;
      await new Promise((r) => setTimeout(r, 20));
    }
    expect(status).toBe(401);
  });

  /** Posts to instance B until it answers 401 or a second has passed since `sinceMs`. */
  async function statusWithinOneSecond(post: () => Promise<{ status: number }>, sinceMs: number) {
    let status = 0;
    while (Date.now() - sinceMs < 1000) {
      status = (await post()).status;
      if (status === 401) break;
      await new Promise((r) => setTimeout(r, 20));
    }
    return status;
  }

  it('refuses the tokens of a shop deleted on one instance on the other within 1 s', async () => {
    const o = await ownerWithSensor(a.app);
    const post = () => postIngest(b.baseUrl, o.token, { air: 18, rh: 50 });
    expect((await post()).status).toBe(202);
    await o.agent
      .delete(`/api/v1/shops/${o.shopId}`)
      .send({ confirmName: 'Test shop' })
      .expect(204);
    expect(await statusWithinOneSecond(post, Date.now())).toBe(401);
  });

  it('refuses the token of a sensor removed on one instance on the other within 1 s', async () => {
    const o = await ownerWithSensor(a.app);
    const post = () => postIngest(b.baseUrl, o.token, { air: 18, rh: 50 });
    expect((await post()).status).toBe(202);
    await o.agent.delete(`/api/v1/shops/${o.shopId}/sensors/${o.sensorId}`).expect(204);
    expect(await statusWithinOneSecond(post, Date.now())).toBe(401);
  });

  it('sends a reconnecting client, per zone, the newest reading it missed and how many', async () => {
    const o = await ownerWithSensor(a.app);
    const cookie = await sessionCookie(b.baseUrl, o.email, o.password);
    const lastSeen = new Date(Date.now() - 10 * 60_000);
    const missed = [3, 2, 1].map((minutesAgo) => ({
      at: new Date(Date.now() - minutesAgo * 60_000).toISOString(),
      air: 20 - minutesAgo,
      rh: 50,
    }));
    await postIngest(a.baseUrl, o.token, { readings: missed }).expect(202);
    const { ws, messages } = await openSocket(
      b.baseUrl,
      cookie,
      `?since=${lastSeen.toISOString()}`,
    );
    try {
      const replayed = await waitFor(
        () =>
          messages.find((m) => (m as { type?: string }).type === 'reading') as
            { zoneId: string; count: number; reading: { at: string; air: number } } | undefined,
        2000,
      );
      expect(replayed).toMatchObject({ zoneId: o.zoneId, count: 3 });
      expect(replayed.reading).toMatchObject({ at: missed[2]!.at, air: 19 });
    } finally {
      ws.close();
    }
  });

  it('tells about the new readings only when a batch repeats some', async () => {
    const o = await ownerWithSensor(a.app);
    const cookie = await sessionCookie(b.baseUrl, o.email, o.password);
    const first = { at: new Date(Date.now() - 120_000).toISOString(), air: 14, rh: 60 };
    const second = { at: new Date(Date.now() - 60_000).toISOString(), air: 15, rh: 60 };
    const post = (readings: object[]) => postIngest(a.baseUrl, o.token, { readings });
    await post([first]).expect(202);
    const { ws, messages } = await openSocket(b.baseUrl, cookie);
    try {
      const res = await post([first, second]).expect(202);
      expect(res.body).toMatchObject({ stored: 1, duplicates: 1 });
      const message = await waitFor(
        () =>
          messages.find((m) => (m as { type?: string }).type === 'reading') as
            { count: number; reading: { at: string } } | undefined,
        2000,
      );
      expect(message.count).toBe(1);
      expect(message.reading.at).toBe(second.at);
      // An all-duplicate retry tells nobody anything.
      await post([first, second]).expect(202);
      await new Promise((r) => setTimeout(r, 300));
      expect(messages.filter((m) => (m as { type?: string }).type === 'reading')).toHaveLength(1);
    } finally {
      ws.close();
    }
  });

  it('refuses a WebSocket without a session', async () => {
    await expect(openSocket(b.baseUrl, '')).rejects.toThrow(/401/);
  });
});
