/**
 * POST /api/v1/ingest — sensors post one reading or a batch with a bearer token.
 * The route validates the envelope (400), checks each reading (listed in `rejected`),
 * derives dew point, margin, EMC and level in ingest/, and answers 202 only after the rows
 * are committed, so an acknowledged reading is never lost.
 */
import express, { Router } from 'express';

import type { SensorIdentity } from '@/db/queries/sensors';
import { MAX_READINGS_PER_REQUEST, parseEnvelope } from '@/ingest';

import type { AlarmQueue } from '../alarms/queue';
import {
  createSensorRateLimiter,
  DEFAULT_SENSOR_RATE,
  type RateLimitOptions,
} from '../auth/sensorRateLimit';
import type { SensorTokenCache } from '../auth/sensorTokens';
import { ApiError } from '../errors';
import { readingMessage } from '../live/messages';
import { prepareReadings } from '../readings/prepare';
import type { SurfaceEstimator } from '../readings/surfaceEstimates';
import type { ReadingWriter } from '../readings/writer';

const BEARER = /^Bearer\s+(\S+)$/i;

export interface IngestDeps {
  writer: ReadingWriter;
  tokens: SensorTokenCache;
  estimator: SurfaceEstimator;
  now: () => number;
  sensorRate?: RateLimitOptions;
  alarms?: AlarmQueue;
  /** Answer only after the alarms are judged too (tests want that order; sensors need not). */
  awaitAlarms?: boolean;
}

export function ingestRouter(deps: IngestDeps): Router {
  const { writer, tokens, estimator, now, sensorRate, alarms, awaitAlarms } = deps;
  const router = Router();
  const limiter = createSensorRateLimiter({ ...DEFAULT_SENSOR_RATE, ...sensorRate, now });

  router.post(
    '/',
    async (req, res, next) => {
      // Authenticate before reading the body: an unknown sender should cost us nothing.
      const match = BEARER.exec(req.headers.authorization ?? '');
      if (!match) {
        throw new ApiError(
          401,
          'missing_token',
          'Send the sensor token as `Authorization: Bearer <token>`.',
        );
      }
      const sensor = await tokens.resolve(match[1]!);
      if (!sensor) {
        throw new ApiError(
          401,
          'invalid_token',
          'This sensor token is unknown or has been revoked.',
        );
      }
      const allowed = limiter.take(sensor.sensorId);
      if (!allowed.ok) {
        res.setHeader('Retry-After', String(allowed.retryAfterS));
        throw new ApiError(
          429,
          'rate_limited',
          `This sensor is posting faster than its limit; retry in ${allowed.retryAfterS} s.`,
        );
      }
      if (!req.is('application/json')) {
        throw new ApiError(
          415,
          'unsupported_media_type',
          'Send the readings as `Content-Type: application/json`.',
        );
      }
      res.locals.sensor = sensor;
      next();
    },
    express.json({ limit: '1mb' }),
    async (req, res) => {
      const sensor = res.locals.sensor as SensorIdentity;
      const receivedAtMs = now();
      const body: unknown = req.body;
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
          'invalid_payload',
          'The readings are not in the expected shape.',
          envelope.issues,
        );
      }

      const { rows, rejected } = await prepareReadings(
        sensor,
        envelope.readings,
        receivedAtMs,
        estimator,
      );
      const { insertedMs } = await writer.write(rows, (fresh) =>
        JSON.stringify(readingMessage(fresh)),
      );
      // The rows are committed, so the 202 need not wait for the alarms: the queue judges them
      // next, logs its own failures and never undoes the answer.
      const judged = alarms?.add(
        sensor,
        rows.filter((r) => insertedMs.has(r.at.getTime())),
      );
      if (awaitAlarms) await judged;

      res.status(202).json({
        stored: insertedMs.size,
        duplicates: rows.length - insertedMs.size,
        rejected,
        results: rows.map((r) => ({
          at: r.at.toISOString(),
          dewPoint: r.dewPointC,
          margin: r.marginK,
          emc: r.emcPct,
          level: r.level,
          surfaceSource: r.surfaceSource,
        })),
      });
    },
  );

  return router;
}
