/**
 * The live hub: every server instance LISTENs on one PostgreSQL channel (through the shared
 * notification listener) and forwards each notification to its own WebSocket clients of that
 * shop. Fan-out through the database means
 * instances share no memory, so more of them can stand behind a load balancer.
 */
import type { IncomingMessage, Server } from 'node:http';
import type { Duplex } from 'node:stream';

import { WebSocket, WebSocketServer } from 'ws';

import type { Db } from '@/db';
import { listShopsOfUser } from '@/db/queries/memberships';
import type { NotificationListener } from '@/db/listener';
import { LIVE_CHANNEL } from '@/db/notify';
import { findSessionState } from '@/db/queries/users';
import {
  LIVE_PATH,
  type AccessMessage,
  type HelloMessage,
  type AlarmMessage,
  type ReadingMessage,
  type ShopChangeMessage,
} from '@/ingest/wire/live';

import { isAllowedHost, misdirected, type AllowedHosts } from '../auth/hosts';
import { isTrustedUpgradeOrigin } from '../auth/origin';
import type { SessionSigner } from '../auth/session';
import { resolveSession } from '../auth/sessionState';
import { markHeard, stageMs, stageTraceOn } from '../stageTrace';

import type { LiveEcho } from './localEcho';
import { missedMessages } from './replay';
import { createShopIndex } from './shopIndex';

const HEARTBEAT_MS = 30_000;
/** setTimeout's longest delay (~24.8 days); sessions last 7 days, so it never cuts one short. */
const MAX_TIMER_MS = 2 ** 31 - 1;

/** What one client may cost an instance. DEVELOPERS.md gives the reason for each number. */
export interface LiveLimits {
  /** Largest frame a client may send; larger ones close the socket with 1009. */
  maxPayloadBytes: number;
  /** Open sockets per account on this instance; the next upgrade answers 429. */
  maxSocketsPerUser: number;
  /** Unsent bytes a client may fall behind by before it is dropped (it back-fills on return). */
  maxBufferedBytes: number;
}

export const DEFAULT_LIVE_LIMITS: LiveLimits = {
  // Clients send nothing but control frames (pings, close); 4 KiB is far above those.
  maxPayloadBytes: 4 * 1024,
  // A person with a phone and a few tabs open; more from one account is a leak or a script.
  maxSocketsPerUser: 10,
  // ~2,500 reading messages of ~400 bytes: a client that far behind is better off reconnecting.
  maxBufferedBytes: 1024 * 1024,
};

interface Client {
  socket: WebSocket;
  userId: string;
  sessionVersion: number;
  shopIds: Set<string>;
  alive: boolean;
  /** Closes the socket when the session token it was opened with expires. */
  expiry: ReturnType<typeof setTimeout>;
}

/**
 * Between instances only, on LIVE_CHANNEL (db/queries/memberships.ts sends it inside the
 * committing transaction): these people's shops or sessions changed. Never sent to a browser.
 */
interface AccessNotice {
  type: 'access';
  userIds: string[];
}

/** Close code for a socket whose session ended (sign-out, password change elsewhere, expiry). */
const SESSION_ENDED = 4401;

export interface LiveHub {
  attach(server: Server): void;
  clientCount(): number;
  close(): Promise<void>;
}

export function startLiveHub(deps: {
  listener: NotificationListener;
  db: Db;
  sessions: SessionSigner;
  /** The same Host rule as every HTTP request (server/auth/hosts.ts). */
  allowedHosts: AllowedHosts;
  /** Origins besides the request's own host that may open a socket (PUBLIC_URL). */
  trustedOrigins?: ReadonlySet<string>;
  limits?: Partial<LiveLimits>;
  /** Shared with this instance's reading writer: its messages are delivered at commit. */
  echo?: LiveEcho;
}): LiveHub {
  const clients = new Set<Client>();
  const byShop = createShopIndex<Client>();
  /** The only way a client's shops change, so the index never disagrees with `shopIds`. */
  function watch(client: Client, shopIds: Set<string>) {
    client.shopIds = shopIds;
    // A re-check that ends after its socket closed must not put the socket back.
    if (clients.has(client)) byShop.set(client, shopIds);
  }
  const socketsPerUser = new Map<string, number>();
  const trusted = deps.trustedOrigins ?? new Set<string>();
  const limits: LiveLimits = { ...DEFAULT_LIVE_LIMITS, ...deps.limits };
  const wss = new WebSocketServer({ noServer: true, maxPayload: limits.maxPayloadBytes });

  /**
   * Sends unless the client has fallen too far behind (it stopped reading, or its link is too
   * slow for the stream). Such a client is terminated rather than closed: a close frame would
   * queue behind the unread megabyte and ws would hold the buffer for its 30 s close timeout.
   * The app's client reconnects and the server back-fills from its `since=`. This is the only
   * per-socket work on the delivery path besides the send itself.
   *
   * A Buffer is sent as a text frame as it is: ws frames it without copying, where a string
   * would be encoded to UTF-8 again for every socket.
   */
  function send(client: Client, payload: string | Buffer) {
    if (client.socket.readyState !== WebSocket.OPEN) return;
    if (client.socket.bufferedAmount > limits.maxBufferedBytes) {
      client.socket.terminate();
      return;
    }
    cork(client);
    client.socket.send(payload, { binary: false });
  }

  /**
   * Several notifications often arrive in one read of the LISTEN connection (a group commit
   * sends one per request): a socket's frames of this tick are held and leave in one write
   * when the tick ends, instead of one system call each. ws corks only around a single
   * frame, and cork() counts, so its own uncork inside ours does not flush early.
   */
  const corked = new Set<Duplex>();
  function cork(client: Client) {
    // ws keeps its TCP socket private; without it (a test double) frames simply go one by one.
    const raw = (client.socket as unknown as { _socket?: Duplex })._socket;
    if (!raw || corked.has(raw)) return;
    if (corked.size === 0) process.nextTick(uncorkAll);
    raw.cork();
    corked.add(raw);
  }
  function uncorkAll() {
    for (const raw of corked) raw.uncork();
    corked.clear();
  }

  function deliver(payload: string | undefined) {
    if (!payload) return;
    const t0 = performance.now();
    type Notice = ReadingMessage | AlarmMessage | ShopChangeMessage | AccessNotice;
    let message: Notice;
    try {
      message = JSON.parse(payload) as Notice;
    } catch {
      return;
    }
    if (message.type === 'access') return void recheck(message.userIds);
    const watchers = byShop.watching(message.shopId);
    if (watchers) {
      // Encoded once for the whole shop.
      const frame = Buffer.from(payload);
      for (const client of watchers) send(client, frame);
    }
    if (stageTraceOn) stageMs('hub.fanout', performance.now() - t0);
  }

  /**
   * The same rule as every HTTP request, applied to open sockets when it may have changed: a
   * socket whose session ended is closed, and its shop list is read again, so a removed
   * member stops receiving a shop's messages as soon as the removal commits.
   */
  async function recheck(userIds: Iterable<string>) {
    const wanted = new Set(userIds);
    const affected = [...clients].filter((c) => wanted.has(c.userId));
    for (const userId of new Set(affected.map((c) => c.userId))) {
      try {
        const state = await findSessionState(deps.db, userId);
        const shopIds = new Set((await listShopsOfUser(deps.db, userId)).map((s) => s.id));
        for (const client of affected.filter((c) => c.userId === userId)) {
          if (state?.sessionVersion !== client.sessionVersion) {
            endSession(client);
            continue;
          }
          watch(client, shopIds);
          const access: AccessMessage = { type: 'access', shopIds: [...shopIds] };
          send(client, JSON.stringify(access));
        }
      } catch {
        // Database away: stop sending these sockets anything until they reconnect and re-check.
        for (const client of affected.filter((c) => c.userId === userId)) client.socket.terminate();
      }
    }
  }

  function endSession(client: Client) {
    watch(client, new Set());
    client.socket.close(SESSION_ENDED, 'session ended');
  }

  deps.echo?.bind(deliver);
  deps.listener.on(LIVE_CHANNEL, (payload) => {
    markHeard(payload);
    if (!deps.echo || deps.echo.heard(payload)) deliver(payload);
  });
  // Access notices sent while the LISTEN connection was down are lost: check everyone again.
  deps.listener.onReconnect(() => {
    deps.echo?.reset();
    void recheck(new Set([...clients].map((c) => c.userId)));
  });

  const heartbeat = setInterval(() => {
    for (const client of clients) {
      if (!client.alive) {
        client.socket.terminate();
        continue;
      }
      client.alive = false;
      client.socket.ping();
    }
  }, HEARTBEAT_MS);

  function refuse(socket: Duplex, status: string, body = '') {
    const type = body ? 'Content-Type: application/json; charset=utf-8\r\n' : '';
    socket.write(
      `HTTP/1.1 ${status}\r\nConnection: close\r\n${type}` +
        `Content-Length: ${Buffer.byteLength(body)}\r\n\r\n${body}`,
    );
    socket.destroy();
  }

  async function onUpgrade(req: IncomingMessage, socket: Duplex, head: Buffer) {
    // First, as for HTTP: a rebound host name gets nothing, not even a 404.
    if (!isAllowedHost(req.headers.host, deps.allowedHosts)) {
      const { code, message, details } = misdirected();
      return refuse(
        socket,
        '421 Misdirected Request',
        JSON.stringify({ error: { code, message, details } }),
      );
    }
    const url = new URL(req.url ?? '/', 'http://localhost');
    if (url.pathname !== LIVE_PATH) return refuse(socket, '404 Not Found');
    // A page on another site must not open a socket with this browser's cookie.
    if (!isTrustedUpgradeOrigin(req.headers.origin, req.headers.host, trusted)) {
      return refuse(socket, '403 Forbidden');
    }
    let session: Awaited<ReturnType<typeof resolveSession>>;
    let shopIds: Set<string>;
    try {
      session = await resolveSession(deps.db, deps.sessions, req.headers.cookie);
      if (!session || session === 'expired') return refuse(socket, '401 Unauthorized');
      shopIds = new Set((await listShopsOfUser(deps.db, session.claims.userId)).map((s) => s.id));
    } catch {
      return refuse(socket, '503 Service Unavailable');
    }
    const { userId, sessionVersion, expiresAtS } = session.claims;
    // No await between this count and handleUpgrade, whose callback runs synchronously (no
    // verifyClient), so concurrent upgrades of one person cannot all slip under the cap.
    const open = socketsPerUser.get(userId) ?? 0;
    if (open >= limits.maxSocketsPerUser) return refuse(socket, '429 Too Many Requests');
    wss.handleUpgrade(req, socket, head, (ws) => {
      const expiresInMs = Math.min(Math.max(expiresAtS * 1000 - Date.now(), 0), MAX_TIMER_MS);
      const client: Client = {
        socket: ws,
        userId,
        sessionVersion,
        shopIds,
        alive: true,
        // The upgrade checked the token once; without this a socket would outlive its session.
        expiry: setTimeout(() => endSession(client), expiresInMs),
      };
      clients.add(client);
      watch(client, shopIds);
      socketsPerUser.set(userId, (socketsPerUser.get(userId) ?? 0) + 1);
      ws.on('pong', () => (client.alive = true));
      ws.on('close', () => {
        clearTimeout(client.expiry);
        clients.delete(client);
        byShop.remove(client);
        const left = (socketsPerUser.get(userId) ?? 1) - 1;
        if (left > 0) socketsPerUser.set(userId, left);
        else socketsPerUser.delete(userId);
      });
      ws.on('error', () => ws.terminate());
      const hello: HelloMessage = { type: 'hello', shopIds: [...shopIds] };
      send(client, JSON.stringify(hello));
      const sinceMs = Date.parse(url.searchParams.get('since') ?? '');
      if (Number.isFinite(sinceMs)) void replay(client, sinceMs);
    });
  }

  /** Sends a reconnecting client what it missed; a failure only means it refetches itself. */
  async function replay(client: Client, sinceMs: number) {
    try {
      const missed = await missedMessages(deps.db, [...client.shopIds], sinceMs, Date.now());
      for (const message of missed) {
        if (client.socket.readyState !== WebSocket.OPEN) return;
        if (client.shopIds.has(message.shopId)) send(client, JSON.stringify(message));
      }
    } catch {
      // The database is away; the client's own refetch on reconnect covers the gap.
    }
  }

  return {
    attach(server) {
      server.on('upgrade', (req, socket, head) => {
        socket.on('error', () => socket.destroy());
        onUpgrade(req, socket, head).catch(() => refuse(socket, '500 Internal Server Error'));
      });
    },
    clientCount: () => clients.size,
    async close() {
      clearInterval(heartbeat);
      for (const client of clients) client.socket.terminate();
      await new Promise<void>((resolve) => wss.close(() => resolve()));
    },
  };
}
