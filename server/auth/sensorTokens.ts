/**
 * Sensor bearer tokens: 256 random bits shown once, stored as SHA-256, and resolved through an
 * in-memory cache so a busy sensor does not cost a database round trip per post (a cache hit
 * is a hash and a map lookup, ~2 µs). A revoke or rotate calls `invalidate`, which drops the
 * entry here and tells every other instance through PostgreSQL NOTIFY, so a revoked token is
 * refused everywhere within the notification's delivery time, not the cache's lifetime.
 *
 * Unknown tokens are remembered too (a negative cache, short-lived and bounded), and concurrent
 * look-ups of one hash share one query, so a flood of posts with a wrong token costs one query
 * per distinct token and interval, not one per post. New tokens are fresh random values, never
 * in it; `invalidate` (called when a token is created, rotated, revoked or removed) clears a
 * hash from both caches, here and on every instance.
 */
import { createHash, randomBytes } from 'node:crypto';

import type { Db } from '@/db';
import type { NotificationListener } from '@/db/listener';
import { notify, TOKEN_CHANNEL } from '@/db/notify';
import { findActiveSensorByTokenHash, type SensorIdentity } from '@/db/queries/sensors';

export function newSensorToken(): string {
  return `dbs_${randomBytes(32).toString('base64url')}`;
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export interface SensorTokenCache {
  resolve(token: string): Promise<SensorIdentity | null>;
  /** Forget token hashes on every instance; call after the change to them has committed. */
  invalidate(tokenHashes: string | readonly string[]): Promise<void>;
}

export interface TokenCacheOptions {
  /** Other instances' revocations arrive here; without it only this instance forgets. */
  listener?: NotificationListener;
  /** A safety net should a notification be lost (e.g. during a database restart). */
  ttlMs?: number;
  /** How long a hash that matched no sensor is answered "unknown" without a query. */
  unknownTtlMs?: number;
  /** Unknown hashes remembered at most; the oldest goes first. */
  maxUnknown?: number;
  now?: () => number;
}

// 30 s: a sensor with a mistyped token retries far less often, and a token issued meanwhile
// clears its own entry (invalidate). 10,000 hashes of 64 characters is about 1.5 MB.
const UNKNOWN_TTL_MS = 30_000;
const MAX_UNKNOWN = 10_000;

export function createSensorTokenCache(db: Db, options: TokenCacheOptions = {}): SensorTokenCache {
  const ttlMs = options.ttlMs ?? 60_000;
  const now = options.now ?? Date.now;
  const unknownTtlMs = options.unknownTtlMs ?? UNKNOWN_TTL_MS;
  const maxUnknown = options.maxUnknown ?? MAX_UNKNOWN;
  const entries = new Map<string, { identity: SensorIdentity; expiresAtMs: number }>();
  // Hash → when to ask again. A Map iterates in insertion order, so the first key is the oldest.
  const unknown = new Map<string, number>();
  const lookups = new Map<string, Promise<SensorIdentity | null>>();
  // Bumped by every invalidation: a look-up that started before one may have read the old row,
  // so it answers its callers but does not fill either cache.
  let generation = 0;
  const forget = (tokenHash: string) => {
    generation++;
    lookups.delete(tokenHash);
    entries.delete(tokenHash);
    unknown.delete(tokenHash);
  };
  options.listener?.on(TOKEN_CHANNEL, forget);
  // A revocation sent while the LISTEN connection was down was never heard: start over, so a
  // revoked token is refused from the reconnect on rather than after its entry's TTL.
  options.listener?.onReconnect(() => {
    entries.clear();
    unknown.clear();
  });

  function rememberUnknown(tokenHash: string) {
    unknown.delete(tokenHash);
    if (unknown.size >= maxUnknown) unknown.delete(unknown.keys().next().value!);
    unknown.set(tokenHash, now() + unknownTtlMs);
  }

  async function lookUp(tokenHash: string): Promise<SensorIdentity | null> {
    const startedAt = generation;
    try {
      const identity = await findActiveSensorByTokenHash(db, tokenHash);
      if (startedAt !== generation) return identity;
      if (identity) {
        entries.set(tokenHash, { identity, expiresAtMs: now() + ttlMs });
        unknown.delete(tokenHash);
      } else {
        entries.delete(tokenHash);
        rememberUnknown(tokenHash);
      }
      return identity;
    } finally {
      lookups.delete(tokenHash);
    }
  }

  return {
    async resolve(token) {
      const tokenHash = hashToken(token);
      const hit = entries.get(tokenHash);
      const nowMs = now();
      if (hit && hit.expiresAtMs > nowMs) {
        // Past half its life the entry is checked again in the background, so a busy sensor
        // never waits for that query (the MQTT broker's 1 s TTL made it one message per sensor
        // and second), and an answer is still never older than the TTL. A failed refresh
        // changes nothing: the entry expires and the next call asks in the foreground.
        if (hit.expiresAtMs - nowMs < ttlMs / 2 && !lookups.has(tokenHash)) {
          const refresh = lookUp(tokenHash);
          lookups.set(tokenHash, refresh);
          refresh.catch(() => {});
        }
        return hit.identity;
      }
      const unknownUntilMs = unknown.get(tokenHash);
      if (unknownUntilMs !== undefined) {
        if (unknownUntilMs > now()) return null;
        unknown.delete(tokenHash);
      }
      let pending = lookups.get(tokenHash);
      if (!pending) {
        pending = lookUp(tokenHash);
        lookups.set(tokenHash, pending);
      }
      return pending;
    },
    async invalidate(tokenHashes) {
      const hashes = typeof tokenHashes === 'string' ? [tokenHashes] : [...tokenHashes];
      if (hashes.length === 0) return;
      hashes.forEach(forget);
      await notify(db, TOKEN_CHANNEL, hashes);
    },
  };
}
