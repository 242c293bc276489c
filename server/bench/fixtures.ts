/**
 * The bench's shops, made through the public HTTP API like a person would: a watched shop (the
 * load sensors, the probe sensor and the 200 browsers of its owner) and, owned by someone else,
 * a second shop whose sensors make the background load. 1,000 readings/s is many shops' worth,
 * not one shop's, and the hub sends the watched shop's browsers none of it — if they were
 * members of the background shop, the bench would measure 200,000 WebSocket messages a second.
 */
import { randomUUID } from 'node:crypto';

import { SESSION_COOKIE } from '../auth/session';

export interface BenchFixtures {
  /** `drybench_session=…`, for the WebSocket clients. */
  cookie: string;
  watchedShopId: string;
  /** Tokens of the watched shop's load sensors; the load spreads over them round-robin. */
  loadTokens: string[];
  /** Sensor ids behind `loadTokens`, with their shop and zone, for the raw INSERT baseline. */
  loadSensors: { sensorId: string; shopId: string; zoneId: string }[];
  probeToken: string;
  backgroundTokens: string[];
}

async function call<T>(baseUrl: string, path: string, body: unknown, cookie?: string) {
  const res = await fetch(`${baseUrl}/api/v1${path}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', ...(cookie ? { cookie } : {}) },
    body: JSON.stringify(body),
  });
  if (!res.ok) throw new Error(`POST ${path}: ${res.status} ${await res.text()}`);
  return { body: (await res.json()) as T, setCookies: res.headers.getSetCookie() };
}

/** Signs up a new owner; returns the session cookie (`name=value`). */
async function signUp(baseUrl: string, name: string): Promise<string> {
  const res = await call<{ user: { id: string } }>(baseUrl, '/auth/sign-up', {
    email: `bench-${randomUUID()}@bench.example`,
    password: 'bench-password-1',
    name,
  });
  const session = res.setCookies
    .map((c) => c.split(';')[0]!)
    .find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  if (!session) throw new Error('sign-up set no session cookie');
  return session;
}

export async function createFixtures(
  baseUrl: string,
  counts: { loadSensors: number; backgroundSensors: number },
): Promise<BenchFixtures> {
  const shopWithSensors = async (shopName: string, sensorCount: number) => {
    const session = await signUp(baseUrl, `${shopName} owner`);
    const post = <T>(path: string, body: unknown) =>
      call<T>(baseUrl, path, body, session).then((r) => r.body);
    const shop = await post<{ id: string }>('/shops', { name: shopName, timeZone: 'UTC' });
    const zone = await post<{ id: string }>(`/shops/${shop.id}/zones`, { name: 'Machine room' });
    const sensors: { id: string; token: string }[] = [];
    for (let i = 0; i < sensorCount; i++) {
      sensors.push(
        await post(`/shops/${shop.id}/sensors`, { name: `Sensor ${i + 1}`, zoneId: zone.id }),
      );
    }
    return { session, shopId: shop.id, zoneId: zone.id, sensors };
  };

  const watched = await shopWithSensors('Bench shop', counts.loadSensors + 1);
  const background = await shopWithSensors('Background shop', counts.backgroundSensors);
  const [probe, ...load] = watched.sensors;
  return {
    cookie: watched.session,
    watchedShopId: watched.shopId,
    loadTokens: load.map((s) => s.token),
    loadSensors: load.map((s) => ({
      sensorId: s.id,
      shopId: watched.shopId,
      zoneId: watched.zoneId,
    })),
    probeToken: probe!.token,
    backgroundTokens: background.sensors.map((s) => s.token),
  };
}
