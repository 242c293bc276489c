/**
 * A demo sensor that publishes over MQTT, as a device would: username its sensor id, password
 * its token, QoS 1 to `drybench/<id>/readings`. A batch counts as sent on its PUBACK, which our
 * broker gives only once the readings are stored; while the broker is away the backlog waits.
 */
import mqtt from 'mqtt';

import { readingsTopic } from '@/ingest/mqttTopics';

import type { BatchSender } from './simulator';

/** Longer than the broker's wait for the server (10 s), so a slow store is not sent twice. */
const PUBACK_WAIT_MS = 15_000;

export function mqttSender(
  url: string,
  sensor: { sensorId: string; token: string },
): { send: BatchSender; close(): Promise<void> } {
  const client = mqtt.connect(url, {
    clientId: `${sensor.sensorId}-demo`,
    username: sensor.sensorId,
    password: sensor.token,
    protocolVersion: 4,
    reconnectPeriod: 2000,
  });
  client.on('error', () => {}); // refused or away: the backlog waits for the next tick
  return {
    async send(body) {
      if (!client.connected) return { done: false };
      let timer: NodeJS.Timeout | undefined;
      const timeout = new Promise<'timeout'>((resolve) => {
        timer = setTimeout(() => resolve('timeout'), PUBACK_WAIT_MS);
      });
      try {
        const result = await Promise.race([
          client.publishAsync(readingsTopic(sensor.sensorId), body, { qos: 1 }),
          timeout,
        ]);
        return result === 'timeout' ? { done: false } : { done: true };
      } catch {
        return { done: false };
      } finally {
        clearTimeout(timer);
      }
    },
    close: () => client.endAsync(),
  };
}
