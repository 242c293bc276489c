// The session cookie as a browser would send it back, for tests that talk to the server
// without an agent (raw Cookie headers, WebSocket upgrades, a second instance).
import request from 'supertest';

import { SESSION_COOKIE } from '@/server/auth/session';

/** The session cookie a response sets, as the `name=value` of a Cookie header. */
export function sessionCookieOf(res: request.Response): string {
  const raw = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const found = raw.find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  if (!found) throw new Error('no session cookie');
  return found.split(';')[0]!;
}

/** Signs in (an app or a server's base URL) and returns the new session's cookie. */
export async function signInCookie(
  app: Parameters<typeof request>[0],
  credentials: { email: string; password: string },
): Promise<string> {
  const res = await request(app).post('/api/v1/auth/sign-in').send(credentials).expect(200);
  return sessionCookieOf(res);
}
