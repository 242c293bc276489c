// A WebSocket client of GET /api/v1/live for API tests, signed in as a browser would be.
import request from 'supertest';
import WebSocket from 'ws';

export interface LiveClient {
  /** The first message (already received or still to come) that `match` accepts. */
  next<T>(match: (message: unknown) => message is T, timeoutMs: number): Promise<T>;
  close(): void;
}

export async function connectLive(
  baseUrl: string,
  credentials: { email: string; password: string },
): Promise<LiveClient> {
  const signIn = await request(baseUrl).post('/api/v1/auth/sign-in').send(credentials).expect(200);
  const cookie = String(signIn.headers['set-cookie']?.[0] ?? '').split(';')[0]!;
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
