/**
 * In-memory counters for the limits keyed on an account or an e-mail address, on an injected
 * clock. Both forget keys that have gone quiet and hold at most MAX_KEYS, so a flood of
 * made-up addresses cannot grow the process without bound (the oldest are dropped first).
 */

export interface Refusal {
  retryAfterS: number;
}

const MAX_KEYS = 100_000;

function retryAfterS(untilMs: number, nowMs: number): number {
  return Math.max(1, Math.ceil((untilMs - nowMs) / 1000));
}

/** Drops the oldest entries (Map keeps insertion order) while over the cap or stale. */
function prune<V>(entries: Map<string, V>, isStale: (value: V) => boolean): void {
  for (const [key, value] of entries) {
    if (entries.size <= MAX_KEYS && !isStale(value)) break;
    entries.delete(key);
  }
}

/** At most `limit` hits per key in each fixed window of `windowMs`. */
export function createWindowCounter(options: {
  windowMs: number;
  limit: number;
  now: () => number;
}) {
  const windows = new Map<string, { count: number; resetAtMs: number }>();
  return {
    /** Counts a hit; a refusal once the key has used up its window. */
    hit(key: string): Refusal | null {
      const nowMs = options.now();
      let entry = windows.get(key);
      if (!entry || entry.resetAtMs <= nowMs) {
        windows.delete(key);
        entry = { count: 0, resetAtMs: nowMs + options.windowMs };
        windows.set(key, entry);
        prune(windows, (e) => e.resetAtMs <= nowMs);
      }
      if (entry.count >= options.limit) return { retryAfterS: retryAfterS(entry.resetAtMs, nowMs) };
      entry.count += 1;
      return null;
    },
  };
}

// An account's failures are forgotten a day after the last one: long enough that a slow
// guesser keeps paying the longest wait, short enough that the map does not hold every typo.
const FORGET_AFTER_MS = 24 * 3_600_000;

/**
 * Failures per key with a growing wait: the first `freeFailures` cost nothing, then each
 * failure blocks the key for firstDelayMs, doubling per further failure up to maxDelayMs. A
 * success clears the key.
 */
export function createBackoff(options: {
  freeFailures: number;
  firstDelayMs: number;
  maxDelayMs: number;
  now: () => number;
}) {
  const failures = new Map<string, { count: number; lastMs: number; blockedUntilMs: number }>();
  return {
    check(key: string): Refusal | null {
      const nowMs = options.now();
      const entry = failures.get(key);
      if (!entry || entry.blockedUntilMs <= nowMs) return null;
      return { retryAfterS: retryAfterS(entry.blockedUntilMs, nowMs) };
    },
    failed(key: string): void {
      const nowMs = options.now();
      const previous = failures.get(key);
      const count =
        (previous && nowMs - previous.lastMs < FORGET_AFTER_MS ? previous.count : 0) + 1;
      // The failure that reaches freeFailures starts the first wait.
      const over = count - options.freeFailures;
      const delayMs =
        over >= 0 ? Math.min(options.firstDelayMs * 2 ** over, options.maxDelayMs) : 0;
      // Re-inserted so the map's order stays by last failure, oldest first.
      failures.delete(key);
      failures.set(key, { count, lastMs: nowMs, blockedUntilMs: nowMs + delayMs });
      prune(failures, (e) => nowMs - e.lastMs >= FORGET_AFTER_MS);
    },
    succeeded(key: string): void {
      failures.delete(key);
    },
  };
}
