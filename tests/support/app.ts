// A Drybench app wired to the real test database, plus helpers that create a signed-in user
// with a shop, a zone and a sensor through the public HTTP routes.
import { randomUUID } from 'node:crypto';

import request from 'supertest';

import { createDatabase, DEFAULT_QUERY_TIMEOUT_MS, DEFAULT_STATEMENT_TIMEOUT_MS } from '@/db';
import { createAlarmEngine, type AlarmsOpenedHook } from '@/server/alarms';
import { createApp } from '@/server/app';
import type { AllowedHosts } from '@/server/auth/hosts';
import { createSensorTokenCache } from '@/server/auth/sensorTokens';
import { createSessionSigner } from '@/server/auth/session';
import type { TrustProxy } from '@/server/config';
import { startNotificationListener } from '@/db/listener';
import { createMailer, createOutbox, startLocalSmtpServer } from '@/server/mail';
import { DEFAULT_RATE_LIMITS, type RateLimitConfig } from '@/server/auth/rateLimits';
import { silentLogger, type Logger } from '@/server/logger';
import { createSurfaceEstimator } from '@/server/readings/surfaceEstimates';
import { createLiveEcho } from '@/server/live/localEcho';
import { createReadingWriter, type WriterOptions } from '@/server/readings/writer';
import { VERIFICATION_SUBJECT } from '@/server/mail';
import type { ImportJobs } from '@/server/jobs';
import { createS3Storage, type Storage, type StorageConfig } from '@/server/storage';

import { linkToken, waitForMail } from './mail';

export const TEST_SECRET = 'test-secret-that-is-at-least-32-characters-long';

export interface TestAppOptions {
  webDir?: string;
  /** Start a LISTEN connection, as a server instance does (live hub, token revocations). */
  listen?: boolean;
  /** Ingest limit per sensor; tests that post hundreds of requests from one sensor raise it. */
  sensorRate?: { ratePerS: number; burst: number };
  /** Ingest waits for the alarm engine before its 202 (default true, so tests read alarms at once). */
  awaitAlarms?: boolean;
  /** Another database than the shared test one (fault tests stop and restart their own). */
  databaseUrl?: string;
  /** The app's clock (sessions, link expiry); tests of expiry move it. */
  now?: () => number;
  /** Defaults to TEST_RATE_LIMITS: every test request comes from 127.0.0.1. */
  rateLimits?: RateLimitConfig;
  /** The engine's hook for opened alarms (alarm mail tests queue pg-boss jobs with it). */
  onAlarmsOpened?: AlarmsOpenedHook;
  /** Host header values answered; defaults to TEST_ALLOWED_HOSTS. */
  allowedHosts?: AllowedHosts;
  /** Express's `trust proxy` (off by default, as in production). */
  trustProxy?: TrustProxy;
  /** Mount /dev/outbox over this app's outbox (server/index.ts decides it from the config). */
  devOutbox?: boolean;
  /** The session cookie's Secure attribute (server/index.ts takes it from the config). */
  cookieSecure?: boolean;
  /** Where the app logs (tests of the logs pass tests/support/logs.ts); silent by default. */
  logger?: Logger;
  /** The pool's statement_timeout and query_timeout; the server's defaults otherwise. */
  statementTimeoutMs?: number;
  queryTimeoutMs?: number;
  /** The group writer's options (e.g. a small maxPendingRows to test back-pressure). */
  writer?: Partial<WriterOptions>;
  /** Photo storage (tests/support/s3.ts starts a real S3 fake); omitted, photos answer 503. */
  storage?: StorageConfig;
  /** Fault tests wrap the real store to make one call fail at a chosen moment. */
  wrapStorage?: (storage: Storage) => Storage;
  /** Queues CSV imports (pg-boss, tests/support/imports.ts); omitted, start answers 503. */
  imports?: ImportJobs;
}

/** Where links in test e-mail point; also a trusted origin of the test app. */
export const TEST_PUBLIC_URL = 'http://drybench.test';

/**
 * PUBLIC_URL's host, and any port of a loopback name: supertest serves every request from a
 * new ephemeral port of 127.0.0.1. Any other name is refused as in production; tests of the
 * exact production set build it with allowedHostsOf on a real listening server.
 */
export const TEST_ALLOWED_HOSTS: AllowedHosts = {
  hosts: new Set([new URL(TEST_PUBLIC_URL).host]),
  anyLoopbackPort: true,
};

/** The production limits per account; per network address high enough for a test file. */
export const TEST_RATE_LIMITS: RateLimitConfig = {
  ...DEFAULT_RATE_LIMITS,
  signInPerIp: 10_000,
  signUpPerIp: 10_000,
  resetPerIp: 10_000,
  resetConfirmPerIp: 10_000,
  verifyPerIp: 10_000,
  invitationsPerIp: 10_000,
};

export function makeTestApp(options: TestAppOptions = {}) {
  const url = options.databaseUrl ?? process.env.DATABASE_URL!;
  const logger = options.logger ?? silentLogger();
  const database = createDatabase(url, {
    max: 5,
    statementTimeoutMs: options.statementTimeoutMs ?? DEFAULT_STATEMENT_TIMEOUT_MS,
    queryTimeoutMs: options.queryTimeoutMs ?? DEFAULT_QUERY_TIMEOUT_MS,
  });
  const sessions = createSessionSigner(TEST_SECRET, options.cookieSecure ?? false, options.now);
  // A real SMTP server on a free loopback port; what it receives lands in `outbox`.
  const outbox = createOutbox();
  const smtp = startLocalSmtpServer({ outbox, logger });
  const mailer = createMailer({
    from: 'Drybench <no-reply@drybench.example>',
    target: smtp.then((s) => ({ host: s.host, port: s.port, requireTls: false })),
  });
  const listener = options.listen ? startNotificationListener(url, logger) : undefined;
  const tokens = createSensorTokenCache(database.db, { listener });
  // As server/index.ts: with a LISTEN connection, the hub hears this writer's messages at commit.
  const echo = listener ? createLiveEcho() : undefined;
  const writer = createReadingWriter(database.pool, { ...options.writer, echo });
  const estimator = createSurfaceEstimator(database.db);
  const alarms = createAlarmEngine({
    ...database,
    logger,
    onOpened: options.onAlarmsOpened,
  });
  const app = createApp({
    ...database,
    sessions,
    tokens,
    writer,
    estimator,
    alarms,
    // Tests read alarms right after a 202; in production the 202 does not wait for them.
    awaitAlarms: options.awaitAlarms ?? true,
    // Judge every request's readings at once: tests post a series and read the alarms it made.
    alarmQueue: { minIntervalMs: 0 },
    webDir: options.webDir,
    sensorRate: options.sensorRate,
    mailer,
    storage:
      options.storage && (options.wrapStorage ?? ((s) => s))(createS3Storage(options.storage)),
    imports: options.imports,
    publicUrl: TEST_PUBLIC_URL,
    allowedHosts: options.allowedHosts ?? TEST_ALLOWED_HOSTS,
    trustProxy: options.trustProxy,
    devOutbox: options.devOutbox ? outbox : undefined,
    rateLimits: options.rateLimits ?? TEST_RATE_LIMITS,
    now: options.now,
    logger,
  });
  return {
    app,
    allowedHosts: options.allowedHosts ?? TEST_ALLOWED_HOSTS,
    ...database,
    sessions,
    tokens,
    writer,
    estimator,
    alarms,
    listener,
    echo,
    mailer,
    outbox,
    smtp,
    logger,
  };
}

export type TestApp = ReturnType<typeof makeTestApp>;

export function uniqueEmail(prefix = 'user'): string {
  return `${prefix}-${randomUUID().slice(0, 8)}@test.example`;
}

/** Where people are made: an app (or a listening server's URL) and the outbox its mail reaches. */
export interface PersonMaker {
  app: Parameters<typeof request.agent>[0];
  outbox: TestApp['outbox'];
}

/**
 * A new person as the app makes one: signs up, reads the verification mail from the test SMTP
 * server and opens its link, which proves the address and signs in. Returns an agent carrying
 * that session.
 */
export async function verifiedPerson(t: PersonMaker, name = 'Test Person') {
  const agent = request.agent(t.app);
  const email = uniqueEmail();
  const password = 'correct horse battery';
  await agent.post('/api/v1/auth/sign-up').send({ email, password, name }).expect(202);
  const mail = await waitForMail(t.outbox, email, { subject: VERIFICATION_SUBJECT });
  const res = await agent
    .post('/api/v1/auth/verify')
    .send({ token: linkToken(mail, 'verify') })
    .expect(200);
  return {
    agent,
    email,
    password,
    user: res.body.user as { id: string; email: string; name: string },
  };
}

/** A user who owns a shop with one zone and one sensor, all made through the API. */
export async function ownerWithSensor(t: PersonMaker) {
  const owner = await verifiedPerson(t, 'Owner');
  const shop = (
    await owner.agent
      .post('/api/v1/shops')
      .send({ name: 'Test shop', timeZone: 'Europe/Oslo' })
      .expect(201)
  ).body as { id: string };
  const zone = (
    await owner.agent
      .post(`/api/v1/shops/${shop.id}/zones`)
      .send({ name: 'Machine room' })
      .expect(201)
  ).body as { id: string };
  const sensor = (
    await owner.agent
      .post(`/api/v1/shops/${shop.id}/sensors`)
      .send({ name: 'Saw probe', zoneId: zone.id })
      .expect(201)
  ).body as { id: string; token: string };
  return { ...owner, shopId: shop.id, zoneId: zone.id, sensorId: sensor.id, token: sensor.token };
}

/** An owner's shop (one zone, one sensor) with a second person in it as a member, invited by mail. */
export async function ownerWithMember(t: PersonMaker) {
  const owner = await ownerWithSensor(t);
  const member = await verifiedPerson(t, 'Shop Member');
  await owner.agent
    .post(`/api/v1/shops/${owner.shopId}/invitations`)
    .send({ email: member.email, role: 'member' })
    .expect(201);
  const token = linkToken(await waitForMail(t.outbox, member.email), 'invite');
  await member.agent.post(`/api/v1/invitations/${token}/accept`).expect(200);
  return { owner, member };
}
