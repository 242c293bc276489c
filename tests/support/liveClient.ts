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
