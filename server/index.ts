/**
 * The server's entry point: reads the configuration, connects, listens, and shuts down cleanly
 * on SIGINT/SIGTERM (stop taking requests, close live sockets, drain the pool).
 */
import http from 'node:http';

import { BACKGROUND_CONNECTION_TIMEOUT_MS, BACKGROUND_POOL_MAX, createDatabase } from '@/db';
import { startNotificationListener } from '@/db/listener';

import { createAlarmEngine } from './alarms';
import { createAlarmQueue } from './alarms/queue';
import { createApp } from './app';
import { createS3Storage } from './storage';
import { allowedHostsOf } from './auth/hosts';
import { createSensorTokenCache } from './auth/sensorTokens';
import { createSessionSigner } from './auth/session';
import { readConfig } from './config';
import {
  createAlarmMailQueue,
  createImportQueue,
  importJobs,
  queueAlarmMails,
  scheduleAlarmSweep,
  scheduleReadingPartitionMaintenance,
  runReadingRollup,
  scheduleReadingRollups,
  scheduleWeekReportMails,
  startJobRunner,
  workAlarmMails,
  scheduleUploadExpiry,
  workImports,
} from './jobs';
import { startLiveHub } from './live/hub';
import { createLiveEcho } from './live/localEcho';
import { createLogger, type Logger } from './logger';
import { startMail } from './mail';
import { createMessageAnswerer, defaultClientIdPrefix, startMqttIngest } from './mqtt';
import { createSurfaceEstimator } from './readings/surfaceEstimates';
import { createReadingWriter } from './readings/writer';

// Pretty lines for a person at a terminal; one JSON object per line for everything else.
const pretty = process.stdout.isTTY === true;
// Until the configuration names its level (and to report a configuration that is invalid).
let logger: Logger = createLogger({ level: 'info', pretty });

async function main() {
  const config = readConfig();
  logger = createLogger({ level: config.logLevel, pretty });
  const log = logger.child({ component: 'server' });
  const { pool, db } = createDatabase(config.databaseUrl, {
    statementTimeoutMs: config.statementTimeoutMs,
    queryTimeoutMs: config.queryTimeoutMs,
  });
  // Long background work (roll-ups, partition maintenance) gets a small pool of its own, so it
  // can never hold the connections requests wait for (a status poll answered 503 while a year
  // of an import's roll-ups ran on the request pool).
  const background = createDatabase(config.databaseUrl, {
    max: BACKGROUND_POOL_MAX,
    statementTimeoutMs: config.statementTimeoutMs,
    queryTimeoutMs: config.queryTimeoutMs,
    connectionTimeoutMs: BACKGROUND_CONNECTION_TIMEOUT_MS,
    applicationName: 'drybench-background',
    // The jobs' statements read readings across every month partition (the roll-up job's
    // touched hours, partition maintenance); JIT compiling their plans cost far more than it
    // saved on the roll-up statement (db/queries/readingRollups.ts), so none of them JIT.
    sessionOptions: '-c jit=off',
  });
  const sessions = createSessionSigner(config.sessionSecret, config.cookieSecure);
  const listener = startNotificationListener(config.databaseUrl, logger);
  const tokens = createSensorTokenCache(db, { listener });
  // The writer hands this instance's hub its reading messages at commit (server/live/localEcho.ts).
  const echo = createLiveEcho();
  const writer = createReadingWriter(pool, {
    maxPendingRows: config.ingestMaxPendingRows,
    echo,
  });
  const estimator = createSurfaceEstimator(db);
  const mail = await startMail(config.mail, logger);
  // pg-boss first: the engine queues each opened alarm's e-mail as a job in its transaction.
  const jobs = await startJobRunner({ databaseUrl: config.databaseUrl, logger });
  await createAlarmMailQueue(jobs);
  // Before the app answers: a started import's job needs its queue.
  await createImportQueue(jobs);
  const storage = config.storage && createS3Storage(config.storage);
  const alarms = createAlarmEngine({
    db,
    pool,
    logger,
    onOpened: queueAlarmMails(jobs, { logger }),
  });
  // Computed once: PUBLIC_URL's host and this port's loopback names.
  const allowedHosts = allowedHostsOf(config.port, config.publicUrl);
  const app = createApp({
    db,
    pool,
    sessions,
    tokens,
    writer,
    estimator,
    alarms,
    webDir: config.webDir,
    mailer: mail.mailer,
    storage,
    imports: importJobs(jobs),
    publicUrl: config.publicUrl,
    mqttPublicUrl: config.mqtt?.publicUrl,
    allowedHosts,
    trustProxy: config.trustProxy,
    devOutbox: config.devOutbox ? mail.outbox : undefined,
    logger,
  });
  const trustedOrigins = new Set([new URL(config.publicUrl).origin]);
  const hub = startLiveHub({
    listener,
    db,
    sessions,
    allowedHosts,
    trustedOrigins,
    limits: config.liveSocketsPerUser ? { maxSocketsPerUser: config.liveSocketsPerUser } : {},
    echo,
  });
  await listener.ready;
  await scheduleAlarmSweep(jobs, alarms, { logger });
  // Hourly roll-ups of the readings, which the history, exposure and reports read past 7 days.
  await scheduleReadingRollups(jobs, { db: background.db, logger });
  await workAlarmMails(jobs, {
    db,
    pool,
    mailer: mail.mailer,
    publicUrl: config.publicUrl,
    logger,
  });
  // Daily: the coming months' partitions of readings, and raw readings past the keep window.
  await scheduleReadingPartitionMaintenance(jobs, {
    db: background.db,
    logger,
    keepMonths: config.rawReadingsKeepMonths,
    // Roll every finished hour up first, so no raw month goes before its hours are kept.
    before: () => runReadingRollup(background.db, Date.now()),
  });
  // CSV imports: two at a time on each instance (server/jobs/importJob.ts says why), and
  // hourly, uploads never started are let go; without storage there are no files to import.
  if (storage) {
    await workImports(jobs, { db, pool, background: background.db, storage, logger });
    await scheduleUploadExpiry(jobs, { pool, storage, logger });
  }
  // Monday 07:00 shop time: last week's report to owners and members who keep it on.
  await scheduleWeekReportMails(jobs, {
    db,
    pool,
    mailer: mail.mailer,
    publicUrl: config.publicUrl,
    logger,
  });

  // MQTT readings take the HTTP route's pipeline; their alarms go through a queue of their own
  // (the engine locks each zone it judges, so two queues never judge one zone at once).
  const mqtt =
    config.mqtt &&
    startMqttIngest({
      url: config.mqtt.url,
      password: config.mqtt.password,
      connections: config.mqtt.connections,
      clientIdPrefix: defaultClientIdPrefix(config.port),
      answer: createMessageAnswerer({
        db,
        writer,
        estimator,
        alarms: createAlarmQueue(alarms, logger),
        now: Date.now,
        logger,
      }),
      logger,
    });

  const server = http.createServer(app);
  hub.attach(server);
  await new Promise<void>((resolve) => server.listen(config.port, config.host, resolve));
  // The bench harness (scripts/bench) waits for "listening on" in this line.
  log.info(
    { host: config.host, port: config.port, logLevel: config.logLevel },
    `Drybench server listening on http://${config.host}:${config.port}`,
  );
  log.info(`Drybench ${mail.describe}`);
  log.info(
    config.storage
      ? `Drybench photos go to bucket ${config.storage.bucket} at ${config.storage.endpoint ?? `the S3 default for ${config.storage.region}`}`
      : 'Drybench has no photo storage (S3_BUCKET unset): photo uploads answer 503.',
  );
  log.info(
    config.mqtt
      ? `Drybench shows sensors the MQTT broker ${config.mqtt.publicUrl}`
      : 'Drybench takes no MQTT readings (MQTT_URL unset).',
  );
  if (config.devOutboxRefusal) log.warn(config.devOutboxRefusal);
  if (!config.publicUrlSet && (config.host === '0.0.0.0' || config.host === '::')) {
    log.warn(
      `HOST=${config.host} without PUBLIC_URL: only this machine's loopback names are answered; ` +
        'set PUBLIC_URL to the address people and sensors use.',
    );
  }
  if (config.devOutbox && mail.outbox) log.info(`Outbox: ${config.publicUrl}/dev/outbox`);

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    log.info({ signal }, `Drybench server stopping (${signal})…`);
    server.close();
    // No new messages, and none acknowledged that is not stored: the writer drains after it.
    await mqtt?.close();
    await writer.close();
    await jobs.stop({ graceful: true, timeout: 10_000 });
    await hub.close();
    await listener.close();
    await mail.close();
    server.closeAllConnections();
    await pool.end();
    await background.pool.end();
    process.exit(0);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
}

main().catch((err: unknown) => {
  // The message says what to fix (an invalid setting, an unreachable database); a stack would not.
  logger.fatal(`Drybench server could not start: ${err instanceof Error ? err.message : err}`);
  process.exit(1);
});
