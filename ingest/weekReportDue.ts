/**
 * When a shop's Monday week-report e-mail is due, and for which week. Pure: the time is an
 * argument. A week is Monday 00:00 to the next Monday 00:00 in the shop's IANA zone, so it has
 * 167 or 169 hours across a daylight-saving change; the mail for it is due at 07:00 shop time
 * on the Monday that ends it, and stays due (a server that was down on Monday sends it when it
 * comes back) until the next Monday 07:00, when the following week takes its place.
 */
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

/** Shop-local hour of the Monday the mail goes out: early enough to read before work starts. */
export const WEEK_REPORT_MAIL_HOUR = 7;

const DAY_MS = 86_400_000;

/** A calendar date (YYYY-MM-DD) moved by whole days; calendar arithmetic, no time zone. */
export function addCalendarDays(date: string, days: number): string {
  const [year, month, day] = date.split('-').map(Number) as [number, number, number];
  return new Date(Date.UTC(year, month - 1, day) + days * DAY_MS).toISOString().slice(0, 10);
}

/** The shop-local Monday (YYYY-MM-DD) of the week holding the instant `atMs`. */
export function localMondayOf(atMs: number, timeZone: string): string {
  const localDate = formatInTimeZone(atMs, timeZone, 'yyyy-MM-dd');
  // ISO day of the week: 1 is Monday, 7 is Sunday.
  const isoDay = Number(formatInTimeZone(atMs, timeZone, 'i'));
  return addCalendarDays(localDate, 1 - isoDay);
}

/** The instant a shop-local date's clock reads `hour`:00 in `timeZone`. */
function localInstant(date: string, hour: number, timeZone: string): Date {
  return fromZonedTime(`${date}T${String(hour).padStart(2, '0')}:00:00`, timeZone);
}

export interface ShopWeek {
  /** The Monday that starts the week, shop-local, YYYY-MM-DD. */
  weekStart: string;
  /** Monday 00:00 and the next Monday 00:00, shop-local, as instants. */
  from: Date;
  to: Date;
  /** 168, or 167 / 169 across a daylight-saving change. */
  hours: number;
}

/** The week that starts on the shop-local Monday `weekStart`. */
export function shopWeek(weekStart: string, timeZone: string): ShopWeek {
  const from = localInstant(weekStart, 0, timeZone);
  const to = localInstant(addCalendarDays(weekStart, 7), 0, timeZone);
  return { weekStart, from, to, hours: (to.getTime() - from.getTime()) / 3_600_000 };
}

export interface WeekReportMailDue extends ShopWeek {
  /** Monday 07:00 shop time after the week: when its mail became due. */
  dueAt: Date;
}

/** When the mail of the week starting `weekStart` is due: the next Monday at 07:00 shop time. */
export function weekReportMailDueAt(weekStart: string, timeZone: string): Date {
  return localInstant(addCalendarDays(weekStart, 7), WEEK_REPORT_MAIL_HOUR, timeZone);
}

/**
 * The week whose mail is due at `nowMs`: the last week once this week's Monday 07:00 has
 * passed, else the week before it (whose Monday 07:00 was a week ago). Each week is due for
 * exactly one week, from its Monday 07:00 to the next, so a missed Monday is sent late and no
 * week is left out; a week never mailed in its window (a server down for a week) is skipped.
 */
export function weekReportMailDue(nowMs: number, timeZone: string): WeekReportMailDue {
  const thisMonday = localMondayOf(nowMs, timeZone);
  const lastWeek = addCalendarDays(thisMonday, -7);
  const lastDueAt = weekReportMailDueAt(lastWeek, timeZone);
  const weekStart = nowMs < lastDueAt.getTime() ? addCalendarDays(lastWeek, -7) : lastWeek;
  return { ...shopWeek(weekStart, timeZone), dueAt: weekReportMailDueAt(weekStart, timeZone) };
}

/** Whether the mail of the week starting `weekStart` is due at `nowMs` (and not yet passed). */
export function isWeekReportMailDue(weekStart: string, nowMs: number, timeZone: string): boolean {
  return weekReportMailDue(nowMs, timeZone).weekStart === weekStart;
}
