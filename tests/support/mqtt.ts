// A real MQTT broker (ours, on a loopback port) in front of the test database, the server's
// MQTT ingest subscribed to it, and sensor clients as a device would connect.
import mqtt, { type MqttClient } from 'mqtt';

import { createAlarmQueue } from '@/server/alarms/queue';
import { createMessageAnswerer, startBroker, startMqttIngest } from '@/server/mqtt';
import type { MqttIngest, RunningBroker } from '@/server/mqtt';
import { createLogger, silentLogger } from '@/server/logger';

// MQTT_TEST_LOG=debug shows the broker's and the subscription's lines while a test is written.
const logger = () =>
  process.env.MQTT_TEST_LOG
    ? createLogger({ level: process.env.MQTT_TEST_LOG as 'debug', pretty: false })
    : silentLogger();

import type { TestApp } from './app';

export const TEST_SERVICE_PASSWORD = 'test-mqtt-service-password-of-32-chars';

export function startTestBroker(
  t: TestApp,
  options: { port?: number; forwardTimeoutMs?: number } = {},
): Promise<RunningBroker> {
  return startBroker({
    db: t.db,
    listener: t.listener,
    servicePassword: TEST_SERVICE_PASSWORD,
    host: '127.0.0.1',
    port: options.port ?? 0,
    logger: logger(),
    forwardTimeoutMs: options.forwardTimeoutMs,
    sensorRate: { ratePerS: 1000, burst: 1000 },
  });
}

export function startTestIngest(t: TestApp, port: number, connections = 2): MqttIngest {
  return startMqttIngest({
    url: `mqtt://127.0.0.1:${port}`,
    password: TEST_SERVICE_PASSWORD,
    connections,
    clientIdPrefix: `drybench-server-test-${process.pid}`,
    answer: createMessageAnswerer({
      db: t.db,
      writer: t.writer,
      estimator: t.estimator,
      // As the test app's HTTP route: every message's alarms judged before its PUBACK.
      alarms: createAlarmQueue(t.alarms, t.logger, { minIntervalMs: 0 }),
      awaitAlarms: true,
      now: Date.now,
      logger: logger(),
    }),
    logger: logger(),
  });
}

/** A sensor's connection: username its id, password its token, client id its id. */
export function connectSensor(
  port: number,
  sensor: { sensorId: string; token: string },
  extra: mqtt.IClientOptions = {},
): MqttClient {
  return mqtt.connect(`mqtt://127.0.0.1:${port}`, {
    clientId: sensor.sensorId,
    username: sensor.sensorId,
    password: sensor.token,
    protocolVersion: 4,
    reconnectPeriod: 0,
    connectTimeout: 5000,
    ...extra,
  });
}

/** Resolves on CONNACK, rejects with the broker's refusal (e.g. "Bad username or password"). */
export function connected(client: MqttClient): Promise<void> {
  return new Promise((resolve, reject) => {
    client.once('connect', () => resolve());
    client.once('error', reject);
    client.once('close', () => reject(new Error('closed before CONNACK')));
  });
}
