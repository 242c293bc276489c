/**
 * Builds the Express app from its dependencies; it never listens, so tests drive it with
 * supertest and server/index.ts decides ports and shutdown.
 */
import path from 'node:path';

import express from 'express';
import helmet from 'helmet';
import type pg from 'pg';

import type { Db } from '@/db';

import type { AlarmEngine } from './alarms';
import { createAlarmQueue, type AlarmQueueOptions } from './alarms/queue';
import { hostCheck, type AllowedHosts } from './auth/hosts';
import { authorize } from './auth/middleware';
import { createRateLimits, DEFAULT_RATE_LIMITS, type RateLimitConfig } from './auth/rateLimits';
import type { RateLimitOptions } from './auth/sensorRateLimit';
import type { SensorTokenCache } from './auth/sensorTokens';
import type { SessionSigner } from './auth/session';
import type { TrustProxy } from './config';
import type { Logger } from './logger';
import type { ImportJobs } from './jobs/importJob';
import type { SurfaceEstimator } from './readings/surfaceEstimates';
import type { Storage } from './storage';
import type { ReadingWriter } from './readings/writer';
import { errorHandler, notFound } from './errors';
import { outboxRouter, type Mailer, type Outbox } from './mail';
import { alarmsRouter } from './routes/alarms';
import { authRouter } from './routes/auth';
import { healthRouter } from './routes/health';
import { importsRouter } from './routes/imports';
import { ingestRouter } from './routes/ingest';
import { invitationsRouter } from './routes/invitations';
import { meRouter } from './routes/me';
import { photosRouter } from './routes/photos';
import { membersRouter } from './routes/members';
import { readingsRouter } from './routes/readings';
import { reportsRouter } from './routes/reports';
import { trialsRouter } from './routes/trials';
import { sensorsRouter } from './routes/sensors';
import { shopsRouter } from './routes/shops';
import { surfacesRouter } from './routes/surfaces';
import { zonesRouter } from './routes/zones';
import { webApp } from './webApp';
import { requestLogger } from './requestLog';

export interface AppDeps {
  db: Db;
  pool: pg.Pool;
  sessions: SessionSigner;
  tokens: SensorTokenCache;
  writer: ReadingWriter;
  estimator: SurfaceEstimator;
  /** Judges stored readings and opens, updates and clears alarms; omitted, no alarms open. */
  alarms?: AlarmEngine;
  /** Ingest answers after its readings' alarms are judged (deterministic tests). */
  awaitAlarms?: boolean;
  alarmQueue?: Partial<AlarmQueueOptions>;
  /** Per-sensor request limit of the ingest route; the default suits real sensors. */
  sensorRate?: RateLimitOptions;
  mailer: Mailer;
  /** Photo and import file storage (server/storage/); omitted, uploads and reads answer 503. */
  storage?: Storage;
  /** Queues CSV imports (server/jobs/importJob.ts); omitted, starting an import answers 503. */
  imports?: ImportJobs;
  /** Where people reach the app (links in e-mail; a trusted origin). */
  publicUrl: string;
  /** The MQTT broker the Sensors page shows (config.mqtt.publicUrl); absent when MQTT is off. */
  mqttPublicUrl?: string;
  /** Host header values answered (server/auth/hosts.ts); every other gets 421. */
  allowedHosts: AllowedHosts;
  /** Express's `trust proxy`: whose X-Forwarded-For names the client (rate limits). Default off. */
  trustProxy?: TrustProxy;
  /** The local SMTP server's messages, shown at /dev/outbox; only in development. */
  devOutbox?: Outbox;
  rateLimits?: RateLimitConfig;
  /** The exported web app (dist/); omitted in API-only tests. */
  webDir?: string;
  now?: () => number;
  /** The server's logger (server/logger.ts); requests log through its `http` child. */
  logger: Logger;
}

export function createApp(deps: AppDeps): express.Express {
  const now = deps.now ?? Date.now;
  const app = express();
  app.disable('x-powered-by');
  app.set('query parser', 'simple');
  // Before everything, ingest included: every response carries X-Request-Id and one log line
  // (a refused Host too, so an operator sees the attempt).
  app.use(requestLogger(deps.logger));
  // Off unless configured: otherwise anyone could pick the address the rate limits count.
  app.set('trust proxy', deps.trustProxy ?? false);
  // Before every router, the sensor route included: a request for another host name (DNS
  // rebinding) reaches nothing.
  app.use(hostCheck(deps.allowedHosts));
  // Sensors next: they need neither browser security headers nor the session policy (their
  // bearer token is checked inside), and this is the hottest route. It parses its own body,
  // after the token check and with its own limit.
  const alarmQueue = deps.alarms && createAlarmQueue(deps.alarms, deps.logger, deps.alarmQueue);
  app.use('/api/v1/ingest', ingestRouter({ ...deps, alarms: alarmQueue, now }));
  const web = deps.webDir
    ? webApp(path.resolve(deps.webDir), {
        db: deps.db,
        sessions: deps.sessions,
        logger: deps.logger,
        mqttPublicUrl: deps.mqttPublicUrl ?? null,
      })
    : null;
  app.use(
    helmet({
      // The exported Expo app uses inline styles; scripts stay same-origin, but for the page's
      // own inline boot script, allowed by its hash.
      contentSecurityPolicy: {
        directives: {
          'script-src': ["'self'", ...(web?.inlineScriptSources ?? [])],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'"],
        },
      },
    }),
  );

  const { db, sessions, tokens } = deps;
  const limits = createRateLimits(deps.rateLimits ?? DEFAULT_RATE_LIMITS, now);
  const people = { ...deps, db, sessions, limits, now };
  const api = express.Router();
  // Every API route has a row in server/auth/policy.ts; this checks it before any router runs.
  api.use(authorize({ db, sessions, trustedOrigins: new Set([new URL(deps.publicUrl).origin]) }));
  api.use(express.json({ limit: '100kb' }));
  api.use(healthRouter(deps.pool));
  api.use('/auth', authRouter(people));
  api.use('/me', meRouter(people));
  api.use('/shops', shopsRouter(db, tokens, deps.storage));
  api.use('/shops/:shopId/zones/:zoneId/readings', readingsRouter(db, now));
  api.use('/shops/:shopId/zones', zonesRouter(db, tokens));
  api.use(
    '/shops/:shopId/sensors/:sensorId/imports',
    importsRouter(db, deps.storage, deps.imports, now),
  );
  api.use('/shops/:shopId/sensors', sensorsRouter(db, tokens, deps.mqttPublicUrl ?? null));
  api.use('/shops/:shopId/alarms', alarmsRouter(db, deps.pool, now));
  api.use('/shops/:shopId/reports', reportsRouter(db, now));
  api.use('/shops/:shopId/trials', trialsRouter(db, now));
  api.use('/shops/:shopId', surfacesRouter(db, now));
  api.use('/shops/:shopId', photosRouter(db, deps.storage));
  api.use('/shops/:shopId', membersRouter(db));
  api.use(invitationsRouter(people));
  api.use(notFound);
  app.use('/api/v1', api);
  app.use('/api', notFound);
  if (deps.devOutbox) app.use(outboxRouter(deps.devOutbox));

  if (web) app.use(web.router);

  app.use(notFound);
  app.use(errorHandler());
  return app;
}
