// MQTT ingest end to end: a sensor publishes to our broker on loopback, the server's
// subscription stores through the same pipeline as POST /api/v1/ingest (real PostgreSQL), the
// answer comes back on the sensor's acks topic, and a signed-in browser's WebSocket gets the
// live reading. Expected derived values are the HTTP route's own for the same body (the
// contract in shared/API.md says the two ways in answer alike).
import { randomUUID } from 'node:crypto';

import type { MqttClient } from 'mqtt';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { acksTopic, readingsTopic } from '@/ingest/mqttTopics';
import type { MqttIngest, RunningBroker } from '@/server/mqtt';

import { ownerWithSensor, type TestApp } from '../support/app';
import { startHubServer, type HubServer } from '../support/liveHub';
import { openRecordingSocket, until } from '../support/liveClient';
import { connected, connectSensor, startTestBroker, startTestIngest } from '../support/mqtt';
import { signInCookie } from '../support/sessionCookie';

let hub: HubServer;
let t: TestApp;
let broker: RunningBroker;
let ingest: MqttIngest;
const clients: MqttClient[] = [];

beforeAll(async () => {
  hub = await startHubServer();
  t = hub.t;
  broker = await startTestBroker(t);
  ingest = startTestIngest(t, broker.port);
  await ingest.ready;
});
afterAll(async () => {
  await Promise.all(clients.map((c) => c.endAsync(true)));
  await ingest.close();
  await broker.close();
  await hub.close();
});

function sensorClient(...args: Parameters<typeof connectSensor>) {
  const client = connectSensor(...args);
  clients.push(client);
  return client;
}

async function storedAts(sensorId: string): Promise<string[]> {
  const { rows } = await t.pool.query<{ at: Date }>(
    'select at from readings where sensor_id = $1 order by at',
    [sensorId],
  );
  return rows.map((r) => r.at.toISOString());
}

/** The next JSON message on the sensor's acks topic. */
function nextAck(client: MqttClient, sensorId: string): Promise<unknown> {
  return new Promise((resolve) => {
    const onMessage = (topic: string, payload: Buffer) => {
      if (topic !== acksTopic(sensorId)) return;
      client.off('message', onMessage);
      resolve(JSON.parse(payload.toString('utf8')));
    };
    client.on('message', onMessage);
  });
}

/** Every answer on the sensor's acks topic from now on (an ack may trail its PUBACK). */
function collectAcks(client: MqttClient, sensorId: string): unknown[] {
  const acks: unknown[] = [];
  client.on('message', (topic, payload) => {
    if (topic === acksTopic(sensorId)) acks.push(JSON.parse(payload.toString('utf8')));
  });
  return acks;
}

const minutesAgo = (m: number) => new Date(Date.now() - m * 60_000).toISOString();

describe('MQTT ingest', () => {
  it('stores a published reading, answers on the acks topic as the HTTP route does, and pushes it live', async () => {
    const owner = await ownerWithSensor(t);
    const socket = await openRecordingSocket(hub.wsUrl, await signInCookie(t.app, owner));
    const sensor = sensorClient(broker.port, owner);
    await connected(sensor);
    await sensor.subscribeAsync(acksTopic(owner.sensorId), { qos: 1 });

    const at = minutesAgo(3);
    const body = {
      unit: 'C',
      readings: [{ at, air: 11.8, rh: 78.5, surface: 8.9, battery: 3.02 }],
    };
    const ack = nextAck(sensor, owner.sensorId);
    await sensor.publishAsync(readingsTopic(owner.sensorId), JSON.stringify(body), { qos: 1 });
    // The PUBACK came back, so the reading is already stored (the broker waits for the store).
    expect(await storedAts(owner.sensorId)).toEqual([at]);

    // The same body posted over HTTP by a second sensor of the same zone answers the same.
    const other = await owner.agent
      .post(`/api/v1/shops/${owner.shopId}/sensors`)
      .send({ name: 'HTTP twin', zoneId: owner.zoneId })
      .expect(201);
    const http = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${other.body.token}`)
      .send(body)
      .expect(202);
    expect(await ack).toEqual(http.body);
    expect(http.body.stored).toBe(1);

    await until(() =>
      socket.messages.some(
        (m) => m.type === 'reading' && (m as { sensorId?: string }).sensorId === owner.sensorId,
      ),
    );
    socket.ws.close();
  });

  it('answers a repeat of the same message as duplicates and stores nothing twice', async () => {
    const owner = await ownerWithSensor(t);
    const sensor = sensorClient(broker.port, owner);
    await connected(sensor);
    await sensor.subscribeAsync(acksTopic(owner.sensorId), { qos: 1 });
    const acks = collectAcks(sensor, owner.sensorId);
    const body = JSON.stringify({ at: minutesAgo(2), air: 20, rh: 50 });
    await sensor.publishAsync(readingsTopic(owner.sensorId), body, { qos: 1 });
    await sensor.publishAsync(readingsTopic(owner.sensorId), body, { qos: 1 });
    await until(() => acks.length === 2);
    expect(acks).toMatchObject([
      { stored: 1, duplicates: 0, rejected: [] },
      { stored: 0, duplicates: 1, rejected: [] },
    ]);
    expect(await storedAts(owner.sensorId)).toHaveLength(1);
  });

  it.each([
    ['not JSON', '{"air": 20, "rh"', 'invalid_json'],
    ['a misspelt field', JSON.stringify({ air: 20, rh: 50, surfce: 12 }), 'unknown_field'],
    ['a wrong type', JSON.stringify({ air: 'warm', rh: 50 }), 'invalid_payload'],
    ['no readings', JSON.stringify({ readings: [] }), 'invalid_payload'],
    ['a bare number', '42', 'invalid_payload'],
  ])('answers %s with the error the HTTP route gives, stores nothing', async (_, payload, code) => {
    const owner = await ownerWithSensor(t);
    const sensor = sensorClient(broker.port, owner);
    await connected(sensor);
    await sensor.subscribeAsync(acksTopic(owner.sensorId), { qos: 1 });
    const ack = nextAck(sensor, owner.sensorId);
    await sensor.publishAsync(readingsTopic(owner.sensorId), payload, { qos: 1 });
    expect(await ack).toMatchObject({ error: { code } });
    expect(await storedAts(owner.sensorId)).toEqual([]);
    // The connection stays up and the next good message is stored.
    await sensor.publishAsync(readingsTopic(owner.sensorId), JSON.stringify({ air: 20, rh: 50 }), {
      qos: 1,
    });
    expect(await storedAts(owner.sensorId)).toHaveLength(1);
  });

  it('rejects one bad reading of a batch in the ack and stores the others', async () => {
    const owner = await ownerWithSensor(t);
    const sensor = sensorClient(broker.port, owner);
    await connected(sensor);
    await sensor.subscribeAsync(acksTopic(owner.sensorId), { qos: 1 });
    const ack = nextAck(sensor, owner.sensorId);
    const good = minutesAgo(4);
    await sensor.publishAsync(
      readingsTopic(owner.sensorId),
      JSON.stringify({
        readings: [
          { at: good, air: 15, rh: 60 },
          { at: minutesAgo(3), air: 15, rh: 140 },
        ],
      }),
      { qos: 1 },
    );
    expect(await ack).toMatchObject({ stored: 1, rejected: [{ index: 1 }] });
    expect(await storedAts(owner.sensorId)).toEqual([good]);
  });
});

describe('MQTT access', () => {
  it('refuses a wrong token, a wrong username and a client id of another sensor', async () => {
    const a = await ownerWithSensor(t);
    const b = await ownerWithSensor(t);
    await expect(
      connected(sensorClient(broker.port, { ...a, token: `dbs_${randomUUID()}` })),
    ).rejects.toThrow(/Bad username or password/i);
    await expect(connected(sensorClient(broker.port, a, { username: b.sensorId }))).rejects.toThrow(
      /Bad username or password/i,
    );
    await expect(connected(sensorClient(broker.port, a, { clientId: b.sensorId }))).rejects.toThrow(
      /Identifier rejected/i,
    );
  });

  it('drops a sensor publishing to another sensor’s topic and stores nothing for either', async () => {
    const a = await ownerWithSensor(t);
    const b = await ownerWithSensor(t);
    const sensor = sensorClient(broker.port, a);
    await connected(sensor);
    const closed = new Promise<void>((r) => sensor.once('close', () => r()));
    sensor.publish(readingsTopic(b.sensorId), JSON.stringify({ air: 20, rh: 50 }), { qos: 1 });
    await closed;
    // The other sensor's subscription is refused too (SUBACK 128).
    const again = sensorClient(broker.port, a);
    await connected(again);
    await expect(again.subscribeAsync(acksTopic(b.sensorId), { qos: 1 })).rejects.toThrow(
      /Subscribe error/,
    );
    expect(await storedAts(a.sensorId)).toEqual([]);
    expect(await storedAts(b.sensorId)).toEqual([]);
  });

  it('keeps a sensor connected through a rename, which announces its token as a revocation does', async () => {
    // server/routes/sensors.ts announces the token on creation, rename and move so that no
    // cache keeps an old answer; the broker used to close the connection on any such notice,
    // which also dropped a sensor that connected right after being created.
    const owner = await ownerWithSensor(t);
    const sensor = sensorClient(broker.port, owner);
    await connected(sensor);
    let closed = false;
    sensor.once('close', () => (closed = true));
    await owner.agent
      .patch(`/api/v1/shops/${owner.shopId}/sensors/${owner.sensorId}`)
      .send({ name: 'Jointer probe' })
      .expect(200);
    // Another sensor's revocation, announced after the rename on the same channel: once its
    // connection has closed, the rename's notice has been heard and its re-check started.
    const other = await ownerWithSensor(t);
    const otherClient = sensorClient(broker.port, other);
    await connected(otherClient);
    const otherClosed = new Promise<void>((r) => otherClient.once('close', () => r()));
    await other.agent
      .delete(`/api/v1/shops/${other.shopId}/sensors/${other.sensorId}/token`)
      .expect(204);
    await otherClosed;
    await new Promise((r) => setTimeout(r, 300));
    expect(closed).toBe(false);
    await sensor.publishAsync(readingsTopic(owner.sensorId), JSON.stringify({ air: 20, rh: 50 }), {
      qos: 1,
    });
    expect(await storedAts(owner.sensorId)).toHaveLength(1);
  });

  it('refuses a revoked token within a second: the open connection is dropped, a new one refused, nothing stored', async () => {
    const owner = await ownerWithSensor(t);
    const sensor = sensorClient(broker.port, owner);
    await connected(sensor);
    await sensor.publishAsync(readingsTopic(owner.sensorId), JSON.stringify({ air: 20, rh: 50 }), {
      qos: 1,
    });
    expect(await storedAts(owner.sensorId)).toHaveLength(1);

    const closed = new Promise<void>((r) => sensor.once('close', () => r()));
    const revokedAt = Date.now();
    await owner.agent
      .delete(`/api/v1/shops/${owner.shopId}/sensors/${owner.sensorId}/token`)
      .expect(204);
    await closed;
    expect(Date.now() - revokedAt).toBeLessThan(1000);
    await expect(connected(sensorClient(broker.port, owner))).rejects.toThrow(
      /Bad username or password/i,
    );
    expect(await storedAts(owner.sensorId)).toHaveLength(1);
  });
});
