/**
 * The server's side of MQTT ingest: a few persistent connections to the broker (MQTT_URL), each
 * subscribed to `drybench/+/readings` with QoS 1. Every message goes through the same pipeline
 * as POST /api/v1/ingest (answer.ts → storeReadings), its answer is published to the sensor's
 * acks topic, and the PUBACK goes back only after the rows committed (mqtt's handleMessage
 * callback), which is what releases the sensor's own PUBACK at our broker (broker.ts).
 *
 * mqtt handles one message per connection at a time (the PUBACK waits for the callback), so
 * `connections` connections give that many stores in flight for the group writer to combine.
 * Letting one connection store several at once (PUBACKs sent later, in arrival order) was
 * tried and measured: with Nagle's delay gone the least busy of 16 connections held at most one
 * message at the p99 at 200 messages/s, and interleaved runs showed no gain
 * (scripts/bench/FINDINGS.md, "MQTT").
 */
import type { Socket } from 'node:net';
import { hostname } from 'node:os';

import mqtt, { type MqttClient } from 'mqtt';

import { acksTopic, MQTT_SERVICE_USERNAME, READINGS_FILTER } from '@/ingest/mqttTopics';

import type { Logger } from '../logger';

import { stageMs } from '../stageTrace';

import type { MessageAnswerer } from './answer';

export interface MqttIngestOptions {
  url: string;
  /** The service password; a password in the URL is used when this is absent. */
  password?: string;
  /** Connections opened (each a persistent session with its own client id). */
  connections: number;
  /** Client ids are `<prefix>-<n>`; each server instance needs its own. */
  clientIdPrefix?: string;
  answer: MessageAnswerer;
  logger: Logger;
}

export interface MqttIngest {
  /** Settles once every connection has subscribed. */
  ready: Promise<void>;
  close(): Promise<void>;
}

/** Stable across restarts of one instance (its persistent sessions resume), distinct between hosts. */
export function defaultClientIdPrefix(port: number): string {
  return `${MQTT_SERVICE_USERNAME}-${hostname()}-${port}`;
}

export function startMqttIngest(options: MqttIngestOptions): MqttIngest {
  const log = options.logger.child({ component: 'mqtt' });
  const prefix = options.clientIdPrefix ?? defaultClientIdPrefix(0);
  const clients: MqttClient[] = [];
  const subscribed: Promise<void>[] = [];

  for (let n = 0; n < options.connections; n++) {
    const client = mqtt.connect(options.url, {
      clientId: `${prefix}-${n}`,
      username: MQTT_SERVICE_USERNAME,
      ...(options.password !== undefined ? { password: options.password } : {}),
      clean: false,
      protocolVersion: 4,
      reconnectPeriod: 1000,
      connectTimeout: 10_000,
      // Else mqtt-packet builds 65,536 two-byte Buffers for packet ids on the first write and
      // keeps them: ~6 MB of the server's ~55 MB live heap (README, issue 13's memory row).
      writeCache: false,
    });
    client.handleMessage = (packet, callback) => {
      const t0 = performance.now();
      options.answer(packet.topic, packet.payload as Buffer).then(
        (outcome) => {
          stageMs('mqtt.answer', performance.now() - t0);
          if (outcome.sensorId && outcome.body !== null) {
            client.publish(acksTopic(outcome.sensorId), JSON.stringify(outcome.body), { qos: 1 });
          }
          // No PUBACK while the readings are not stored: the broker tells the sensor to retry.
          callback(outcome.ack ? undefined : new Error('readings not stored; no PUBACK'));
        },
        (err: unknown) => {
          log.error({ err }, 'MQTT message failed');
          callback(err instanceof Error ? err : new Error(String(err)));
        },
      );
    };
    subscribed.push(
      new Promise<void>((resolve) => {
        client.on('connect', () => {
          // A PUBACK is one small packet: without noDelay it can wait for the broker's delayed
          // ACK of the previous one (Nagle's algorithm; see the broker's listener, broker.ts).
          (client.stream as Partial<Socket>).setNoDelay?.(true);
          // Subscribing again to a resumed session's filter is harmless and covers a broker
          // that lost its sessions (a restart of our in-memory broker).
          client.subscribe(READINGS_FILTER, { qos: 1 }, (err) => {
            if (err) log.warn({ err }, 'MQTT subscribe failed');
            else resolve();
          });
        });
      }),
    );
    client.on('error', (err) => log.warn({ err: err.message }, 'MQTT connection error'));
    clients.push(client);
  }

  const ready = Promise.all(subscribed).then(() => {
    log.info(
      { connections: options.connections },
      `Drybench takes MQTT readings from ${redactUrl(options.url)}`,
    );
  });
  return {
    ready,
    async close() {
      await Promise.all(clients.map((c) => c.endAsync()));
    },
  };
}

/** The URL as logged: any password in it blanked. */
export function redactUrl(url: string): string {
  try {
    const u = new URL(url);
    if (u.password) u.password = 'redacted';
    return u.toString();
  } catch {
    return '[invalid url]';
  }
}
