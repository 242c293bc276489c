/**
 * Sessions are signed tokens (HS256 via jose) in an httpOnly cookie, so any server instance
 * can check them without shared memory.
 */
import { jwtVerify, SignJWT } from 'jose';

export const SESSION_COOKIE = 'drybench_session';
const SESSION_TTL_S = 7 * 24 * 60 * 60;

export interface SessionSigner {
  sign(userId: string): Promise<string>;
  verify(token: string): Promise<string | null>;
  cookieOptions: { httpOnly: true; sameSite: 'lax'; secure: boolean; path: '/'; maxAge: number };
}

export function createSessionSigner(secret: string, secure: boolean): SessionSigner {
  const key = new TextEncoder().encode(secret);
  return {
    async sign(userId) {
      return new SignJWT({})
        .setProtectedHeader({ alg: 'HS256' })
        .setSubject(userId)
        .setIssuedAt()
        .setExpirationTime(`${SESSION_TTL_S}s`)
        .sign(key);
    },
    async verify(token) {
      try {
        const { payload } = await jwtVerify(token, key, { algorithms: ['HS256'] });
        return typeof payload.sub === 'string' ? payload.sub : null;
      } catch {
        return null;
      }
    },
    cookieOptions: {
      httpOnly: true,
      sameSite: 'lax',
      secure,
      path: '/',
      maxAge: SESSION_TTL_S * 1000,
    },
  };
}

/** Reads one cookie from a Cookie header; we need only ours, so no parser package. */
export function readCookie(header: string | undefined, name: string): string | null {
  if (!header) return null;
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq === -1) continue;
    if (part.slice(0, eq).trim() === name) {
      try {
        return decodeURIComponent(part.slice(eq + 1).trim());
      } catch {
        return null;
      }
    }
  }
  return null;
}
