/**
 * Steps one zone's alarm state through a batch of stored readings in time order and says, at
 * every reading, which conditions hold: the signals the alarm book turns into opened, updated
 * and cleared alarms. Pure: the zone's stored margins come in as an argument.
 */
import type { AlarmKind } from '@/db/schema';
import {
  minutesToWet,
  stepLevelHysteresis,
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

export interface ZoneAlarmState {
  level: LevelState | null;
  /** Start of the run that led to the current confirmed level. */
  levelSinceMs: number | null;
  dewRisk: DewRiskState | null;
  humid: ThresholdState | null;
  /** Battery runs, per sensor of the zone. */
  batteries: Record<string, ThresholdState>;
}

export const EMPTY_ZONE_STATE: ZoneAlarmState = {
  level: null,
  levelSinceMs: null,
  dewRisk: null,
  humid: null,
  batteries: {},
};

/** A stored state, or a fresh one when it is missing or from an older shape. */
export function readZoneState(stored: Record<string, unknown> | null): ZoneAlarmState {
  if (!stored || typeof stored.batteries !== 'object' || stored.batteries === null) {
    return EMPTY_ZONE_STATE;
  }
  return { ...EMPTY_ZONE_STATE, ...(stored as Partial<ZoneAlarmState>) };
}

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
  const state: ZoneAlarmState = { ...initial, batteries: { ...initial.batteries } };
  const signals: Signal[] = [];
  const sorted = [...readings].sort((a, b) => a.atMs - b.atMs);
  let trendAtMs = -Infinity;
  let minutes: number | null = null;

  sorted.forEach((r, i) => {
    const before = state.level;
    const level = stepLevelHysteresis(
      before,
      { atMs: r.atMs, marginK: r.marginK },
      { limits: settings.limits, ...ALARM_RULES.level },
    );
    if (!level) return; // only for a time that is not a number, which ingest never stores
    if (level.level !== before?.level) {
      state.levelSinceMs = before?.pending?.level === level.level ? before.pending.sinceMs : r.atMs;
    }
    state.level = level;

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
        sinceMs: state.levelSinceMs ?? r.atMs,
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
