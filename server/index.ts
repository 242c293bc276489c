/**
 * The server's entry point: reads the configuration, connects, listens, and shuts down cleanly
 * on SIGINT/SIGTERM (stop taking requests, close live sockets, drain the pool).
 */
import http from 'node:http';

import { createDatabase } from '@/db';

import { createAlarmEngine } from './alarms';
import { createApp } from './app';
import { createSensorTokenCache } from './auth/sensorTokens';
import { createSessionSigner } from './auth/session';
import { readConfig } from './config';
import {
  createAlarmMailQueue,
  queueAlarmMails,
  scheduleAlarmSweep,
  startJobRunner,
  workAlarmMails,
} from './jobs';
import { startLiveHub } from './live/hub';
import { startNotificationListener } from './live/listener';
import { startMail } from './mail';
import { createSurfaceEstimator } from './readings/surfaceEstimates';
import { createReadingWriter } from './readings/writer';

async function main() {
  const config = readConfig();
  const { pool, db } = createDatabase(config.databaseUrl, {
    statementTimeoutMs: config.statementTimeoutMs,
    queryTimeoutMs: config.queryTimeoutMs,
  });
  const sessions = createSessionSigner(config.sessionSecret, config.cookieSecure);
  const listener = startNotificationListener(config.databaseUrl, console.log);
  const tokens = createSensorTokenCache(db, { listener });
  const writer = createReadingWriter(pool, { maxPendingRows: config.ingestMaxPendingRows });
  const estimator = createSurfaceEstimator(db);
  const mail = await startMail(config.mail);
  // pg-boss first: the engine queues each opened alarm's e-mail as a job in its transaction.
  const jobs = await startJobRunner({ databaseUrl: config.databaseUrl, log: console.log });
  await createAlarmMailQueue(jobs);
  const alarms = createAlarmEngine({
    db,
    pool,
    onOpened: queueAlarmMails(jobs, { log: console.log }),
  });
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
    publicUrl: config.publicUrl,
    devOutbox: config.devOutbox ? mail.outbox : undefined,
  });
  const trustedOrigins = new Set([new URL(config.publicUrl).origin]);
  const hub = startLiveHub({ listener, db, sessions, trustedOrigins });
  await listener.ready;
  await scheduleAlarmSweep(jobs, alarms, { log: console.log });
  await workAlarmMails(jobs, {
    db,
    pool,
    mailer: mail.mailer,
    publicUrl: config.publicUrl,
    log: console.log,
  });

  const server = http.createServer(app);
  hub.attach(server);
  await new Promise<void>((resolve) => server.listen(config.port, config.host, resolve));
  console.log(`Drybench server listening on http://${config.host}:${config.port}`);
  console.log(`Drybench ${mail.describe}`);
  if (config.devOutbox && mail.outbox) console.log(`Outbox: ${config.publicUrl}/dev/outbox`);

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`Drybench server stopping (${signal})…`);
    server.close();
    await writer.close();
    await jobs.stop({ graceful: true, timeout: 10_000 });
    await hub.close();
    await listener.close();
    await mail.close();
    server.closeAllConnections();
    await pool.end();
    process.exit(0);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
