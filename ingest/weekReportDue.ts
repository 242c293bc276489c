/**
 * When a shop's Monday week-report e-mail is due, and for which week. Pure: the time is an
 * argument. The week is the report's (ingest/reportWeek.ts: Monday 00:00 to the next Monday
 * 00:00 in the shop's IANA zone, 167 or 169 hours across a daylight-saving change); its mail is
 * due at 07:00 shop time on the Monday that ends it, and stays due (a server that was down on
 * Monday sends it when it comes back) until the next Monday 07:00, when the following week
 * takes its place.
 */
import { fromZonedTime } from 'date-fns-tz';

import { addDays, weekBounds, weekStartOf, type WeekBounds } from './reportWeek';

/** Shop-local hour of the Monday the mail goes out: early enough to read before work starts. */
export const WEEK_REPORT_MAIL_HOUR = 7;

/** When the mail of the week starting `weekStart` is due: the next Monday at 07:00 shop time. */
export function weekReportMailDueAt(weekStart: string, timeZone: string): Date {
  const hour = String(WEEK_REPORT_MAIL_HOUR).padStart(2, '0');
  return fromZonedTime(`${addDays(weekStart, 7)}T${hour}:00:00`, timeZone);
}

export interface WeekReportMailDue extends WeekBounds {
  /** Monday 07:00 shop time after the week: when its mail became due. */
  dueAtMs: number;
}

/**
 * The week whose mail is due at `nowMs`: the last week once this week's Monday 07:00 has
 * passed, else the week before it (whose Monday 07:00 was a week ago). Each week is due for
 * exactly one week, from its Monday 07:00 to the next, so a missed Monday is sent late and no
 * week is left out; a week never mailed in its window (a server down for a week) is skipped.
 */
export function weekReportMailDue(nowMs: number, timeZone: string): WeekReportMailDue {
  const lastWeek = addDays(weekStartOf(nowMs, timeZone), -7);
  const lastDueAt = weekReportMailDueAt(lastWeek, timeZone);
  const start = nowMs < lastDueAt.getTime() ? addDays(lastWeek, -7) : lastWeek;
  return {
    ...weekBounds(start, timeZone),
    dueAtMs: weekReportMailDueAt(start, timeZone).getTime(),
  };
}

/** Whether the mail of the week starting `weekStart` is the one due at `nowMs`. */
export function isWeekReportMailDue(weekStart: string, nowMs: number, timeZone: string): boolean {
  return weekReportMailDue(nowMs, timeZone).start === weekStart;
}
