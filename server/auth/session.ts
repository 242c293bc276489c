/**
 * Sessions are signed tokens (HS256 via jose) in an httpOnly cookie, so any server instance
 * can check them without shared memory. Each token carries the account's session version:
 * sign-out and a password change bump the version in the database, which ends every older
 * token at once without a server-side session store.
 */
import type { Response } from 'express';
import { errors, jwtVerify, SignJWT, type JWTPayload } from 'jose';

export const SESSION_COOKIE = 'drybench_session';
/** Sliding lifetime: a token lives 7 days and is re-issued once past half of that. */
export const SESSION_TTL_S = 7 * 24 * 60 * 60;
/**
 * Absolute lifetime from the sign-in, however often the token was renewed: a cookie kept
 * fresh by daily use (or by whoever copied it) still ends, and the password is asked again.
 */
export const SESSION_ABSOLUTE_S = 30 * 24 * 60 * 60;

export interface SessionClaims {
  userId: string;
  sessionVersion: number;
  issuedAtS: number;
  /** When the token stops being accepted; the live hub closes a socket opened with it then. */
  expiresAtS: number;
  /** When the person typed their password; kept across renewals (the `auth_time` claim). */
  authTimeS: number;
}

export interface CookieOptions {
  httpOnly: true;
  sameSite: 'lax';
  secure: boolean;
  path: '/';
  maxAge: number;
}

export interface SessionSigner {
  /** A token for this account version; `authTimeS` (a renewal's) defaults to now, a sign-in. */
  sign(userId: string, sessionVersion: number, authTimeS?: number): Promise<string>;
  /** The claims of a valid token; 'expired' past the absolute lifetime; null otherwise. */
  verify(token: string): Promise<SessionClaims | 'expired' | null>;
  /** True past half the lifetime while renewing still extends it. */
  wantsRenewal(claims: SessionClaims): boolean;
  /** Cookie attributes for a token of this sign-in: Max-Age ends when the token does. */
  cookieOptions(authTimeS?: number): CookieOptions;
}

function claimsOf(payload: JWTPayload): SessionClaims | null {
  const { sub, iat, exp, sv } = payload;
  const authTime = payload.auth_time ?? iat;
  if (typeof sub !== 'string' || typeof iat !== 'number' || typeof exp !== 'number') return null;
  if (typeof sv !== 'number' || !Number.isInteger(sv)) return null;
  if (typeof authTime !== 'number' || !Number.isInteger(authTime)) return null;
  return { userId: sub, sessionVersion: sv, issuedAtS: iat, expiresAtS: exp, authTimeS: authTime };
}

export function createSessionSigner(
  secret: string,
  secure: boolean,
  now: () => number = Date.now,
): SessionSigner {
  const key = new TextEncoder().encode(secret);
  const nowS = () => Math.floor(now() / 1000);
  // A renewal never reaches past the absolute end of its sign-in.
  const expiresAtS = (authTimeS: number) =>
    Math.min(nowS() + SESSION_TTL_S, authTimeS + SESSION_ABSOLUTE_S);
  const pastAbsoluteEnd = (claims: SessionClaims) =>
    nowS() >= claims.authTimeS + SESSION_ABSOLUTE_S;
  return {
    async sign(userId, sessionVersion, authTimeS = nowS()) {
      return new SignJWT({ sv: sessionVersion, auth_time: authTimeS })
        .setProtectedHeader({ alg: 'HS256' })
        .setSubject(userId)
        .setIssuedAt(nowS())
        .setExpirationTime(expiresAtS(authTimeS))
        .sign(key);
    },
    async verify(token) {
      try {
        const { payload } = await jwtVerify(token, key, {
          algorithms: ['HS256'],
          currentDate: new Date(now()),
        });
        const claims = claimsOf(payload);
        // Checked apart from `exp`, so a token whose expiry was not capped ends too.
        if (claims && pastAbsoluteEnd(claims)) return 'expired';
        return claims;
      } catch (err) {
        // jose checks the signature before the expiry: this payload is one we signed.
        if (err instanceof errors.JWTExpired) {
          const claims = claimsOf(err.payload);
          if (claims && pastAbsoluteEnd(claims)) return 'expired';
        }
        return null;
      }
    },
    wantsRenewal(claims) {
      return (
        nowS() - claims.issuedAtS > SESSION_TTL_S / 2 &&
        expiresAtS(claims.authTimeS) > claims.expiresAtS
      );
    },
    cookieOptions(authTimeS = nowS()) {
      return {
        httpOnly: true,
        sameSite: 'lax',
        secure,
        path: '/',
        maxAge: Math.max(0, expiresAtS(authTimeS) - nowS()) * 1000,
      };
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

/**
 * Signs a session for this account version and sets it as the cookie: a new sign-in, or with
 * `authTimeS` a renewal of an existing one.
 */
export async function startSession(
  res: Response,
  sessions: SessionSigner,
  userId: string,
  sessionVersion: number,
  authTimeS?: number,
): Promise<void> {
  const token = await sessions.sign(userId, sessionVersion, authTimeS);
  res.cookie(SESSION_COOKIE, token, sessions.cookieOptions(authTimeS));
}
