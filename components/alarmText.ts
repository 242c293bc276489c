/**
 * Alarms in plain words: "Machine room: wet in about 40 min", "Rack hygrometer silent since
 * 06:12", "Wiped and covered — acknowledged by Ana". Pure: the time and zone come in.
 */
import { formatInTimeZone } from 'date-fns-tz';

import type { Level } from '@/ingest';

import { formatMargin, formatPercent } from './format';
import type { Alarm, AlarmKind } from './queries';

export const ALARM_KIND_WORDS: Record<AlarmKind, string> = {
  dew_risk: 'Dew risk',
  wet_surface: 'Wet surface',
  humid_air: 'Humid air',
  sensor_silent: 'Sensor silent',
  battery_low: 'Battery low',
};

/** The level colour an alarm borrows; the words beside it carry the meaning. */
export const ALARM_KIND_TONE: Record<AlarmKind, Level> = {
  wet_surface: 'wet',
  dew_risk: 'close',
  humid_air: 'close',
  sensor_silent: 'unknown',
  battery_low: 'unknown',
};

/** Worst first, for the banner's order and its edge colour. */
const SEVERITY: Record<AlarmKind, number> = {
  wet_surface: 0,
  dew_risk: 1,
  sensor_silent: 2,
  humid_air: 3,
  battery_low: 4,
};

export function bySeverity(a: Alarm, b: Alarm): number {
  return SEVERITY[a.kind] - SEVERITY[b.kind] || Date.parse(b.openedAt) - Date.parse(a.openedAt);
}

/**
 * The banner's lines: those nobody has answered yet first, each group worst first. A zone that
 * is wet already says so; its dew-risk warning would only repeat it there (the Alarms page
 * keeps both).
 */
export function bannerAlarms(open: readonly Alarm[]): Alarm[] {
  const wetZones = new Set(open.filter((a) => a.kind === 'wet_surface').map((a) => a.zone.id));
  const answered = (a: Alarm) => (a.acknowledgement ? 1 : 0);
  return open
    .filter((a) => !(a.kind === 'dew_risk' && wetZones.has(a.zone.id)))
    .sort((a, b) => answered(a) - answered(b) || bySeverity(a, b));
}

/** "about 40 min": whole minutes under 10, then steps of 5 — a fit is no finer than that. */
export function aboutMinutes(minutes: number): string {
  if (minutes < 10) return `about ${Math.max(1, Math.round(minutes))} min`;
  if (minutes < 90) return `about ${Math.round(minutes / 5) * 5} min`;
  return `about ${(Math.round(minutes / 30) / 2).toFixed(1).replace(/\.0$/, '')} h`;
}

/** A time in the shop's zone: the clock within the last 18 hours, else the date as well. */
export function formatAlarmTime(atIso: string, nowMs: number, timeZone: string): string {
  const atMs = Date.parse(atIso);
  const pattern = nowMs - atMs < 18 * 3_600_000 ? 'HH:mm' : 'd MMM HH:mm';
  return formatInTimeZone(atMs, timeZone, pattern);
}

/** What the alarm is about: the zone, or the sensor for the sensor kinds. */
export function alarmSubject(alarm: Alarm): string {
  return alarm.sensor && (alarm.kind === 'sensor_silent' || alarm.kind === 'battery_low')
    ? alarm.sensor.name
    : alarm.zone.name;
}

/**
 * One line: what is wrong, where, and how bad. A cleared alarm names only what it was: its
 * values at the clear would read as if the iron were still wet.
 */
export function alarmHeadline(alarm: Alarm, nowMs: number, timeZone: string): string {
  const subject = alarmSubject(alarm);
  if (alarm.state === 'cleared') {
    const what = ALARM_KIND_WORDS[alarm.kind].toLowerCase();
    return alarm.kind === 'sensor_silent' ? `${subject} was silent` : `${subject}: ${what}`;
  }
  switch (alarm.kind) {
    case 'dew_risk': {
      const minutes = alarm.minutesToWet;
      if (minutes !== null && minutes > 0) return `${subject}: wet in ${aboutMinutes(minutes)}`;
      return `${subject}: dew risk, margin ${formatMargin(alarm.latestMarginK)}`;
    }
    case 'wet_surface':
      return `${subject}: wet, margin ${formatMargin(alarm.latestMarginK)}`;
    case 'humid_air':
      return `${subject}: humid air, ${formatPercent(alarm.latestRhPct)} RH`;
    case 'sensor_silent':
      return `${subject} silent since ${formatAlarmTime(alarm.sinceAt, nowMs, timeZone)}`;
    case 'battery_low':
      return `${subject}: battery low, ${alarm.latestBatteryV?.toFixed(2) ?? '—'} V`;
  }
}

/** "Wiped and covered — acknowledged by Ana", or null before anyone has. */
export function acknowledgementLine(alarm: Alarm): string | null {
  const ack = alarm.acknowledgement;
  if (!ack) return null;
  const who = ack.by?.name ?? 'a former member';
  return ack.note ? `${ack.note} — acknowledged by ${who}` : `Acknowledged by ${who}`;
}

/** What usually helps; the caution below goes with anything that names a heater or dryer. */
export const ALARM_ADVICE: Record<AlarmKind, string> = {
  dew_risk:
    'Warm the shop slowly, run the dehumidifier, close up, or cover the machines before the iron sweats.',
  wet_surface:
    'Wipe the iron dry, cover it, and renew wax or rust inhibitor once the margin has recovered.',
  humid_air: 'Close doors and windows and run the dehumidifier.',
  sensor_silent: 'Check the sensor’s power and signal: a silent sensor looks like a dry shop.',
  battery_low: 'Fit fresh batteries before the sensor goes silent.',
};

export const APPLIANCE_CAUTION =
  'Heaters and dehumidifiers: follow the maker’s instructions and local electrical codes.';

export function needsApplianceCaution(kind: AlarmKind): boolean {
  return kind === 'dew_risk' || kind === 'humid_air';
}

export const ACK_NOTE_MAX = 500;

/** The server's rule for a note (1–500 characters after trimming), said before it is sent. */
export function ackNoteProblem(note: string): string | null {
  const trimmed = note.trim();
  if (trimmed.length === 0) return 'Say in a few words what was done.';
  if (trimmed.length > ACK_NOTE_MAX) return `Keep the note to ${ACK_NOTE_MAX} characters.`;
  return null;
}
