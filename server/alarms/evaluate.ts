/**
 * Steps one zone's alarm state through a batch of stored readings in time order and says, at
 * every reading, which conditions hold: the signals the alarm book turns into opened, updated
 * and cleared alarms. Pure: the zone's stored margins come in as an argument.
 *
 * The level hysteresis runs per sensor, and the zone is as bad as its worst sensor. One
 * hysteresis fed by two sensors read their two series as one noisy series: a probe measuring
 * −2.7 K beside an air-only sensor whose estimated surface was dry never confirmed wet (the
 * readings alternated, and a second reading at the same instant was dropped as a duplicate), so
 * the zone's card said wet while the only alarm was dew risk.
 */
import type { AlarmKind } from '@/db/schema';
import {
  levelSeverity,
  minutesToWet,
  stepLevelHysteresis,
  type Level,
  type LevelState,
  type MarginLimits,
  type MarginSample,
} from '@/ingest';

import {
  ALARM_RULES,
  batteryVerdict,
  humidVerdict,
  stepDewRisk,
  stepThreshold,
  type DewRiskState,
  type SampleValues,
  type ThresholdState,
} from './rules';

/** One sensor's confirmed level and the start of the run that led to it. */
export interface SensorLevel {
  level: LevelState;
  sinceMs: number;
}

export interface ZoneAlarmState {
  /** Level hysteresis per sensor of the zone. */
  levels: Record<string, SensorLevel>;
  /** The zone-wide level of a state stored before `levels`: where a sensor without one starts. */
  legacyLevel?: LevelState;
  dewRisk: DewRiskState | null;
  humid: ThresholdState | null;
  /** Battery runs, per sensor of the zone. */
  batteries: Record<string, ThresholdState>;
}

export const EMPTY_ZONE_STATE: ZoneAlarmState = {
  levels: {},
  dewRisk: null,
  humid: null,
  batteries: {},
};

/** A stored state, or a fresh one when it is missing or from an older shape. */
export function readZoneState(stored: Record<string, unknown> | null): ZoneAlarmState {
  if (!stored || typeof stored.batteries !== 'object' || stored.batteries === null) {
    return EMPTY_ZONE_STATE;
  }
  const levels = typeof stored.levels === 'object' && stored.levels !== null ? stored.levels : {};
  const state = { ...EMPTY_ZONE_STATE, ...(stored as Partial<ZoneAlarmState>), levels };
  // A state written before levels were kept per sensor had one zone-wide level: each sensor
  // starts from it, so an open wet alarm is not cleared and raised again by the change.
  const legacy = stored.level as LevelState | null | undefined;
  if (!stored.levels && legacy && typeof legacy === 'object') {
    return { ...state, legacyLevel: legacy } as ZoneAlarmState;
  }
  return state as ZoneAlarmState;
}

/**
 * The zone's confirmed level at `atMs`: the worst of its sensors that posted within
 * `ALARM_RULES.levelFreshMs`, with the earliest start among the sensors at that level. A sensor
 * gone quiet stops counting, so its last level cannot hold an alarm open (its silence raises its
 * own alarm); unknown only when no fresh sensor knows its margin.
 */
export function zoneLevelOf(
  state: Pick<ZoneAlarmState, 'levels'>,
  atMs: number,
): { level: Level; sinceMs: number | null } {
  let worst: { level: Level; sinceMs: number | null } = { level: 'unknown', sinceMs: null };
  for (const { level, sinceMs } of Object.values(state.levels)) {
    if (atMs - level.atMs > ALARM_RULES.levelFreshMs || level.level === 'unknown') continue;
    const severity = levelSeverity(level.level);
    const known = worst.level === 'unknown' ? -1 : levelSeverity(worst.level);
    if (severity > known) worst = { level: level.level, sinceMs };
    else if (severity === known)
      worst = { level: level.level, sinceMs: earlier(worst.sinceMs, sinceMs) };
  }
  return worst;
}

const earlier = (a: number | null, b: number) => (a === null ? b : Math.min(a, b));

export interface ZoneSettings {
  limits: MarginLimits;
  humidRhPct: number;
}

export interface StoredReading {
  sensorId: string;
  atMs: number;
  marginK: number | null;
  rhPct: number;
  batteryV: number | null;
}

export interface Signal {
  kind: AlarmKind;
  /** The zone, or the sensor for the sensor kinds. */
  subjectId: string;
  sensorId: string | null;
  active: boolean;
  atMs: number;
  /** When the condition began; used when the signal opens an alarm. */
  sinceMs: number;
  sample: SampleValues;
}

export function evaluateZone(
  initial: ZoneAlarmState,
  zoneId: string,
  readings: readonly StoredReading[],
  margins: readonly MarginSample[],
  settings: ZoneSettings,
): { state: ZoneAlarmState; signals: Signal[] } {
  const state: ZoneAlarmState = {
    ...initial,
    levels: { ...initial.levels },
    batteries: { ...initial.batteries },
  };
  const signals: Signal[] = [];
  const sorted = [...readings].sort((a, b) => a.atMs - b.atMs);
  let trendAtMs = -Infinity;
  let minutes: number | null = null;

  sorted.forEach((r, i) => {
    const before =
      state.levels[r.sensorId] ??
      (state.legacyLevel
        ? { level: state.legacyLevel, sinceMs: state.legacyLevel.enteredAtMs }
        : null);
    const stepped = stepLevelHysteresis(
      before?.level ?? null,
      { atMs: r.atMs, marginK: r.marginK },
      { limits: settings.limits, ...ALARM_RULES.level },
    );
    if (!stepped) return; // only for a time that is not a number, which ingest never stores
    const changed = stepped.level !== before?.level.level;
    const runSinceMs =
      before?.level.pending?.level === stepped.level ? before.level.pending.sinceMs : r.atMs;
    state.levels[r.sensorId] = {
      level: stepped,
      sinceMs: changed || !before ? runSinceMs : before.sinceMs,
    };
    const level = zoneLevelOf(state, r.atMs);
    delete state.legacyLevel;

    // Fitting is the costly step: in a backlog, once per minute of data and at the newest reading.
    if (r.atMs - trendAtMs >= ALARM_RULES.trendEveryMs || i === sorted.length - 1) {
      trendAtMs = r.atMs;
      minutes = minutesToWet(margins, {
        nowMs: r.atMs,
        wetK: settings.limits.wetK,
        lookAheadMs: ALARM_RULES.lookAheadMs,
      });
    }
    state.dewRisk = stepDewRisk(state.dewRisk, r.atMs, level.level, minutes);
    state.humid = stepThreshold(
      state.humid,
      r.atMs,
      humidVerdict(r.rhPct, settings.humidRhPct),
      ALARM_RULES.humid,
    );

    const sample: SampleValues = {
      marginK: r.marginK,
      rhPct: r.rhPct,
      batteryV: r.batteryV,
      minutesToWet: minutes,
    };
    const zone = { subjectId: zoneId, sensorId: null, atMs: r.atMs, sample };
    signals.push(
      {
        ...zone,
        kind: 'dew_risk',
        active: state.dewRisk.active,
        sinceMs: state.dewRisk.sinceMs ?? r.atMs,
      },
      {
        ...zone,
        kind: 'wet_surface',
        active: level.level === 'wet',
        sinceMs: level.sinceMs ?? r.atMs,
      },
      {
        ...zone,
        kind: 'humid_air',
        active: state.humid.active,
        sinceMs: state.humid.sinceMs ?? r.atMs,
      },
    );

    const sensor = { subjectId: r.sensorId, sensorId: r.sensorId, atMs: r.atMs, sample };
    // Any reading ends a silence (the book clears only silences that began before it).
    signals.push({ ...sensor, kind: 'sensor_silent', active: false, sinceMs: r.atMs });
    if (r.batteryV !== null) {
      const battery = stepThreshold(
        state.batteries[r.sensorId] ?? null,
        r.atMs,
        batteryVerdict(r.batteryV),
        ALARM_RULES.battery,
      );
      state.batteries[r.sensorId] = battery;
      signals.push({
        ...sensor,
        kind: 'battery_low',
        active: battery.active,
        sinceMs: battery.sinceMs ?? r.atMs,
      });
    }
  });
  return { state, signals };
}
