/**
 * Sessions are signed tokens (HS256 via jose) in an httpOnly cookie, so any server instance
 * can check them without shared memory. Each token carries the account's session version:
 * sign-out and a password change bump the version in the database, which ends every older
 * token at once without a server-side session store.
 */
import type { Response } from 'express';
import { jwtVerify, SignJWT } from 'jose';

export const SESSION_COOKIE = 'drybench_session';
export const SESSION_TTL_S = 7 * 24 * 60 * 60;

export interface SessionClaims {
  userId: string;
  sessionVersion: number;
  issuedAtS: number;
  /** When the token stops being accepted; the live hub closes a socket opened with it then. */
  expiresAtS: number;
}

export interface CookieOptions {
  httpOnly: true;
  sameSite: 'lax';
  secure: boolean;
  path: '/';
  maxAge: number;
}

export interface SessionSigner {
  sign(userId: string, sessionVersion: number): Promise<string>;
  verify(token: string): Promise<SessionClaims | null>;
  /** True past half the lifetime: the caller re-issues the cookie so active people stay in. */
  wantsRenewal(claims: SessionClaims): boolean;
  cookieOptions: CookieOptions;
}

export function createSessionSigner(
  secret: string,
  secure: boolean,
  now: () => number = Date.now,
): SessionSigner {
  const key = new TextEncoder().encode(secret);
  const nowS = () => Math.floor(now() / 1000);
  return {
    async sign(userId, sessionVersion) {
      const issuedAtS = nowS();
      return new SignJWT({ sv: sessionVersion })
        .setProtectedHeader({ alg: 'HS256' })
        .setSubject(userId)
        .setIssuedAt(issuedAtS)
        .setExpirationTime(issuedAtS + SESSION_TTL_S)
        .sign(key);
    },
    async verify(token) {
      try {
        const { payload } = await jwtVerify(token, key, {
          algorithms: ['HS256'],
          currentDate: new Date(now()),
        });
        if (typeof payload.sub !== 'string' || typeof payload.iat !== 'number') return null;
        if (typeof payload.exp !== 'number') return null;
        if (typeof payload.sv !== 'number' || !Number.isInteger(payload.sv)) return null;
        return {
          userId: payload.sub,
          sessionVersion: payload.sv,
          issuedAtS: payload.iat,
          expiresAtS: payload.exp,
        };
      } catch {
        return null;
      }
    },
    wantsRenewal(claims) {
      return nowS() - claims.issuedAtS > SESSION_TTL_S / 2;
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

/** Signs a session for this account version and sets it as the cookie. */
export async function startSession(
  res: Response,
  sessions: SessionSigner,
  userId: string,
  sessionVersion: number,
): Promise<void> {
  res.cookie(SESSION_COOKIE, await sessions.sign(userId, sessionVersion), sessions.cookieOptions);
}
