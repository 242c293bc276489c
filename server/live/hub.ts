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
import { LIVE_CHANNEL } from '@/db/queries/readings';

import { readCookie, SESSION_COOKIE, type SessionSigner } from '../auth/session';

import type { NotificationListener } from './listener';
import type { LiveMessage } from './messages';

export const LIVE_PATH = '/api/v1/live';
const HEARTBEAT_MS = 30_000;

interface Client {
  socket: WebSocket;
  shopIds: Set<string>;
  alive: boolean;
}

export interface LiveHub {
  attach(server: Server): void;
  clientCount(): number;
  close(): Promise<void>;
}

export function startLiveHub(deps: {
  listener: NotificationListener;
  db: Db;
  sessions: SessionSigner;
}): LiveHub {
  const clients = new Set<Client>();
  const wss = new WebSocketServer({ noServer: true });

  function deliver(payload: string | undefined) {
    if (!payload) return;
    let message: LiveMessage;
    try {
      message = JSON.parse(payload) as LiveMessage;
    } catch {
      return;
    }
    for (const client of clients) {
      if (client.shopIds.has(message.shopId) && client.socket.readyState === WebSocket.OPEN) {
        client.socket.send(payload);
      }
    }
  }

  deps.listener.on(LIVE_CHANNEL, deliver);

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

  function refuse(socket: Duplex, status: string) {
    socket.write(`HTTP/1.1 ${status}\r\nConnection: close\r\nContent-Length: 0\r\n\r\n`);
    socket.destroy();
  }

  async function onUpgrade(req: IncomingMessage, socket: Duplex, head: Buffer) {
    const url = new URL(req.url ?? '/', 'http://localhost');
    if (url.pathname !== LIVE_PATH) return refuse(socket, '404 Not Found');
    const token = readCookie(req.headers.cookie, SESSION_COOKIE);
    const userId = token ? await deps.sessions.verify(token) : null;
    if (!userId) return refuse(socket, '401 Unauthorized');
    let shopIds: Set<string>;
    try {
      shopIds = new Set((await listShopsOfUser(deps.db, userId)).map((s) => s.id));
    } catch {
      return refuse(socket, '503 Service Unavailable');
    }
    wss.handleUpgrade(req, socket, head, (ws) => {
      const client: Client = { socket: ws, shopIds, alive: true };
      clients.add(client);
      ws.on('pong', () => (client.alive = true));
      ws.on('close', () => clients.delete(client));
      ws.on('error', () => ws.terminate());
      ws.send(JSON.stringify({ type: 'hello', shopIds: [...shopIds] }));
    });
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
