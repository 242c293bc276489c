/**
 * The alarm rules as pure functions of readings and the times they carry (never the clock), so a
 * sensor's backlog is judged as if it had arrived live. The dew rules reuse ingest/'s level
 * hysteresis and early warning; this file adds a plain threshold hysteresis for humid air and
 * battery, the dew-risk hold, the silent test and when an open alarm's change is worth recording.
 *
 * Values marked "rule of thumb" have no published source and say so; the others are our own
 * choices with the reason beside them.
 */
import type { AlarmValues } from '@/db/queries/alarms';
import type { AlarmKind } from '@/db/schema';
import {
  ALARM_RULE_NUMBERS,
  DEFAULT_MIN_SILENCE_S,
  DEFAULT_POSTING_INTERVAL_S,
  postingInterval,
  SILENT_AFTER_INTERVALS,
  SWEEP_RESOLUTION_S,
  type Level,
} from '@/ingest';

const MINUTE_MS = 60_000;

export const ALARM_RULES = {
  // The numbers people read in the rule texts live in ingest/alarmRules.ts, with their reasons.
  lookAheadMs: ALARM_RULE_NUMBERS.lookAheadMs,
  warningQuietMs: ALARM_RULE_NUMBERS.warningQuietMs,
  /** In a backlog the trend is fitted at most once per minute of data; the level every reading. */
  trendEveryMs: MINUTE_MS,
  level: ALARM_RULE_NUMBERS.level,
  /**
   * Each sensor's level is confirmed on its own; the zone takes the worst of the sensors heard
   * within this. Ours: twice the slowest posting interval we expect (15 min), so a sensor that
   * misses one post still counts, and one that stopped cannot hold the zone wet for ever.
   */
  levelFreshMs: 30 * MINUTE_MS,
  humid: ALARM_RULE_NUMBERS.humid,
  battery: ALARM_RULE_NUMBERS.battery,
  /**
   * Sensor silent: no reading for 3 × the sensor's posting interval — the owner's setting, else
   * the one learnt from its readings, else 5 min — and at least 15 min unless the owner set the
   * interval (then at least the sweep's minute). The numbers and the reason: ingest/postingInterval.ts.
   */
  silent: {
    factor: SILENT_AFTER_INTERVALS,
    defaultIntervalMs: DEFAULT_POSTING_INTERVAL_S * 1000,
    minSilenceMs: DEFAULT_MIN_SILENCE_S * 1000,
    minSetSilenceMs: SWEEP_RESOLUTION_S * 1000,
  },
  /**
   * An open alarm records an update when its worst value gets worse by a step, the expected
   * minutes move to another 5-minute step, or the latest value has moved by a step and the last
   * update is 15 min old. Steps are what the screen shows (0.1 °C, 1 %, 0.01 V).
   */
  update: {
    marginStepK: 0.1,
    rhStepPct: 1,
    batteryStepV: 0.01,
    minutesStep: 5,
    latestEveryMs: 15 * MINUTE_MS,
  },
} as const;

export const NO_VALUES: AlarmValues = {
  worstMarginK: null,
  latestMarginK: null,
  minutesToWet: null,
  peakRhPct: null,
  latestRhPct: null,
  lowestBatteryV: null,
  latestBatteryV: null,
};

/** One reading's part in an alarm. */
export interface SampleValues {
  marginK: number | null;
  rhPct: number | null;
  batteryV: number | null;
  minutesToWet: number | null;
}

const lower = (a: number | null, b: number | null) =>
  a === null ? b : b === null ? a : Math.min(a, b);
const higher = (a: number | null, b: number | null) =>
  a === null ? b : b === null ? a : Math.max(a, b);

/** An alarm's values after one more reading. */
export function mergeValues(kind: AlarmKind, prev: AlarmValues, s: SampleValues): AlarmValues {
  switch (kind) {
    case 'dew_risk':
    case 'wet_surface':
      return {
        ...prev,
        latestMarginK: s.marginK ?? prev.latestMarginK,
        worstMarginK: lower(prev.worstMarginK, s.marginK),
        minutesToWet: kind === 'dew_risk' ? s.minutesToWet : null,
      };
    case 'humid_air':
      return {
        ...prev,
        latestRhPct: s.rhPct ?? prev.latestRhPct,
        peakRhPct: higher(prev.peakRhPct, s.rhPct),
      };
    case 'battery_low':
      return {
        ...prev,
        latestBatteryV: s.batteryV ?? prev.latestBatteryV,
        lowestBatteryV: lower(prev.lowestBatteryV, s.batteryV),
      };
    case 'sensor_silent':
      return prev;
  }
}

const moved = (a: number | null, b: number | null, step: number) =>
  a === null || b === null ? a !== b : Math.abs(a - b) >= step - 1e-9;
const worse = (stored: number | null, next: number | null, step: number, sign: 1 | -1) =>
  next !== null && (stored === null || sign * (next - stored) >= step - 1e-9);
const minutesBucket = (m: number | null) =>
  m === null ? null : Math.round(m / ALARM_RULES.update.minutesStep);

/** Whether going from `stored` to `next` is an update worth recording (and pushing). */
export function isMaterialUpdate(stored: AlarmValues, next: AlarmValues, sinceUpdateMs: number) {
  const u = ALARM_RULES.update;
  if (worse(stored.worstMarginK, next.worstMarginK, u.marginStepK, -1)) return true;
  if (worse(stored.peakRhPct, next.peakRhPct, u.rhStepPct, 1)) return true;
  if (worse(stored.lowestBatteryV, next.lowestBatteryV, u.batteryStepV, -1)) return true;
  if (minutesBucket(stored.minutesToWet) !== minutesBucket(next.minutesToWet)) return true;
  if (sinceUpdateMs < u.latestEveryMs) return false;
  return (
    moved(stored.latestMarginK, next.latestMarginK, u.marginStepK) ||
    moved(stored.latestRhPct, next.latestRhPct, u.rhStepPct) ||
    moved(stored.latestBatteryV, next.latestBatteryV, u.batteryStepV)
  );
}

/** A confirmed on/off condition with a hold in each direction. */
export interface ThresholdState {
  active: boolean;
  /** First reading of the run arguing for the other state; also the start of an active spell. */
  runSinceMs: number | null;
  /** Start of the current active spell. */
  sinceMs: number | null;
  atMs: number;
}

/** `bad` argues for the alarm, `good` for clearing it, `band` for neither (the run ends). */
export type Verdict = 'bad' | 'good' | 'band';

export function stepThreshold(
  state: ThresholdState | null,
  atMs: number,
  verdict: Verdict,
  hold: { openHoldMs: number; clearHoldMs: number },
): ThresholdState {
  const current = state ?? { active: false, runSinceMs: null, sinceMs: null, atMs: -Infinity };
  if (!(atMs > current.atMs)) return current;
  const wanted = current.active ? 'good' : 'bad';
  if (verdict !== wanted) return { ...current, runSinceMs: null, atMs };
  const runSinceMs = current.runSinceMs ?? atMs;
  const holdMs = current.active ? hold.clearHoldMs : hold.openHoldMs;
  if (atMs - runSinceMs < holdMs) return { ...current, runSinceMs, atMs };
  return current.active
    ? { active: false, runSinceMs: null, sinceMs: null, atMs }
    : { active: true, runSinceMs: null, sinceMs: runSinceMs, atMs };
}

export function humidVerdict(rhPct: number, limitPct: number): Verdict {
  if (rhPct > limitPct) return 'bad';
  return rhPct <= limitPct - ALARM_RULES.humid.bandPct ? 'good' : 'band';
}

export function batteryVerdict(batteryV: number): Verdict {
  const { lowV, bandV } = ALARM_RULES.battery;
  if (batteryV < lowV) return 'bad';
  return batteryV >= lowV + bandV ? 'good' : 'band';
}

/** Dew risk: on while the confirmed level is close or wet or the trend warns; off after a hold. */
export interface DewRiskState {
  active: boolean;
  sinceMs: number | null;
  /** First reading since which the level has been dry (or unknown) and the trend quiet. */
  quietSinceMs: number | null;
  atMs: number;
}

export function stepDewRisk(
  state: DewRiskState | null,
  atMs: number,
  level: Level,
  minutesToWet: number | null,
): DewRiskState {
  const current = state ?? { active: false, sinceMs: null, quietSinceMs: null, atMs: -Infinity };
  if (!(atMs > current.atMs)) return current;
  if (level === 'close' || level === 'wet' || minutesToWet !== null) {
    return {
      active: true,
      sinceMs: current.active ? current.sinceMs : atMs,
      quietSinceMs: null,
      atMs,
    };
  }
  if (!current.active) return { ...current, atMs };
  const quietSinceMs = current.quietSinceMs ?? atMs;
  if (atMs - quietSinceMs >= ALARM_RULES.warningQuietMs) {
    return { active: false, sinceMs: null, quietSinceMs: null, atMs };
  }
  return { ...current, quietSinceMs, atMs };
}

/**
 * How long a sensor may stay quiet before it counts as silent: from the interval its owner set
 * or the one learnt from its readings (sensors.expected_interval_s, sensors.interval_s).
 */
export function silentAfterMs(setS: number | null, learnedS: number | null): number {
  return postingInterval(setS, learnedS).silentAfterS * 1000;
}
