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

/**
 * Where a step's signals go. The engine passes the zone's alarm book: a signal that is neither
 * active nor about an open alarm changes nothing there, and most readings of a quiet zone give
 * only such signals, so they are never built (`wants` first, then `apply`, in reading order).
 */
export interface SignalSink {
  wants(subjectId: string, kind: AlarmKind, active: boolean): boolean;
  apply(signal: Signal): void;
}

/**
 * Steps the zone through `readings` (sorted here by time). With a sink, each signal goes to it
 * as it arises and `signals` comes back empty; without one, every signal is returned in order.
 */
export function evaluateZone(
  initial: ZoneAlarmState,
  zoneId: string,
  readings: readonly StoredReading[],
  margins: readonly MarginSample[],
  settings: ZoneSettings,
  sink?: SignalSink,
): { state: ZoneAlarmState; signals: Signal[] } {
  const state: ZoneAlarmState = {
    ...initial,
    levels: { ...initial.levels },
    batteries: { ...initial.batteries },
  };
  const signals: Signal[] = [];
  const out: SignalSink = sink ?? { wants: () => true, apply: (s) => void signals.push(s) };
  const sorted = [...readings].sort((a, b) => a.atMs - b.atMs);
  const levelOptions = { limits: settings.limits, ...ALARM_RULES.level };
  const trendOptions = {
    nowMs: 0,
    wetK: settings.limits.wetK,
    lookAheadMs: ALARM_RULES.lookAheadMs,
  };
  let trendAtMs = -Infinity;
  let minutes: number | null = null;

  // Signals are plain object literals, never spreads of a shared part: V8 builds spread copies
  // with extra keys far more slowly (33 µs against 2 µs a reading, measured), and this loop runs
  // once per stored reading.
  const emit = (
    r: StoredReading,
    subjectId: string,
    sensorId: string | null,
    kind: AlarmKind,
    active: boolean,
    sinceMs: number,
  ) => {
    if (!out.wants(subjectId, kind, active)) return;
    out.apply({
      kind,
      subjectId,
      sensorId,
      active,
      atMs: r.atMs,
      sinceMs,
      sample: {
        marginK: r.marginK,
        rhPct: r.rhPct,
        batteryV: r.batteryV,
        minutesToWet: minutes,
      },
    });
  };

  for (let i = 0; i < sorted.length; i++) {
    const r = sorted[i]!;
    const before =
      state.levels[r.sensorId] ??
      (state.legacyLevel
        ? { level: state.legacyLevel, sinceMs: state.legacyLevel.enteredAtMs }
        : null);
    const stepped = stepLevelHysteresis(
      before?.level ?? null,
      { atMs: r.atMs, marginK: r.marginK },
      levelOptions,
    );
    if (!stepped) continue; // only for a time that is not a number, which ingest never stores
    const changed = stepped.level !== before?.level.level;
    const runSinceMs =
      before?.level.pending?.level === stepped.level ? before.level.pending.sinceMs : r.atMs;
    state.levels[r.sensorId] = {
      level: stepped,
      sinceMs: changed || !before ? runSinceMs : before.sinceMs,
    };
    const level = zoneLevelOf(state, r.atMs);
    if ('legacyLevel' in state) delete state.legacyLevel;

    // Fitting is the costly step: in a backlog, once per minute of data and at the newest reading.
    if (r.atMs - trendAtMs >= ALARM_RULES.trendEveryMs || i === sorted.length - 1) {
      trendAtMs = r.atMs;
      trendOptions.nowMs = r.atMs;
      minutes = minutesToWet(margins, trendOptions);
    }
    const dewRisk = stepDewRisk(state.dewRisk, r.atMs, level.level, minutes);
    state.dewRisk = dewRisk;
    const humid = stepThreshold(
      state.humid,
      r.atMs,
      humidVerdict(r.rhPct, settings.humidRhPct),
      ALARM_RULES.humid,
    );
    state.humid = humid;

    emit(r, zoneId, null, 'dew_risk', dewRisk.active, dewRisk.sinceMs ?? r.atMs);
    emit(r, zoneId, null, 'wet_surface', level.level === 'wet', level.sinceMs ?? r.atMs);
    emit(r, zoneId, null, 'humid_air', humid.active, humid.sinceMs ?? r.atMs);
    // Any reading ends a silence (the book clears only silences that began before it).
    emit(r, r.sensorId, r.sensorId, 'sensor_silent', false, r.atMs);
    if (r.batteryV !== null) {
      const battery = stepThreshold(
        state.batteries[r.sensorId] ?? null,
        r.atMs,
        batteryVerdict(r.batteryV),
        ALARM_RULES.battery,
      );
      state.batteries[r.sensorId] = battery;
      emit(r, r.sensorId, r.sensorId, 'battery_low', battery.active, battery.sinceMs ?? r.atMs);
    }
  }
  return { state, signals };
}
