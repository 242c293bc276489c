/**
 * Per-sensor request limit, a token bucket per sensor in this instance's memory. A real sensor
 * posts every few seconds, and a backlog goes out in batches of up to 1,000 readings, so ten
 * requests a second with a burst of thirty only ever stops a sensor stuck in a retry loop (or a
 * leaked token) from crowding out the rest of the shop. Behind a load balancer each instance
 * keeps its own buckets; the limit per sensor is then at most instances × rate, which is fine
 * for its purpose.
 */
export interface RateLimitOptions {
  ratePerS: number;
  burst: number;
  now?: () => number;
}

export interface SensorRateLimiter {
  /** Takes one request from the sensor's bucket; returns the seconds to wait when empty. */
  take(sensorId: string): { ok: true } | { ok: false; retryAfterS: number };
}

export const DEFAULT_SENSOR_RATE: RateLimitOptions = { ratePerS: 10, burst: 30 };

export function createSensorRateLimiter(
  options: RateLimitOptions = DEFAULT_SENSOR_RATE,
): SensorRateLimiter {
  const now = options.now ?? Date.now;
  const buckets = new Map<string, { tokens: number; atMs: number }>();
  let sweepAtMs = now();

  return {
    take(sensorId) {
      const t = now();
      // Full buckets carry no information: drop them now and then so the map stays small.
      if (t - sweepAtMs > 60_000) {
        for (const [id, b] of buckets) {
          if (b.tokens + ((t - b.atMs) / 1000) * options.ratePerS >= options.burst)
            buckets.delete(id);
        }
        sweepAtMs = t;
      }
      const b = buckets.get(sensorId) ?? { tokens: options.burst, atMs: t };
      b.tokens = Math.min(options.burst, b.tokens + ((t - b.atMs) / 1000) * options.ratePerS);
      b.atMs = t;
      buckets.set(sensorId, b);
      if (b.tokens < 1)
        return { ok: false, retryAfterS: Math.ceil((1 - b.tokens) / options.ratePerS) };
      b.tokens -= 1;
      return { ok: true };
    },
  };
}
