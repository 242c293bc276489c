/**
 * Sensor bearer tokens: 256 random bits shown once, stored as SHA-256, and resolved through a
 * short-lived in-memory cache so a busy sensor does not cost a database round trip per post.
 * A revoke drops the entry at once on this instance; entries expire after `ttlMs` everywhere.
 */
import { createHash, randomBytes } from 'node:crypto';

import type { Db } from '@/db';
import { findActiveSensorByTokenHash, type SensorIdentity } from '@/db/queries/sensors';

export function newSensorToken(): string {
  return `dbs_${randomBytes(32).toString('base64url')}`;
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export interface SensorTokenCache {
  resolve(token: string): Promise<SensorIdentity | null>;
  invalidate(tokenHash: string): void;
}

export function createSensorTokenCache(db: Db, ttlMs = 30_000, now = Date.now): SensorTokenCache {
  const entries = new Map<string, { identity: SensorIdentity; expiresAtMs: number }>();
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
    invalidate(tokenHash) {
      entries.delete(tokenHash);
    },
  };
}
