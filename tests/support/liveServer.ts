// The whole server as `npm start` runs it — Express app, live hub, exported web app — on a
// free loopback port, over the test database (or another, for fault tests).
import http from 'node:http';
import type { AddressInfo } from 'node:net';

import { seedDemo } from '@/db/seed';
import { hashPassword } from '@/server/auth/password';
import { hashToken, newSensorToken } from '@/server/auth/sensorTokens';
import { startLiveHub } from '@/server/live/hub';

import { makeTestApp, type TestAppOptions } from './app';

/** One server instance; several of them on one database behave as behind a load balancer. */
export async function startInstance(options: TestAppOptions = {}) {
  const t = makeTestApp({ webDir: 'dist', ...options, listen: true });
  const hub = startLiveHub({ listener: t.listener!, db: t.db, sessions: t.sessions });
  await t.listener!.ready;
  const server = http.createServer(t.app);
  hub.attach(server);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    app: t,
    hub,
    async close() {
      await hub.close();
      await t.listener!.close();
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
      await t.pool.end();
    },
  };
}

/** An instance with the demo shop seeded (its sensor tokens re-issued), for browser tests. */
export async function startLiveServer() {
  const instance = await startInstance();
  const demo = await seedDemo(instance.app.db, {
    hashPassword,
    newToken: newSensorToken,
    hashToken,
  });
  return { ...instance, demo };
}

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];
