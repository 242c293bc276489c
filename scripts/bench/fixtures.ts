/**
 * The bench's shops, made through the public HTTP API like a person would.
 *
 * - A watched shop: one zone and a few probe sensors, whose owner's 200 browsers hold live
 *   sockets. The probe rotates over its sensors to stay inside the per-sensor rate limit.
 * - A fleet, owned by someone else: shops of 10 zones with 5 sensors each, which carry the
 *   throughput load and the background load. Hundreds of sensors, because each may post only
 *   10 requests a second (server/auth/sensorRateLimit.ts), and many zones, because the alarm
 *   engine serializes the batches of one zone; none of the watched shop's browsers is a member,
 *   so the hub sends them none of this traffic (1,000 readings/s is many shops' worth).
 */
import { randomUUID } from 'node:crypto';

import { SESSION_COOKIE } from '@/server/auth/session';

export interface FleetSensor {
  sensorId: string;
  shopId: string;
  zoneId: string;
  token: string;
}

export interface BenchFixtures {
  /** `drybench_session=…` of the watched shop's owner, for the WebSocket clients. */
  cookie: string;
  probeTokens: string[];
  fleet: FleetSensor[];
}

const ZONES_PER_SHOP = 10;
const SENSORS_PER_ZONE = 5;
// Requests in flight while setting up: quick, without queueing hundreds at the server.
const SETUP_CONCURRENCY = 8;

export async function call<T>(baseUrl: string, path: string, body: unknown, cookie?: string) {
  const res = await fetch(`${baseUrl}/api/v1${path}`, {
    method: 'POST',
    headers: {
      'content-type': 'application/json',
      origin: baseUrl,
      ...(cookie ? { cookie } : {}),
    },
    body: JSON.stringify(body),
  });
  if (!res.ok) throw new Error(`POST ${path}: ${res.status} ${await res.text()}`);
  return { body: (await res.json()) as T, setCookies: res.headers.getSetCookie() };
}

/**
 * Signs up a new owner, then signs in with the password (sign-up starts no session: its link
 * comes by e-mail, and an unverified account may sign in); returns the cookie (`name=value`).
 */
export async function signUp(baseUrl: string, name: string): Promise<string> {
  const credentials = {
    email: `bench-${randomUUID()}@bench.example`,
    password: 'bench-password-1',
  };
  await call(baseUrl, '/auth/sign-up', { ...credentials, name });
  const res = await call<{ user: { id: string } }>(baseUrl, '/auth/sign-in', credentials);
  const session = res.setCookies
    .map((c) => c.split(';')[0]!)
    .find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  if (!session) throw new Error('sign-in set no session cookie');
  return session;
}

async function inBatches<T, R>(items: T[], each: (item: T) => Promise<R>): Promise<R[]> {
  const results: R[] = [];
  for (let i = 0; i < items.length; i += SETUP_CONCURRENCY) {
    results.push(...(await Promise.all(items.slice(i, i + SETUP_CONCURRENCY).map(each))));
  }
  return results;
}

type Post = <T>(path: string, body: unknown) => Promise<T>;

export async function createFixtures(
  baseUrl: string,
  counts: { probeSensors: number; fleetSensors: number },
): Promise<BenchFixtures> {
  const owner = async (name: string) => {
    const session = await signUp(baseUrl, name);
    const post: Post = <T>(path: string, body: unknown) =>
      call<T>(baseUrl, path, body, session).then((r) => r.body);
    return { session, post };
  };
  const sensorsIn = (post: Post, shopId: string, zoneIds: string[]) =>
    inBatches(zoneIds, async (zoneId) => {
      const s = await post<{ id: string; token: string }>(`/shops/${shopId}/sensors`, {
        name: 'Sensor',
        zoneId,
      });
      return { sensorId: s.id, shopId, zoneId, token: s.token };
    });

  const watcher = await owner('Watched shop owner');
  const watched = await watcher.post<{ id: string }>('/shops', {
    name: 'Watched shop',
    timeZone: 'UTC',
  });
  const watchedZone = await watcher.post<{ id: string }>(`/shops/${watched.id}/zones`, {
    name: 'Machine room',
  });
  const probes = await sensorsIn(
    watcher.post,
    watched.id,
    Array.from({ length: counts.probeSensors }, () => watchedZone.id),
  );

  const fleetOwner = await owner('Fleet owner');
  const fleet: FleetSensor[] = [];
  for (let s = 0; fleet.length < counts.fleetSensors; s++) {
    const shop = await fleetOwner.post<{ id: string }>('/shops', {
      name: `Fleet shop ${s + 1}`,
      timeZone: 'UTC',
    });
    const sensorCount = Math.min(
      ZONES_PER_SHOP * SENSORS_PER_ZONE,
      counts.fleetSensors - fleet.length,
    );
    const zones = await inBatches(
      Array.from({ length: Math.ceil(sensorCount / SENSORS_PER_ZONE) }, (_, z) => z),
      (z) => fleetOwner.post<{ id: string }>(`/shops/${shop.id}/zones`, { name: `Zone ${z + 1}` }),
    );
    const zoneOfEach = Array.from(
      { length: sensorCount },
      (_, i) => zones[Math.floor(i / SENSORS_PER_ZONE)]!.id,
    );
    fleet.push(...(await sensorsIn(fleetOwner.post, shop.id, zoneOfEach)));
  }
  return { cookie: watcher.session, probeTokens: probes.map((p) => p.token), fleet };
}
