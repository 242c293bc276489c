// The broker restarted mid-stream loses no acknowledged reading: a sensor publishes a reading
// every 20 ms with QoS 1 while the broker is closed and started again on the same port; every
// reading whose PUBACK the sensor got is in the readings table afterwards, and none twice.
// (MQTT 3.1.1, section 4.3.2: a PUBACK transfers ownership of a QoS 1 message to the receiver.)
import type { MqttClient } from 'mqtt';
import { afterAll, beforeAll, expect, it } from 'vitest';

import { readingsTopic } from '@/ingest/mqttTopics';
import type { MqttIngest, RunningBroker } from '@/server/mqtt';

import { makeTestApp, ownerWithSensor, type TestApp } from '../support/app';
import { until } from '../support/liveClient';
import { connected, connectSensor, startTestBroker, startTestIngest } from '../support/mqtt';

let t: TestApp;
let broker: RunningBroker;
let ingest: MqttIngest;
let sensor: MqttClient | undefined;

beforeAll(async () => {
  t = makeTestApp({ listen: true });
  await t.listener!.ready;
  broker = await startTestBroker(t);
  ingest = startTestIngest(t, broker.port);
  await ingest.ready;
});
afterAll(async () => {
  await sensor?.endAsync(true);
  await ingest.close();
  await broker.close();
  await t.listener!.close();
  await t.pool.end();
});

it('keeps every acknowledged reading across a broker restart', { timeout: 60_000 }, async () => {
  const owner = await ownerWithSensor(t);
  sensor = connectSensor(broker.port, owner, { reconnectPeriod: 200 });
  await connected(sensor);

  const startMs = Date.now() - 30 * 60_000;
  const acknowledged: string[] = [];
  const refused: string[] = [];
  let sent = 0;
  const publishOne = () => {
    const at = new Date(startMs + sent++ * 1000).toISOString();
    sensor!.publish(
      readingsTopic(owner.sensorId),
      JSON.stringify({ at, air: 14, rh: 70 }),
      { qos: 1 },
      (err) => (err ? refused : acknowledged).push(at),
    );
  };
  const timer = setInterval(publishOne, 20);

  await until(() => acknowledged.length >= 20, 10_000);
  const port = broker.port;
  await broker.close();
  const ackedBeforeRestart = acknowledged.length;
  await new Promise((r) => setTimeout(r, 300));
  broker = await startTestBroker(t, { port });
  await until(() => acknowledged.length >= ackedBeforeRestart + 20, 20_000);
  clearInterval(timer);
  // Let what is in flight settle either way.
  await until(() => acknowledged.length + refused.length >= sent, 20_000).catch(() => {});

  const { rows } = await t.pool.query<{ at: Date }>(
    'select at from readings where sensor_id = $1',
    [owner.sensorId],
  );
  const stored = new Set(rows.map((r) => r.at.toISOString()));
  expect(rows.length).toBe(stored.size);
  const lost = acknowledged.filter((at) => !stored.has(at));
  expect(lost).toEqual([]);
  expect(acknowledged.length).toBeGreaterThanOrEqual(40);
});
