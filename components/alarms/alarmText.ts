/**
 * Alarms on screen. The words themselves (kind names, headlines, advice and cautions) live in
 * ingest/words, shared with the alarm e-mails; this file maps the API's alarm onto them, writes
 * times in the shop's zone, and orders the banner. Pure: the time, zone and unit come in.
 */
import { formatInTimeZone } from 'date-fns-tz';

import { ALARM_KIND_LEVEL, ALARM_KIND_RANK } from '@/ingest/alarmKinds';
import type { TemperatureUnit } from '@/ingest/units';
import {
  alarmHeadline as headlineWords,
  alarmNowAndWorst,
  alarmRule,
  type AlarmFacts,
  type AlarmRuleWords,
  type CurrentFacts,
} from '@/ingest/words';

import type { Alarm, Zone } from '@/components/queries';

/** The level colour an alarm borrows; the words beside it carry the meaning. */
export const ALARM_KIND_TONE = ALARM_KIND_LEVEL;

export function bySeverity(a: Alarm, b: Alarm): number {
  return (
    ALARM_KIND_RANK[a.kind] - ALARM_KIND_RANK[b.kind] ||
    Date.parse(b.openedAt) - Date.parse(a.openedAt)
  );
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

/** A time in the shop's zone: the clock within the last 18 hours, else the date as well. */
export function formatAlarmTime(atIso: string, nowMs: number, timeZone: string): string {
  const atMs = Date.parse(atIso);
  const pattern = nowMs - atMs < 18 * 3_600_000 ? 'HH:mm' : 'd MMM HH:mm';
  return formatInTimeZone(atMs, timeZone, pattern);
}

/** What the alarm's zone reads now, from its newest reading (the zones query, patched live). */
export function currentOf(zone: Zone | undefined): CurrentFacts | null {
  const latest = zone?.latest;
  if (!latest) return null;
  return { marginK: latest.margin, level: latest.level, rhPct: latest.rh };
}

/**
 * The API's alarm as the shared words take it. With its zone's newest reading at hand, an open
 * alarm loses its own latest values: the engine records a change only when it matters, so they
 * can be minutes old (a "margin −2.7" above a dry card). The headline then names the condition
 * alone and the zone's current value stands on its own line beside the worst (nowAndWorst).
 */
export function alarmFacts(alarm: Alarm, zone?: Zone): AlarmFacts {
  const latest = zone?.latest;
  // With the zone's reading at hand the screen shows it on its own line (nowAndWorst).
  const fresher = alarm.state === 'open' && latest !== null && latest !== undefined;
  return {
    kind: alarm.kind,
    cleared: alarm.state === 'cleared',
    zoneName: alarm.zone.name,
    sensorName: alarm.sensor?.name ?? null,
    minutesToWet: alarm.minutesToWet,
    worstMarginK: alarm.worstMarginK,
    latestMarginK: fresher ? null : alarm.latestMarginK,
    peakRhPct: alarm.peakRhPct,
    latestRhPct: fresher ? null : alarm.latestRhPct,
    lowestBatteryV: alarm.lowestBatteryV,
    latestBatteryV: alarm.latestBatteryV,
  };
}

/** One line: what is wrong, where, and how bad now, in the person's unit. */
export function alarmHeadline(
  alarm: Alarm,
  nowMs: number,
  timeZone: string,
  unit: TemperatureUnit = 'C',
  zone?: Zone,
): string {
  return headlineWords(alarmFacts(alarm, zone), {
    unit,
    since: formatAlarmTime(alarm.sinceAt, nowMs, timeZone),
  });
}

/** "Now margin +8.3 °C, dry · worst margin -2.7 °C" for an open alarm; null for a silent sensor. */
export function nowAndWorst(alarm: Alarm, zone: Zone | undefined, unit: TemperatureUnit) {
  const now = alarm.state === 'open' ? currentOf(zone) : null;
  return alarmNowAndWorst(alarmFacts(alarm, zone), now, unit);
}

/** When the alarm opens and clears, with its zone's limits; null until the zone is known. */
export function ruleOf(
  alarm: Alarm,
  zone: Zone | undefined,
  unit: TemperatureUnit,
): AlarmRuleWords | null {
  return zone ? alarmRule(alarm.kind, zone, unit) : null;
}

/** The zones by id: each alarm card and banner line finds its zone's limits and newest reading. */
export function zonesById(zones: readonly Zone[] | undefined): Map<string, Zone> {
  return new Map((zones ?? []).map((zone) => [zone.id, zone]));
}

/** "Wiped and covered — acknowledged by Ana", or null before anyone has. */
export function acknowledgementLine(alarm: Alarm): string | null {
  const ack = alarm.acknowledgement;
  if (!ack) return null;
  const who = ack.by?.name ?? 'a former member';
  return ack.note ? `${ack.note} — acknowledged by ${who}` : `Acknowledged by ${who}`;
}

export const ACK_NOTE_MAX = 500;

/** The server's rule for a note (1–500 characters after trimming), said before it is sent. */
export function ackNoteProblem(note: string): string | null {
  const trimmed = note.trim();
  if (trimmed.length === 0) return 'Say in a few words what was done.';
  if (trimmed.length > ACK_NOTE_MAX) return `Keep the note to ${ACK_NOTE_MAX} characters.`;
  return null;
}
