/**
 * Sensor bearer tokens: 256 random bits shown once, stored as SHA-256, and resolved through an
 * in-memory cache so a busy sensor does not cost a database round trip per post (a cache hit
 * is a hash and a map lookup, ~2 µs). A revoke or rotate calls `invalidate`, which drops the
 * entry here and tells every other instance through PostgreSQL NOTIFY, so a revoked token is
 * refused everywhere within the notification's delivery time, not the cache's lifetime.
 */
import { createHash, randomBytes } from 'node:crypto';

import { sql } from 'drizzle-orm';

import type { Db } from '@/db';
import { findActiveSensorByTokenHash, type SensorIdentity } from '@/db/queries/sensors';

import type { NotificationListener } from '../live/listener';

export const TOKEN_CHANNEL = 'drybench_tokens';

export function newSensorToken(): string {
  return `dbs_${randomBytes(32).toString('base64url')}`;
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export interface SensorTokenCache {
  resolve(token: string): Promise<SensorIdentity | null>;
  /** Forget a token hash on every instance; call after the revoke or rotate has committed. */
  invalidate(tokenHash: string): Promise<void>;
}

export interface TokenCacheOptions {
  /** Other instances' revocations arrive here; without it only this instance forgets. */
  listener?: NotificationListener;
  /** A safety net should a notification be lost (e.g. during a database restart). */
  ttlMs?: number;
  now?: () => number;
}

export function createSensorTokenCache(db: Db, options: TokenCacheOptions = {}): SensorTokenCache {
  const ttlMs = options.ttlMs ?? 60_000;
  const now = options.now ?? Date.now;
  const entries = new Map<string, { identity: SensorIdentity; expiresAtMs: number }>();
  options.listener?.on(TOKEN_CHANNEL, (tokenHash) => entries.delete(tokenHash));

  return {
    async resolve(token) {
      const tokenHash = hashToken(token);
      const hit = entries.get(tokenHash);
      if (hit && hit.expiresAtMs > now()) return hit.identity;
      const identity = await findActiveSensorByTokenHash(db, tokenHash);
      if (identity) entries.set(tokenHash, { identity, expiresAtMs: now() + ttlMs });
      else entries.delete(tokenHash);
      return identity;
    },
    async invalidate(tokenHash) {
      entries.delete(tokenHash);
      await db.execute(sql`select pg_notify(${TOKEN_CHANNEL}, ${tokenHash})`);
    },
  };
}
