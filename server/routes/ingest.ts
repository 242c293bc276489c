/**
 * POST /api/v1/ingest — sensors post one reading or a batch with a bearer token.
 * The route is the HTTP side only: the token (401), the sensor's rate (429), the content type
 * (415), the body's size and envelope (413, 400). storeReadings (server/readings/) checks,
 * derives and stores the readings, and the route answers 202 only after the rows are
 * committed, so an acknowledged reading is never lost.
 */
import express, { Router } from 'express';

import type { SensorIdentity } from '@/db/queries/sensors';

import {
  createSensorRateLimiter,
  DEFAULT_SENSOR_RATE,
  type RateLimitOptions,
} from '../auth/sensorRateLimit';
import type { SensorTokenCache } from '../auth/sensorTokens';
import { ApiError } from '../errors';
import { readingsOfBody } from '../readings/ingestBody';
import { storeReadings, type StoreReadingsDeps } from '../readings/ingestReadings';
import { stageMs, stageTraceOn } from '../stageTrace';

const BEARER = /^Bearer\s+(\S+)$/i;

export interface IngestDeps extends StoreReadingsDeps {
  tokens: SensorTokenCache;
  now: () => number;
  sensorRate?: RateLimitOptions;
}

export function ingestRouter(deps: IngestDeps): Router {
  const { tokens, now, sensorRate } = deps;
  const router = Router();
  const limiter = createSensorRateLimiter({ ...DEFAULT_SENSOR_RATE, ...sensorRate, now });

  router.post(
    '/',
    async (req, res, next) => {
      if (stageTraceOn) {
        const t0 = performance.now();
        res.once('finish', () => stageMs('ingest.http', performance.now() - t0));
      }
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
      const readings = readingsOfBody(req.body, receivedAtMs);
      const outcome = await storeReadings(deps, sensor, readings, receivedAtMs);
      // Not res.json: it would hash every answer for an ETag, which no sensor's POST uses.
      res.status(202).set('Content-Type', 'application/json').end(JSON.stringify(outcome));
    },
  );

  return router;
}
