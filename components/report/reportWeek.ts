/**
 * The report's weeks on the screen, as shop-local calendar dates. A week is named by its Monday
 * (YYYY-MM-DD, what the API's `start` takes); moving a week is calendar arithmetic on that date
 * (ingest/reportWeek.ts, the server's own calendar), so a week across a daylight-saving change
 * (167 or 169 hours) still steps Monday to Monday. Pure: the current time is an argument.
 */
import { formatInTimeZone } from 'date-fns-tz';

import { addDays, isMonday, weekStartOf } from '@/ingest/reportWeek';

const DAY_MS = 86_400_000;

/** Midnight UTC of a calendar date, or null when the text is not a real YYYY-MM-DD date. */
function dateMs(date: string): number | null {
  const ms = Date.parse(`${date}T00:00:00Z`);
  return /^\d{4}-\d{2}-\d{2}$/.test(date) && new Date(ms).toISOString().slice(0, 10) === date
    ? ms
    : null;
}

const dateOf = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** A week's Monday from a URL's `?week=`: a real date that is a Monday, else null. */
export function parseWeekStart(value: unknown): string | null {
  return typeof value === 'string' && isMonday(value) ? value : null;
}

/** The Monday `weeks` weeks after (negative: before) the Monday `start`. */
export function shiftWeek(start: string, weeks: number): string {
  return addDays(start, weeks * 7);
}

/** Whether `start` is the shop's current week or a later one: nothing after it to go to. */
export function isLatestWeek(start: string, nowMs: number, timeZone: string): boolean {
  return start >= weekStartOf(nowMs, timeZone);
}

const day = (ms: number, withYear: boolean) =>
  formatInTimeZone(ms, 'UTC', withYear ? 'EEE d MMM yyyy' : 'EEE d MMM');

/** "Mon 23 Mar – Sun 29 Mar 2026"; both years when the week spans New Year. */
export function weekLabel(start: string): string {
  const fromMs = dateMs(start);
  if (fromMs === null) return start;
  const toMs = fromMs + 6 * DAY_MS;
  const sameYear = dateOf(fromMs).slice(0, 4) === dateOf(toMs).slice(0, 4);
  return `${day(fromMs, !sameYear)} – ${day(toMs, true)}`;
}

/** The short dates a week-step button names: "16–22 Mar", "30 Mar–5 Apr". */
export function weekSpanShort(start: string): string {
  const fromMs = dateMs(start);
  if (fromMs === null) return start;
  const toMs = fromMs + 6 * DAY_MS;
  const sameMonth = dateOf(fromMs).slice(0, 7) === dateOf(toMs).slice(0, 7);
  const from = formatInTimeZone(fromMs, 'UTC', sameMonth ? 'd' : 'd MMM');
  return `${from}–${formatInTimeZone(toMs, 'UTC', 'd MMM')}`;
}

/** The report covers its week only so far (the current week): its figures stop before `to`. */
export function isPartialWeek(week: { to: string; periodEnd: string }): boolean {
  return Date.parse(week.periodEnd) < Date.parse(week.to);
}
