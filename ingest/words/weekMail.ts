/**
 * The words of the Monday week-report e-mail: its subject, the week's span, and one short line
 * per zone (lowest dew margin and when, wet hours, coverage) in the reader's unit, before the
 * zone's own verdict from the report. Times are written in the shop's zone: the mail may be
 * read anywhere, the week is the shop's.
 */
import { formatInTimeZone } from 'date-fns-tz';

import { addDays } from '../reportWeek';
import type { TemperatureUnit } from '../units';
import type { WeekReport, ZoneWeekFigures } from '../wire/reports';

import { formatMargin, formatPercent } from './format';
import { formatHours } from './report';

/** "Mon 23 Mar": a calendar date (YYYY-MM-DD) as that day, read at noon UTC on it. */
function calendarDay(date: string, pattern: string): string {
  return formatInTimeZone(new Date(`${date}T12:00:00Z`), 'UTC', pattern);
}

/** "Mon 23 Mar – Sun 29 Mar 2026": the seven days of the week that starts on `weekStart`. */
export function weekSpanWords(weekStart: string): string {
  const sunday = addDays(weekStart, 6);
  return `${calendarDay(weekStart, 'EEE d MMM')} – ${calendarDay(sunday, 'EEE d MMM yyyy')}`;
}

/** The subject: the shop and the week, so a mailbox lists each week apart. */
export function weekMailSubject(shopName: string, weekStart: string): string {
  return `Week report: ${shopName}, ${weekSpanWords(weekStart)}`;
}

/**
 * One zone in a line: "Machine room: lowest dew margin +0.4 °C (Tue 24 Mar 06:10), wet 2.5 h,
 * data 98 %". The margin is a difference (°F scales it ×1.8, no offset).
 */
export function zoneWeekLine(
  zone: ZoneWeekFigures,
  unit: TemperatureUnit,
  timeZone: string,
): string {
  const lowest = zone.lowestMargin
    ? `lowest dew margin ${formatMargin(zone.lowestMargin.marginK, unit)} (${formatInTimeZone(
        zone.lowestMargin.at,
        timeZone,
        'EEE d MMM HH:mm',
      )})`
    : 'no dew margin measured';
  return `${zone.name}: ${lowest}, wet ${formatHours(zone.levelHours.wet)}, data ${formatPercent(
    zone.coveragePct,
  )}`;
}

/** Why the person gets the mail, and how to stop it: the switch's own label on Profile. */
export function weekMailWhy(role: 'owner' | 'member' | 'viewer', shopName: string): string {
  const as = role === 'owner' ? 'an owner' : 'a member';
  return `You get this as ${as} of ${shopName} with the week report e-mail on.`;
}

export const WEEK_MAIL_OFF = 'To stop it, turn off “Week report e-mail on Mondays” under Profile:';

/** The attachment's name, dated by the week's Monday. */
export function weekReportPdfName(weekStart: string): string {
  return `drybench-week-${weekStart}.pdf`;
}

/** What the body says of the report, per the week's state. */
export function weekMailIntro(report: Pick<WeekReport, 'shop' | 'week'>): string {
  return `${report.shop.name}: the week ${weekSpanWords(report.week.start)} (${report.week.hours} h, ${report.shop.timeZone} time).`;
}
