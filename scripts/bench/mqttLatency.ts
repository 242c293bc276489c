/**
 * MQTT publish → WebSocket latency (`mqttP99Ms`): fleet sensors connect to our broker as
 * devices do and publish one reading per message, QoS 1, together `ratePerS` readings a second;
 * a signed-in browser's socket watches their shops. A delivery's latency runs from just before
 * the PUBLISH is written to the moment the socket's handler sees that reading: the broker's
 * token check and hand-over, the server's store (commit, pg_notify), the hub's fan-out.
 */
import mqtt, { type MqttClient } from 'mqtt';
import { WebSocket } from 'ws';

import { readingsTopic } from '@/ingest/mqttTopics';
import { LIVE_PATH, type ReadingMessage } from '@/ingest/wire/live';

import { call, signUp, type FleetSensor } from './fixtures';
import { summarize, type LatencySummary } from './stats';

export interface MqttLatencyResult {
  ratePerS: number;
  sensors: number;
  published: number;
  /** PUBACKs that did not come (the broker refused or timed out). */
  failedPublishes: number;
  /** Readings whose live message did not arrive within the grace period. */
  missing: number;
  delivery: LatencySummary;
  /** PUBLISH → PUBACK, which our broker sends only after the readings are stored. */
  puback: LatencySummary;
}

/**
 * A shop of its own with `count` sensors, 5 to a zone, and its owner's cookie: at 200 readings/s
 * over 25 sensors each posts 8 a second, inside the per-sensor limit of 10.
 */
export async function createMqttShop(
  url: string,
  count: number,
): Promise<{ cookie: string; sensors: FleetSensor[] }> {
  const cookie = await signUp(url, 'MQTT shop owner');
  const post = <T>(path: string, body: unknown) =>
    call<T>(url, path, body, cookie).then((r) => r.body);
  const shop = await post<{ id: string }>('/shops', { name: 'MQTT shop', timeZone: 'UTC' });
  const sensors: FleetSensor[] = [];
  for (let i = 0; i < count; i += 5) {
    const zone = await post<{ id: string }>(`/shops/${shop.id}/zones`, {
      name: `Zone ${i / 5 + 1}`,
    });
    for (let j = i; j < Math.min(count, i + 5); j++) {
      const s = await post<{ id: string; token: string }>(`/shops/${shop.id}/sensors`, {
        name: `MQTT sensor ${j + 1}`,
        zoneId: zone.id,
      });
      sensors.push({ sensorId: s.id, shopId: shop.id, zoneId: zone.id, token: s.token });
    }
  }
  return { cookie, sensors };
}

export async function measureMqttLatency(opts: {
  brokerUrl: string;
  url: string;
  cookie: string;
  sensors: FleetSensor[];
  ratePerS: number;
  durationS: number;
}): Promise<MqttLatencyResult> {
  const socket = new WebSocket(`${opts.url.replace(/^http/, 'ws')}${LIVE_PATH}`, {
    headers: { cookie: opts.cookie },
  });
  await new Promise<void>((resolve, reject) => {
    socket.once('open', () => resolve());
    socket.once('error', reject);
  });
  const sentAt = new Map<string, number>();
  const delivery: number[] = [];
  socket.on('message', (data) => {
    const now = performance.now();
    const m = JSON.parse(String(data)) as ReadingMessage | { type: string };
    if (m.type !== 'reading') return;
    const key = `${(m as ReadingMessage).sensorId}|${(m as ReadingMessage).reading.at}`;
    const started = sentAt.get(key);
    if (started === undefined) return;
    sentAt.delete(key);
    delivery.push(now - started);
  });

  const clients: MqttClient[] = await Promise.all(
    opts.sensors.map(
      (s) =>
        new Promise<MqttClient>((resolve, reject) => {
          const client = mqtt.connect(opts.brokerUrl, {
            clientId: s.sensorId,
            username: s.sensorId,
            password: s.token,
            protocolVersion: 4,
            reconnectPeriod: 0,
          });
          client.once('connect', () => resolve(client));
          client.once('error', reject);
        }),
    ),
  );

  const puback: number[] = [];
  let published = 0;
  let failed = 0;
  const intervalMs = 1000 / opts.ratePerS;
  const startMs = Date.now();
  // Readings one second apart in the past, a distinct instant each, so none is a duplicate.
  const firstAtMs = startMs - (opts.durationS * opts.ratePerS + 60) * 1000;
  await new Promise<void>((resolve) => {
    const timer = setInterval(() => {
      const due = Math.floor((Date.now() - startMs) / intervalMs) + 1;
      const last = Math.min(due, opts.durationS * opts.ratePerS);
      while (published < last) {
        const i = published++;
        const sensor = opts.sensors[i % opts.sensors.length]!;
        const client = clients[i % clients.length]!;
        const at = new Date(firstAtMs + i * 1000).toISOString();
        const body = JSON.stringify({ at, air: 19.5, rh: 48, surface: 18.9, battery: 3.0 });
        const t0 = performance.now();
        sentAt.set(`${sensor.sensorId}|${at}`, t0);
        client.publish(readingsTopic(sensor.sensorId), body, { qos: 1 }, (err) => {
          if (err) failed++;
          else puback.push(performance.now() - t0);
        });
      }
      if (published >= opts.durationS * opts.ratePerS) {
        clearInterval(timer);
        resolve();
      }
    }, 5);
  });
  // Grace for the last deliveries.
  const graceUntil = Date.now() + 5000;
  while (sentAt.size > 0 && Date.now() < graceUntil) await new Promise((r) => setTimeout(r, 50));

  await Promise.all(clients.map((c) => c.endAsync(true)));
  socket.terminate();
  return {
    ratePerS: opts.ratePerS,
    sensors: opts.sensors.length,
    published,
    failedPublishes: failed,
    missing: sentAt.size,
    delivery: summarize(delivery),
    puback: summarize(puback),
  };
}
