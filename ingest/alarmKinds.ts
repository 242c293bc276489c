/**
 * The kinds of alarm, in one list shared by the database enum (db/schema/alarms.ts), the server
 * and the app, with the level colour each kind borrows and the order in which they are listed.
 * Our own classification; the conditions behind each kind are in server/alarms/rules.ts.
 */
import type { Level } from './levels';

export const ALARM_KINDS = [
  'dew_risk',
  'wet_surface',
  'humid_air',
  'sensor_silent',
  'battery_low',
] as const;

export type AlarmKind = (typeof ALARM_KINDS)[number];

export function isAlarmKind(value: unknown): value is AlarmKind {
  return typeof value === 'string' && (ALARM_KINDS as readonly string[]).includes(value);
}

/** The level colour an alarm borrows; the words beside it carry the meaning. */
export const ALARM_KIND_LEVEL: Record<AlarmKind, Level> = {
  wet_surface: 'wet',
  dew_risk: 'close',
  humid_air: 'close',
  sensor_silent: 'unknown',
  battery_low: 'unknown',
};

/**
 * Worst first (0): water on the iron now, then soon, then a blind spot (a silent sensor looks
 * like a dry shop), then damp air, then a battery that still works.
 */
export const ALARM_KIND_RANK: Record<AlarmKind, number> = {
  wet_surface: 0,
  dew_risk: 1,
  sensor_silent: 2,
  humid_air: 3,
  battery_low: 4,
};

/** The kinds about a sensor rather than a zone's air or iron. */
export function isSensorKind(kind: AlarmKind): boolean {
  return kind === 'sensor_silent' || kind === 'battery_low';
}
