/**
 * An alarm in the plain words of an e-mail, in the reader's temperature unit and the shop's time
 * zone: the headline that becomes the subject ("Machine room: wet in about 40 min"), what
 * happened, the numbers and what to do now. Pure: every time and value comes in.
 */
import { formatInTimeZone } from 'date-fns-tz';

import type { AlarmKind } from '@/db/schema';
import { cToF, kToFDelta, type TemperatureUnit } from '@/ingest/units';

/** The alarm's values when the mail is written (margins K, temperatures °C). */
export interface MailedAlarm {
  kind: AlarmKind;
  zoneName: string;
  sensorName: string | null;
  sinceAt: Date;
  openedAt: Date;
  minutesToWet: number | null;
  worstMarginK: number | null;
  latestMarginK: number | null;
  peakRhPct: number | null;
  latestRhPct: number | null;
  lowestBatteryV: number | null;
  latestBatteryV: number | null;
}

/** The reading behind the alarm: the one that last changed it, or a silent sensor's last. */
export interface MailedReading {
  at: Date;
  airC: number;
  rhPct: number;
  surfaceC: number | null;
  surfaceSource: 'probe' | 'estimate' | null;
  dewPointC: number | null;
  marginK: number | null;
  batteryV: number | null;
}

const MISSING = '—';

/** "-0.4 °F" rather than "-0.0": a sign flicker around zero would read as a change. */
function oneDecimal(value: number): string {
  const text = value.toFixed(1);
  return Number(text) === 0 ? '0.0' : text;
}

export function mailTemperature(valueC: number | null, unit: TemperatureUnit): string {
  if (valueC === null) return MISSING;
  return `${oneDecimal(unit === 'F' ? cToF(valueC) : valueC)} °${unit}`;
}

/** A dew margin is a difference: in °F it only scales (1 K = 1.8 °F), and it carries a sign. */
export function mailMargin(marginK: number | null, unit: TemperatureUnit): string {
  if (marginK === null) return MISSING;
  const text = oneDecimal(unit === 'F' ? kToFDelta(marginK) : marginK);
  return `${text.startsWith('-') || text === '0.0' ? '' : '+'}${text} °${unit}`;
}

export const mailRh = (rhPct: number | null) =>
  rhPct === null ? MISSING : `${rhPct.toFixed(0)} %`;
export const mailVolts = (v: number | null) => (v === null ? MISSING : `${v.toFixed(2)} V`);

/** Whole minutes under 10, then steps of 5 (a trend fit is no finer), then half hours. */
export function aboutMinutes(minutes: number): string {
  if (minutes < 10) return `about ${Math.max(1, Math.round(minutes))} min`;
  if (minutes < 90) return `about ${Math.round(minutes / 5) * 5} min`;
  return `about ${(Math.round(minutes / 30) / 2).toFixed(1).replace(/\.0$/, '')} h`;
}

/** "06:12" in the shop's zone. */
export const clockIn = (at: Date, timeZone: string) => formatInTimeZone(at, timeZone, 'HH:mm');

/** "06:12 on Tue 3 Mar (America/Chicago)": a mail may be read a day later. */
export const shopTime = (at: Date, timeZone: string) =>
  `${formatInTimeZone(at, timeZone, "HH:mm 'on' EEE d MMM")} (${timeZone})`;

const sensorOf = (a: MailedAlarm) => a.sensorName ?? 'A sensor';

/** One line; with the shop's name it is the subject. */
export function alarmMailHeadline(a: MailedAlarm, unit: TemperatureUnit, timeZone: string) {
  switch (a.kind) {
    case 'dew_risk':
      return a.minutesToWet !== null && a.minutesToWet > 0
        ? `${a.zoneName}: wet in ${aboutMinutes(a.minutesToWet)}`
        : `${a.zoneName}: dew risk, margin ${mailMargin(a.latestMarginK, unit)}`;
    case 'wet_surface':
      return `${a.zoneName}: wet, margin ${mailMargin(a.latestMarginK, unit)}`;
    case 'humid_air':
      return `${a.zoneName}: humid air since ${clockIn(a.sinceAt, timeZone)}, ${mailRh(a.latestRhPct)} RH`;
    case 'sensor_silent':
      return `${sensorOf(a)} silent since ${clockIn(a.sinceAt, timeZone)}`;
    case 'battery_low':
      return `${sensorOf(a)}: battery low, ${mailVolts(a.latestBatteryV)}`;
  }
}

/** What happened, in a sentence or two. */
export function alarmMailStory(a: MailedAlarm, unit: TemperatureUnit, timeZone: string): string {
  const zone = a.zoneName;
  switch (a.kind) {
    case 'dew_risk':
      return a.minutesToWet !== null && a.minutesToWet > 0
        ? `The dew margin in ${zone} is falling: at this rate the iron reaches the wet limit in ${aboutMinutes(a.minutesToWet)}, before water condenses on it.`
        : `The iron in ${zone} is close to the dew point: the dew margin is ${mailMargin(a.latestMarginK, unit)}, inside the caution limit.`;
    case 'wet_surface':
      return `The iron in ${zone} is at or below the wet limit since ${clockIn(a.sinceAt, timeZone)}: the dew margin is ${mailMargin(a.latestMarginK, unit)}, so water may be condensing on the machine tops now.`;
    case 'humid_air':
      return `The air in ${zone} has been above the zone’s humidity limit since ${clockIn(a.sinceAt, timeZone)} (peak ${mailRh(a.peakRhPct)} RH). Damp air speeds up rust even when nothing condenses.`;
    case 'sensor_silent':
      return `${sensorOf(a)} in ${zone} has sent nothing since ${shopTime(a.sinceAt, timeZone)}. A silent sensor looks like a dry shop: until it posts again, Drybench cannot warn you about this zone.`;
    case 'battery_low':
      return `${sensorOf(a)} in ${zone} reports a low battery: ${mailVolts(a.latestBatteryV)} (lowest ${mailVolts(a.lowestBatteryV)}). A sensor whose battery runs out goes silent.`;
  }
}

/** The numbers as label–value rows, in the reader's unit. */
export function alarmMailNumbers(
  a: MailedAlarm,
  r: MailedReading | null,
  unit: TemperatureUnit,
): [string, string][] {
  const rows: [string, string][] = [];
  if (r) {
    if (r.marginK !== null) rows.push(['Dew margin', mailMargin(r.marginK, unit)]);
    if (a.worstMarginK !== null && a.worstMarginK !== r.marginK) {
      rows.push(['Lowest margin so far', mailMargin(a.worstMarginK, unit)]);
    }
    if (r.dewPointC !== null) rows.push(['Dew point', mailTemperature(r.dewPointC, unit)]);
    if (r.surfaceC !== null) {
      const how = r.surfaceSource === 'estimate' ? ' (estimated)' : '';
      rows.push(['Surface', `${mailTemperature(r.surfaceC, unit)}${how}`]);
    }
    rows.push(['Air', mailTemperature(r.airC, unit)], ['Relative humidity', mailRh(r.rhPct)]);
    if (r.batteryV !== null) rows.push(['Battery', mailVolts(r.batteryV)]);
  }
  if (a.kind === 'humid_air' && a.peakRhPct !== null) rows.push(['Peak RH', mailRh(a.peakRhPct)]);
  return rows;
}

const CAUTION =
  'Heaters, dehumidifiers and electrical work near machines: follow the maker’s instructions and your local electrical codes, and use a licensed electrician for new circuits.';

const DAMP_STEPS = [
  'Warm the shop slowly (a few degrees an hour) so the iron keeps up with the air.',
  'Run the dehumidifier, and close doors and windows against damp outside air.',
  'Wipe the machine tops dry and cover them; renew wax or rust inhibitor once the margin has recovered.',
];

/** What to do now, then the caution that goes with heaters, dryers and wiring. */
export function alarmMailSteps(kind: AlarmKind): { steps: string[]; caution: string } {
  switch (kind) {
    case 'dew_risk':
    case 'humid_air':
      return { steps: DAMP_STEPS, caution: CAUTION };
    case 'wet_surface':
      return { steps: [DAMP_STEPS[2]!, DAMP_STEPS[0]!, DAMP_STEPS[1]!], caution: CAUTION };
    case 'sensor_silent':
      return {
        steps: [
          'Check the sensor’s power: batteries, or the plug and its outlet.',
          'Check its network: Wi-Fi reach, the router, and that its token was not revoked (Sensors page).',
          'Until it posts again, look at the machines yourself.',
        ],
        caution: CAUTION,
      };
    case 'battery_low':
      return {
        steps: ['Fit fresh batteries of the kind the sensor’s maker names, before it goes silent.'],
        caution: CAUTION,
      };
  }
}
