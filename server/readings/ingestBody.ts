/**
 * An ingest body (parsed JSON) to readings, or the ApiError its sender is told: the same rules
 * for POST /api/v1/ingest and MQTT messages (server/mqtt/answer.ts).
 */
import { MAX_READINGS_PER_REQUEST, parseEnvelope, type SensorReading } from '@/ingest';

import { ApiError } from '../errors';

export function readingsOfBody(body: unknown, receivedAtMs: number): SensorReading[] {
  if (
    typeof body === 'object' &&
    body !== null &&
    'readings' in body &&
    Array.isArray(body.readings) &&
    body.readings.length > MAX_READINGS_PER_REQUEST
  ) {
    throw new ApiError(
      413,
      'too_many_readings',
      `Send at most ${MAX_READINGS_PER_REQUEST} readings per request.`,
    );
  }
  const envelope = parseEnvelope(body, receivedAtMs);
  if (!envelope.ok) {
    throw new ApiError(
      400,
      envelope.code,
      envelope.code === 'unknown_field'
        ? envelope.issues.map((i) => i.message).join(' ')
        : 'The readings are not in the expected shape.',
      envelope.issues,
    );
  }
  return envelope.readings;
}
