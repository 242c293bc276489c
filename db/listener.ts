/**
 * One LISTEN connection per server instance, shared by everything that reacts to other
 * instances: the live hub (readings, alarms) and the sensor-token cache (revocations). It
 * reconnects after a database restart and re-LISTENs on every channel. Whatever was notified
 * while it was down is lost, so it tells `onReconnect` handlers to catch up by other means.
 * The channel names and the sending side are in db/notify.ts.
 */
import pg from 'pg';
import type { Logger } from 'pino';

const RECONNECT_MS = 1_000;

/** How the connection shows in pg_stat_activity, so an operator can tell it from the pool. */
const APPLICATION_NAME = 'drybench-listener';

export type NotificationHandler = (payload: string) => void;

export interface NotificationListener {
  on(channel: string, handler: NotificationHandler): void;
  /** Called each time a new connection is listening after a lost one (not the first time). */
  onReconnect(handler: () => void): void;
  /** Resolves once the first connection is listening (or the listener closes). */
  ready: Promise<void>;
  close(): Promise<void>;
}

// Channel names are our own constants, but LISTEN takes an identifier, not a parameter.
const CHANNEL_NAME = /^[a-z_][a-z0-9_]*$/;

export function startNotificationListener(
  databaseUrl: string,
  logger: Logger,
): NotificationListener {
  const log = logger.child({ component: 'live' });
  let lostAtMs: number | null = null;
  const handlers = new Map<string, NotificationHandler[]>();
  const reconnectHandlers: (() => void)[] = [];
  let connectedBefore = false;
  let client: pg.Client | null = null;
  let closed = false;
  let markReady: () => void = () => {};
  const ready = new Promise<void>((resolve) => (markReady = resolve));

  async function listenOn(c: pg.Client, channel: string) {
    await c.query(`LISTEN ${channel}`);
  }

  async function loop(): Promise<void> {
    while (!closed) {
      // A fallback, so an application_name in the URL or PGAPPNAME still wins.
      const c = new pg.Client({
        connectionString: databaseUrl,
        connectionTimeoutMillis: 3000,
        fallback_application_name: APPLICATION_NAME,
      });
      try {
        await c.connect();
        c.on('notification', (n) => {
          for (const handler of handlers.get(n.channel) ?? []) handler(n.payload ?? '');
        });
        for (const channel of handlers.keys()) await listenOn(c, channel);
        client = c;
        markReady();
        if (lostAtMs !== null) {
          log.info({ downMs: Date.now() - lostAtMs }, 'notification listener: listening again');
          lostAtMs = null;
        }
        if (connectedBefore) for (const handler of reconnectHandlers) handler();
        connectedBefore = true;
        await new Promise<void>((resolve) => {
          c.on('error', () => resolve());
          c.on('end', () => resolve());
        });
        if (!closed) {
          lostAtMs = Date.now();
          log.warn('notification listener: lost its database connection; reconnecting');
        }
      } catch (err) {
        // The database is away: try again shortly, saying so once per outage, not every second.
        if (lostAtMs === null && !closed) {
          lostAtMs = Date.now();
          log.warn({ err }, 'notification listener: cannot connect; retrying every second');
        }
      }
      client = null;
      await c.end().catch(() => {});
      if (!closed) await new Promise((r) => setTimeout(r, RECONNECT_MS));
    }
  }
  void loop();

  return {
    on(channel, handler) {
      if (!CHANNEL_NAME.test(channel)) throw new Error(`bad channel name: ${channel}`);
      const list = handlers.get(channel);
      if (list) return void list.push(handler);
      handlers.set(channel, [handler]);
      if (client) void listenOn(client, channel).catch(() => {});
    },
    onReconnect(handler) {
      reconnectHandlers.push(handler);
    },
    ready,
    async close() {
      closed = true;
      markReady();
      await client?.end().catch(() => {});
    },
  };
}
