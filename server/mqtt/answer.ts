/**
 * One MQTT message to its answer: the HTTP ingest route's checks and pipeline (readingsOfBody,
 * storeReadings), and the body the route would send — the 202 outcome, or the shared error
 * shape — for the sensor's acks topic. `ack` says whether the message may be acknowledged
 * (PUBACK): yes once its readings are stored, or when it can never be stored (bad JSON, wrong
 * shape, revoked sensor: retrying would not help); no when storage failed for now, so the sensor
 * keeps it and sends it again.
 */
import type { Db } from '@/db';
import { findActiveSensorById, type SensorIdentity } from '@/db/queries/sensors';
import { sensorOfReadingsTopic } from '@/ingest/mqttTopics';

import { ApiError, toApiError } from '../errors';
import type { Logger } from '../logger';
import { readingsOfBody } from '../readings/ingestBody';
import { stageMs } from '../stageTrace';
import { storeReadings, type StoreReadingsDeps } from '../readings/ingestReadings';

export interface MessageOutcome {
  /** The sensor whose acks topic hears `body`; null for a topic that names none. */
  sensorId: string | null;
  body: unknown;
  ack: boolean;
}

export type MessageAnswerer = (topic: string, payload: Buffer) => Promise<MessageOutcome>;

export interface AnswererDeps extends StoreReadingsDeps {
  db: Db;
  now: () => number;
  logger: Logger;
  /** How long a sensor's row is believed (revocation bites within it here too). */
  identityTtlMs?: number;
}

/** As the HTTP route's express.json limit. */
export const MAX_MESSAGE_BYTES = 1024 * 1024;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

const errorBody = (e: ApiError) => ({
  error: { code: e.code, message: e.message, details: e.details },
});

export function createMessageAnswerer(deps: AnswererDeps): MessageAnswerer {
  const log = deps.logger.child({ component: 'mqtt' });
  const ttlMs = deps.identityTtlMs ?? 1000;
  const identities = new Map<string, { identity: SensorIdentity | null; untilMs: number }>();
  // One query per sensor at a time, however many of its messages are waiting for it.
  const lookups = new Map<string, Promise<SensorIdentity | null>>();

  function lookUp(sensorId: string): Promise<SensorIdentity | null> {
    let pending = lookups.get(sensorId);
    if (!pending) {
      pending = findActiveSensorById(deps.db, sensorId)
        .then((identity) => {
          // Bounded by the sensors that published within the TTL; expired entries go on their next look.
          if (identities.size > 10_000) identities.clear();
          identities.set(sensorId, { identity, untilMs: deps.now() + ttlMs });
          return identity;
        })
        .finally(() => lookups.delete(sensorId));
      lookups.set(sensorId, pending);
    }
    return pending;
  }

  async function identityOf(sensorId: string): Promise<SensorIdentity | null> {
    const hit = identities.get(sensorId);
    const nowMs = deps.now();
    if (hit && hit.untilMs > nowMs) {
      // Past half its life the row is read again in the background, so a sensor that publishes
      // steadily never waits for that query (with a 1 s TTL it was one message per sensor and
      // second, a quarter of them at 8 a second), and what it is judged by is still never older
      // than the TTL. A failed refresh changes nothing: the entry expires and is asked for again.
      if (hit.untilMs - nowMs < ttlMs / 2) lookUp(sensorId).catch(() => {});
      return hit.identity;
    }
    return lookUp(sensorId);
  }

  return async (topic, payload) => {
    const sensorId = sensorOfReadingsTopic(topic);
    if (!sensorId || !UUID.test(sensorId)) return { sensorId: null, body: null, ack: true };
    const receivedAtMs = deps.now();
    try {
      if (payload.length > MAX_MESSAGE_BYTES) {
        throw new ApiError(
          413,
          'body_too_large',
          'The message is larger than 1 MiB; send fewer readings per message.',
        );
      }
      let body: unknown;
      try {
        body = JSON.parse(payload.toString('utf8'));
      } catch {
        throw new ApiError(400, 'invalid_json', 'The message is not valid JSON.');
      }
      const readings = readingsOfBody(body, receivedAtMs);
      const tId = performance.now();
      const sensor = await identityOf(sensorId);
      stageMs('mqtt.identity', performance.now() - tId);
      if (!sensor) {
        throw new ApiError(
          401,
          'invalid_token',
          'This sensor token is unknown or has been revoked.',
        );
      }
      const outcome = await storeReadings(deps, sensor, readings, receivedAtMs);
      return { sensorId, body: outcome, ack: true };
    } catch (err) {
      const apiError = toApiError(err);
      if (apiError.status >= 500)
        log.warn({ err, sensorId }, 'MQTT readings not stored; the sensor retries');
      return { sensorId, body: errorBody(apiError), ack: apiError.status < 500 };
    }
  };
}
