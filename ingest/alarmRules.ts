/**
 * The numbers behind when an alarm opens and clears, in one place shared by the engine
 * (server/alarms/rules.ts, which adds what only the engine needs) and the words people read
 * (ingest/words/rules.ts), so the rule shown on a card or in a mail cannot drift from the rule
 * the engine applies. Values marked "rule of thumb" have no published source and say so; the
 * others are our own choices with the reason beside them.
 */
import { DEFAULT_HYSTERESIS } from './hysteresis';
import { DEFAULT_MIN_SILENCE_S, SILENT_AFTER_INTERVALS } from './postingInterval';
import { DEFAULT_LOOK_AHEAD_MS } from './trend';

const MINUTE_MS = 60_000;

export const ALARM_RULE_NUMBERS = {
  /** Dew risk warns when the trend reaches the wet limit within this (DESIGN.md's default). */
  lookAheadMs: DEFAULT_LOOK_AHEAD_MS,
  /**
   * Dew risk clears once the confirmed level is dry (margin ≥ caution limit + band, held — see
   * ingest/hysteresis.ts) and the early warning has been quiet this long. Ours: two fits on a
   * 5-minute sensor, so one flat stretch in a rising morning does not close the alarm.
   */
  warningQuietMs: 10 * MINUTE_MS,
  /** Level hysteresis: band 0.5 K, 3 readings or 5 min — rules of thumb, stated in ingest/. */
  level: DEFAULT_HYSTERESIS,
  /**
   * Humid air: RH above the zone's limit (default 60 % — a rule of thumb of the trade, no
   * standard gives 60 %) for 30 min; clears at 5 % RH below the limit for 15 min. Ours: a door
   * opened for a delivery must not raise it, and 5 % is about twice a shop hygrometer's error.
   */
  humid: { openHoldMs: 30 * MINUTE_MS, bandPct: 5, clearHoldMs: 15 * MINUTE_MS },
  /**
   * Battery low: under 2.7 V for a pair of lithium cells (3 V nominal) — a rule of thumb of the
   * trade: such cells hold near 3 V most of their life and fall off quickly below about 2.7 V.
   * Held 15 min so a cold-morning sag does not raise it; clears 0.1 V above (fresh cells).
   */
  battery: { lowV: 2.7, bandV: 0.1, openHoldMs: 15 * MINUTE_MS, clearHoldMs: 15 * MINUTE_MS },
  /**
   * Sensor silent: no reading for this many of the sensor's posting intervals, and at least
   * `silentMinMs` unless its owner set the interval (the reasons: ingest/postingInterval.ts).
   */
  silentFactor: SILENT_AFTER_INTERVALS,
  silentMinMs: DEFAULT_MIN_SILENCE_S * 1000,
} as const;
