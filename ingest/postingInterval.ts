/**
 * How often a sensor posts, and when its quiet counts as silence. Three intervals: the one the
 * owner set (`expected_interval_s`), the one learnt from its readings (`interval_s`, see
 * db/queries/readings.ts) and a default; the first that is known applies.
 *
 * "Silent" is no reading for SILENT_AFTER_INTERVALS intervals — one missed post is a retry or a
 * radio hiccup, three in a row is a sensor that needs a look (our own rule). A learnt or default
 * interval is never taken below DEFAULT_MIN_SILENCE_S: a sensor posting every 10 s must not
 * raise an alarm after 30 s of Wi-Fi trouble. An interval the owner set is taken at its word,
 * down to the silent sweep's own resolution (once a minute).
 */

/** Assumed until a sensor has posted twice and nobody set one: the contract's slowest cadence. */
export const DEFAULT_POSTING_INTERVAL_S = 300;
export const SILENT_AFTER_INTERVALS = 3;
/** 15 min: the floor for a learnt or default interval (ours; see above). */
export const DEFAULT_MIN_SILENCE_S = 15 * 60;
/** The silent sweep runs once a minute, so nothing is judged silent sooner. */
export const SWEEP_RESOLUTION_S = 60;

/** What an owner may set: 10 s (faster only costs batteries) to a day (a logger that uploads daily). */
export const EXPECTED_INTERVAL_MIN_S = 10;
export const EXPECTED_INTERVAL_MAX_S = 24 * 60 * 60;

/**
 * What the token screen recommends: every 1–5 minutes. Dew forms over tens of minutes, so a
 * minute shows it coming; much slower and the early warning has too few points to fit a trend.
 */
export const RECOMMENDED_INTERVAL_S = { min: 60, max: 300 } as const;

export type IntervalSource = 'set' | 'learned' | 'default';

export interface PostingInterval {
  /** The interval the rules use, seconds. */
  effectiveS: number;
  source: IntervalSource;
  /** Quiet for longer than this (seconds) and the sensor counts as silent. */
  silentAfterS: number;
}

/** The interval in force for a sensor and how long it may stay quiet. */
export function postingInterval(
  setS: number | null | undefined,
  learnedS: number | null | undefined,
): PostingInterval {
  const usable = (v: number | null | undefined): v is number =>
    typeof v === 'number' && Number.isFinite(v) && v > 0;
  if (usable(setS)) {
    return {
      effectiveS: setS,
      source: 'set',
      silentAfterS: Math.max(SILENT_AFTER_INTERVALS * setS, SWEEP_RESOLUTION_S),
    };
  }
  const effectiveS = usable(learnedS) ? learnedS : DEFAULT_POSTING_INTERVAL_S;
  return {
    effectiveS,
    source: usable(learnedS) ? 'learned' : 'default',
    silentAfterS: Math.max(SILENT_AFTER_INTERVALS * effectiveS, DEFAULT_MIN_SILENCE_S),
  };
}

/**
 * How long a zone may go without a reading before its card is stale: the most patient of its
 * sensors (a zone is stale only when every sensor in it would count as silent). With no sensors
 * the default applies.
 */
export function zoneStaleAfterS(
  sensors: readonly { setS: number | null; learnedS: number | null }[],
): number {
  if (sensors.length === 0) return postingInterval(null, null).silentAfterS;
  return Math.max(...sensors.map((s) => postingInterval(s.setS, s.learnedS).silentAfterS));
}

/** Whether a reading at `lastAtMs` is older than `staleAfterS` at `nowMs`. */
export function isStale(lastAtMs: number, staleAfterS: number, nowMs: number): boolean {
  return nowMs - lastAtMs > staleAfterS * 1000;
}
