// The whole server as `npm start` runs it — Express app, live hub, exported web app — on a
// free loopback port, over the test database (or another, for fault tests).
import http from 'node:http';
import type { AddressInfo } from 'node:net';

import { seedDemo } from '@/db/seed';
import { hashPassword } from '@/server/auth/password';
import { allowedHostsOf } from '@/server/auth/hosts';
import { hashToken, newSensorToken } from '@/server/auth/sensorTokens';
import { startLiveHub } from '@/server/live/hub';

import { makeTestApp, TEST_PUBLIC_URL, type TestAppOptions } from './app';

/**
 * One server instance; several of them on one database behave as behind a load balancer.
 * With `strictHosts` it answers exactly the Host values server/index.ts would allow for its
 * port (browser tests); without, also supertest's ephemeral ports on the same app.
 */
export async function startInstance(options: TestAppOptions & { strictHosts?: boolean } = {}) {
  // Listen first: the port is part of the allowed Host values, computed once, as in production.
  const server = http.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  const { strictHosts, ...appOptions } = options;
  const t = makeTestApp({
    webDir: 'dist',
    ...appOptions,
    listen: true,
    ...(strictHosts ? { allowedHosts: allowedHostsOf(port, TEST_PUBLIC_URL) } : {}),
  });
  const hub = startLiveHub({
    listener: t.listener!,
    db: t.db,
    sessions: t.sessions,
    allowedHosts: t.allowedHosts,
  });
  await t.listener!.ready;
  server.on('request', t.app);
  hub.attach(server);
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

/**
 * An instance with the demo shop seeded (its sensor tokens re-issued), for browser tests;
 * `options` adds what a test needs, e.g. photo storage (tests/support/s3.ts).
 */
export async function startLiveServer(options: TestAppOptions = {}) {
  const instance = await startInstance({ ...options, strictHosts: true });
  const demo = await seedDemo(instance.app.db, {
    hashPassword,
    newToken: newSensorToken,
    hashToken,
  });
  return { ...instance, demo };
}

export { CHROMIUM_ARGS } from './chromium';
