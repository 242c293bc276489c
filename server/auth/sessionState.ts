/**
 * Turns a Cookie header into a live session: the signature and expiry (jose), then the
 * account's session version and, for a shop route, the role — one indexed query. Used by the
 * `authorize` middleware and by the live hub's WebSocket upgrade, so both apply one rule.
 */
import type { Db } from '@/db';
import { findSessionState } from '@/db/queries/users';
import type { Role } from '@/db/schema';

import { readCookie, SESSION_COOKIE, type SessionClaims, type SessionSigner } from './session';

export interface LiveSession {
  claims: SessionClaims;
  /** The role in the shop asked about; null when not a member or no shop was asked about. */
  role: Role | null;
}

/** A live session, 'expired' past its absolute lifetime (sign in again), or null for none. */
export async function resolveSession(
  db: Db,
  sessions: SessionSigner,
  cookieHeader: string | undefined,
  shopId?: string,
): Promise<LiveSession | 'expired' | null> {
  const token = readCookie(cookieHeader, SESSION_COOKIE);
  if (!token) return null;
  const claims = await sessions.verify(token);
  if (claims === 'expired') return claims;
  if (!claims || !isUuid(claims.userId)) return null;
  const state = await findSessionState(db, claims.userId, shopId);
  // A deleted account, or a token from before a sign-out or a password change.
  if (!state || state.sessionVersion !== claims.sessionVersion) return null;
  return { claims, role: state.role };
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isUuid(value: unknown): value is string {
  return typeof value === 'string' && UUID.test(value);
}
