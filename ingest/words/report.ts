/**
 * The week report's words: the column labels with their units (./reportColumns, re-exported
 * here: one list for the CSV, the PDF and the Report screen), the daylight-saving note and the
 * plain verdicts written from the figures in the reader's unit. The figures themselves arrive in
 * °C, K, %, hours and minutes (ingest/wire/reports.ts); only what is shown here is converted.
 */
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

import { addDays, weekBounds } from '../reportWeek';
import type { TemperatureUnit } from '../units';
import type { ShopWeekFigures, WeekReport, ZoneWeekFigures } from '../wire/reports';
import { CAUTIONS } from './advice';
import { deltaInUnit, formatPercent } from './format';

export {
  REPORT_COLUMNS,
  SHOP_WIDE_LABEL,
  formatReportTime,
  type ReportCell,
  type ReportCellKind,
  type ReportColumn,
} from './reportColumns';

const HOUR_MS = 3_600_000;

/** Hours as people read them: "2.5 h", "12 h", "0 h". */
export function formatHours(hours: number): string {
  const text = hours.toFixed(1).replace(/\.0$/, '');
  return `${text === '-0' ? '0' : text} h`;
}

/** Minutes to acknowledge: "12 min", "1.5 h" from 90 min on. */
export function formatAckMinutes(minutes: number): string {
  return minutes >= 90 ? formatHours(minutes / 60) : `${Math.round(minutes)} min`;
}

/** "Tuesday at 06:10" in the shop's time zone. */
export function formatReportMoment(at: string, timeZone: string): string {
  return formatInTimeZone(new Date(at), timeZone, "EEEE 'at' HH:mm");
}

/**
 * "This week had 167 hours: clocks went forward on Sunday 29 March." when the week is not 168
 * hours long, else null. The day named is the one whose local midnight-to-midnight is not 24 h.
 */
export function weekNote(start: string, timeZone: string): string | null {
  const week = weekBounds(start, timeZone);
  if (week.hours === 168) return null;
  for (let i = 0; i < 7; i++) {
    const day = addDays(start, i);
    const dayHours =
      (localMidnightMs(addDays(day, 1), timeZone) - localMidnightMs(day, timeZone)) / HOUR_MS;
    if (dayHours !== 24) {
      const when = formatInTimeZone(new Date(`${day}T12:00:00Z`), 'UTC', 'EEEE d MMMM');
      const way = dayHours < 24 ? 'forward' : 'back';
      return `This week had ${week.hours} hours: clocks went ${way} on ${when}.`;
    }
  }
  return `This week had ${week.hours} hours.`;
}

const localMidnightMs = (day: string, timeZone: string) =>
  fromZonedTime(`${day}T00:00:00`, timeZone).getTime();

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** How the alarms went, in one sentence: "2 alarms, answered in 12 min at the median." */
function alarmSentence(a: {
  opened: number;
  medianAckMinutes: number | null;
  unacknowledged: number;
}): string {
  if (a.opened === 0) return 'No alarms.';
  if (a.medianAckMinutes === null) {
    return `${plural(a.opened, 'alarm')}, ${a.opened === 1 ? 'not' : 'none'} acknowledged.`;
  }
  const answered = `answered in ${formatAckMinutes(a.medianAckMinutes)} at the median`;
  const open = a.unacknowledged > 0 ? `; ${a.unacknowledged} not acknowledged yet` : '';
  return `${plural(a.opened, 'alarm')}, ${answered}${open}.`;
}

/** A zone's verdict: a few plain sentences from its figures, in the reader's unit. */
export function zoneVerdict(
  z: Omit<ZoneWeekFigures, 'verdict'>,
  unit: TemperatureUnit,
  timeZone: string,
): string {
  if (z.readings === 0) {
    return `No readings from ${z.name} in this period: nothing is known about it, so it cannot be called dry.`;
  }
  const parts: string[] = [];
  // A lumber rack's surface is the stock or the rack, not a machine's iron.
  const subject = z.purpose === 'lumber' ? 'The surface' : 'The iron';
  if (z.lowestMargin) {
    const when = formatReportMoment(z.lowestMargin.at, timeZone);
    const gap = `${deltaInUnit(Math.abs(z.lowestMargin.marginK), unit)} °${unit}`;
    parts.push(
      z.lowestMargin.marginK > 0
        ? `${subject} came within ${gap} of the dew point on ${when}`
        : z.lowestMargin.marginK === 0
          ? `${subject} reached the dew point on ${when}`
          : `${subject} went ${gap} below the dew point on ${when}`,
    );
    const h = z.levelHours;
    parts[0] +=
      h.wet > 0
        ? ` and was wet for ${formatHours(h.wet)}.`
        : h.close > 0
          ? ` and was close for ${formatHours(h.close)}, never wet.`
          : ', and it stayed dry.';
  } else {
    parts.push('No surface temperature came in, so the dew margin is unknown.');
  }
  const emc = z.emcPct;
  if (z.purpose === 'lumber' && emc.min !== null && emc.mean !== null && emc.max !== null) {
    // Wood moves towards the air's EMC slowly, so the mean says more than the extremes.
    parts.push(
      `The air would bring stored wood to ${formatPercent(emc.mean, 1)} moisture on average (EMC ${formatPercent(emc.min, 1)} to ${formatPercent(emc.max, 1)}).`,
    );
  }
  if (z.timeOfWetness.hours > 0) {
    parts.push(
      `The air was damp enough for rust (RH over 80 %) for ${formatHours(z.timeOfWetness.hours)}.`,
    );
  }
  if (z.coveragePct < 95) {
    const silentHours = z.silentPeriods.reduce((sum, p) => sum + p.hours, 0);
    parts.push(
      `Readings covered ${formatPercent(z.coveragePct)} of the time` +
        (z.silentPeriods.length > 0
          ? ` (${plural(z.silentPeriods.length, 'silent period')}, ${formatHours(silentHours)}).`
          : '.'),
    );
  }
  parts.push(alarmSentence(z.alarms));
  return parts.join(' ');
}

/**
 * The shop's verdict. When any iron was wet or close it suggests warming or drying, so it
 * carries the heater and dehumidifier cautions (ingest/words/advice.ts) with it.
 */
export function shopVerdict(
  s: Omit<ShopWeekFigures, 'verdict'>,
  unit: TemperatureUnit,
  timeZone: string,
): string {
  if (s.zones === 0) return 'This shop has no zones yet.';
  const parts: string[] = [];
  if (s.lowestMargin) {
    const when = formatReportMoment(s.lowestMargin.at, timeZone);
    const gap = `${deltaInUnit(Math.abs(s.lowestMargin.marginK), unit)} °${unit}`;
    const where =
      s.lowestMargin.marginK > 0
        ? `within ${gap} of the dew point`
        : s.lowestMargin.marginK === 0
          ? 'the dew point'
          : `${gap} below the dew point`;
    parts.push(`Closest approach: ${s.lowestMargin.zoneName} came ${where} on ${when}.`);
  } else {
    parts.push('No surface temperature came in this period, so no dew margin is known.');
  }
  if (s.coveragePct === 0) {
    // A silent shop looks like a dry one: say plainly that nothing is known.
    parts.push('No readings came in, so nothing is known: the shop cannot be called dry.');
    parts.push(alarmSentence({ ...s, opened: s.alarmsOpened }));
    return parts.join(' ');
  }
  const whileReporting = s.coveragePct < 95 ? ' while the sensors reported' : '';
  parts.push(
    s.zonesWet > 0
      ? `${plural(s.zonesWet, 'zone')} had wet iron, ${formatHours(s.wetHours)} in all.`
      : s.closeHours > 0
        ? `No iron was wet${whileReporting}; ${formatHours(s.closeHours)} close to the dew point.`
        : `No iron was wet or close${whileReporting}.`,
  );
  parts.push(`Readings covered ${formatPercent(s.coveragePct)} of the time.`);
  parts.push(alarmSentence({ ...s, opened: s.alarmsOpened }));
  if (s.zonesWet > 0 || s.closeHours > 0) {
    parts.push(
      'Warm the shop slowly or dry the air before the iron sweats, and cover or wax the tops.',
      CAUTIONS.fuelHeaters,
      CAUTIONS.appliancesAndCodes,
    );
  }
  return parts.join(' ');
}

/** The title of a report: "Week of Monday 23 March 2026". */
export function reportTitle(report: Pick<WeekReport, 'week'>): string {
  const when = formatInTimeZone(new Date(`${report.week.start}T12:00:00Z`), 'UTC', 'd MMMM yyyy');
  return `Week of Monday ${when}`;
}
