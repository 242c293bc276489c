/**
 * The server's side of MQTT ingest: a few persistent connections to the broker (MQTT_URL), each
 * subscribed to `drybench/+/readings` with QoS 1. Every message goes through the same pipeline
 * as POST /api/v1/ingest (answer.ts → storeReadings), its answer is published to the sensor's
 * acks topic, and its PUBACK goes back only after the rows committed, which is what releases the
 * sensor's own PUBACK at our broker (broker.ts).
 *
 * Several messages per connection are stored at once. mqtt's handleMessage takes one message at
 * a time and sends the PUBACK when its callback is called, so a connection whose store waited on
 * a slow commit held every message behind it (at 200 messages/s over 16 connections the broker
 * found the least busy connection already 1–8 messages deep, and the writer's groups never grew
 * past 16). So the callback is called at once with HELD, which tells mqtt to send no PUBACK and
 * read on, and the PUBACK is sent by pubackOrder.ts once the message is stored, in the order
 * the messages arrived. `maxInFlight` bounds a connection's open stores: past it the callback
 * waits, mqtt stops reading, and the messages wait in the broker as before.
 */
import type { Socket } from 'node:net';
import { hostname } from 'node:os';

import mqtt, { type MqttClient } from 'mqtt';

import { acksTopic, MQTT_SERVICE_USERNAME, READINGS_FILTER } from '@/ingest/mqttTopics';

import type { Logger } from '../logger';

import { stageMs } from '../stageTrace';

import type { MessageAnswerer } from './answer';
import { createPubackOrder, type PubackOrder } from './pubackOrder';

export interface MqttIngestOptions {
  url: string;
  /** The service password; a password in the URL is used when this is absent. */
  password?: string;
  /** Connections opened (each a persistent session with its own client id). */
  connections: number;
  /** Messages one connection stores at once; the broker keeps the rest. */
  maxInFlight?: number;
  /** Client ids are `<prefix>-<n>`; each server instance needs its own. */
  clientIdPrefix?: string;
  answer: MessageAnswerer;
  logger: Logger;
}

/**
 * 32 per connection, 512 over the default 16 connections: several times what arrives during a
 * slow commit at the benched 200 messages/s, and a bound on what one server holds in memory
 * (the writer's own bound, maxPendingRows, refuses rows past it as busy).
 */
export const DEFAULT_MAX_IN_FLIGHT = 32;

/** Given to mqtt's handleMessage callback: send no PUBACK now (pubackOrder.ts sends it), read on. */
const HELD = new Error('PUBACK follows the store');

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
  const maxInFlight = options.maxInFlight ?? DEFAULT_MAX_IN_FLIGHT;

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
    // One PUBACK order per TCP connection: after a reconnect the broker sends unacknowledged
    // messages again, so a PUBACK of the old connection is dropped, never sent on the new one
    // (where its message id may name another message).
    let order: { stream: unknown; pubacks: PubackOrder } | null = null;
    const pubacksOfStream = (): PubackOrder => {
      const stream = client.stream;
      if (order?.stream !== stream) {
        order = {
          stream,
          pubacks: createPubackOrder((messageId) => {
            if (client.stream === stream && client.connected) sendPuback(client, messageId);
          }),
        };
      }
      return order.pubacks;
    };
    let inFlight = 0;
    /** mqtt's callback for the message that found `maxInFlight` stores open. */
    let readOn: (() => void) | null = null;

    client.handleMessage = (packet, callback) => {
      // QoS 0 has no PUBACK to hold (the broker forwards QoS 1 only; kept for completeness).
      const settle =
        packet.qos === 1 && packet.messageId !== undefined
          ? pubacksOfStream().arrived(packet.messageId)
          : () => {};
      inFlight++;
      stageMs('mqtt.inFlight', inFlight);
      const t0 = performance.now();
      options
        .answer(packet.topic, packet.payload as Buffer)
        .then(
          (outcome) => {
            stageMs('mqtt.answer', performance.now() - t0);
            if (outcome.sensorId && outcome.body !== null) {
              client.publish(acksTopic(outcome.sensorId), JSON.stringify(outcome.body), {
                qos: 1,
              });
            }
            // No PUBACK while the readings are not stored: the broker tells the sensor to retry.
            settle(outcome.ack);
          },
          (err: unknown) => {
            log.error({ err }, 'MQTT message failed');
            settle(false);
          },
        )
        .finally(() => {
          inFlight--;
          const next = readOn;
          readOn = null;
          next?.();
        });
      if (inFlight < maxInFlight) callback(HELD);
      else readOn = () => callback(HELD);
    };
    subscribed.push(
      new Promise<void>((resolve) => {
        client.on('connect', () => {
          // PUBACKs are single small packets: see the broker's noDelay (broker.ts).
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

/**
 * mqtt has no public call for a PUBACK sent later than handleMessage's callback; its own QoS 1
 * handler sends one through this method (mqtt 5.16.0, pinned exactly in package.json).
 * tests/server/mqttInFlight.test.ts fails if an upgrade changes that.
 */
function sendPuback(client: MqttClient, messageId: number): void {
  (client as unknown as PacketSender)._sendPacket({ cmd: 'puback', messageId });
}

interface PacketSender {
  _sendPacket(packet: { cmd: 'puback'; messageId: number }): void;
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
