// A WebSocket client of GET /api/v1/live for API tests, signed in as a browser would be.
import WebSocket from 'ws';

import { signInCookie } from './sessionCookie';

export interface LiveClient {
  /** The first message (already received or still to come) that `match` accepts. */
  next<T>(match: (message: unknown) => message is T, timeoutMs: number): Promise<T>;
  close(): void;
}

export async function connectLive(
  baseUrl: string,
  credentials: { email: string; password: string },
): Promise<LiveClient> {
  const cookie = await signInCookie(baseUrl, credentials);
  const received: unknown[] = [];
  const ws = new WebSocket(`${baseUrl.replace(/^http/, 'ws')}/api/v1/live`, {
    headers: { cookie },
  });
  ws.on('message', (data) => received.push(JSON.parse(String(data))));
  await new Promise<void>((resolve, reject) => {
    ws.once('open', () => resolve());
    ws.once('error', reject);
  });
  return {
    async next(match, timeoutMs) {
      const deadline = Date.now() + timeoutMs;
      for (;;) {
        const found = received.find(match);
        if (found !== undefined) return found;
        if (Date.now() > deadline) throw new Error(`no matching live message in ${timeoutMs} ms`);
        await new Promise((resolve) => setTimeout(resolve, 10));
      }
    },
    close: () => ws.close(),
  };
}

/** A raw socket for tests of the hub's rules: every message kept, and its close code. */
export interface RecordingSocket {
  ws: WebSocket;
  messages: { type: string; shopIds?: string[] }[];
  closed: Promise<number>;
}

/** Opens a socket with this Cookie header (and Origin); rejects with `refused <status>`. */
export function openRecordingSocket(
  wsUrl: string,
  cookie: string,
  origin?: string,
): Promise<RecordingSocket> {
  return new Promise((resolve, reject) => {
    const ws = new WebSocket(wsUrl, { headers: { cookie, ...(origin ? { origin } : {}) } });
    const messages: RecordingSocket['messages'] = [];
    const closed = new Promise<number>((r) => ws.on('close', (code) => r(code)));
    ws.on('message', (data) => messages.push(JSON.parse(String(data))));
    ws.on('open', () => resolve({ ws, messages, closed }));
    ws.on('unexpected-response', (_req, res) => reject(new Error(`refused ${res.statusCode}`)));
    ws.on('error', reject);
  });
}

/** Waits until `check` holds, polling every 20 ms; throws `timed out` past `timeoutMs`. */
export async function until(check: () => boolean | Promise<boolean>, timeoutMs = 2000) {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error('timed out');
    await new Promise((r) => setTimeout(r, 20));
  }
}
