/**
 * The server's entry point: reads the configuration, connects, listens, and shuts down cleanly
 * on SIGINT/SIGTERM (stop taking requests, close live sockets, drain the pool).
 */
import http from 'node:http';

import { createDatabase } from '@/db';

import { createApp } from './app';
import { createSensorTokenCache } from './auth/sensorTokens';
import { createSessionSigner } from './auth/session';
import { readConfig } from './config';
import { startLiveHub } from './live/hub';
import { startNotificationListener } from './live/listener';
import { createSurfaceEstimator } from './readings/surfaceEstimates';
import { createReadingWriter } from './readings/writer';

async function main() {
  const config = readConfig();
  const { pool, db } = createDatabase(config.databaseUrl);
  const sessions = createSessionSigner(config.sessionSecret, config.cookieSecure);
  const listener = startNotificationListener(config.databaseUrl, console.log);
  const tokens = createSensorTokenCache(db, { listener });
  const writer = createReadingWriter(pool);
  const estimator = createSurfaceEstimator(db);
  const app = createApp({ db, pool, sessions, tokens, writer, estimator, webDir: config.webDir });
  const hub = startLiveHub({ listener, db, sessions });
  await listener.ready;

  const server = http.createServer(app);
  hub.attach(server);
  await new Promise<void>((resolve) => server.listen(config.port, config.host, resolve));
  console.log(`Drybench server listening on http://${config.host}:${config.port}`);

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`Drybench server stopping (${signal})…`);
    server.close();
    await writer.close();
    await hub.close();
    await listener.close();
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
