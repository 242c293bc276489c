// The test app with its live hub on a free loopback port, for API tests that open sockets to
// GET /api/v1/live: the app's own LISTEN connection feeds the hub, as in production.
import http from 'node:http';
import type { AddressInfo } from 'node:net';

import { startLiveHub } from '@/server/live/hub';

import { makeTestApp, type TestApp } from './app';

export interface HubServer {
  t: TestApp;
  /** ws://127.0.0.1:<port>/api/v1/live */
  wsUrl: string;
  close(): Promise<void>;
}

export async function startHubServer(): Promise<HubServer> {
  const t = makeTestApp({ listen: true });
  const hub = startLiveHub({
    listener: t.listener!,
    db: t.db,
    sessions: t.sessions,
    allowedHosts: t.allowedHosts,
    echo: t.echo,
  });
  await t.listener!.ready;
  const server = http.createServer(t.app);
  hub.attach(server);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    t,
    wsUrl: `ws://127.0.0.1:${(server.address() as AddressInfo).port}/api/v1/live`,
    async close() {
      await hub.close();
      await t.listener!.close();
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
      await t.pool.end();
    },
  };
}
