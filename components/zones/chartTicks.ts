/**
 * Time-axis ticks on whole hours of the shop's own clock, not the viewer's: a shop in
 * Kolkata seen from London still gets ticks at 06:00, 12:00… local to the shop.
 */
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

const QUARTER_HOUR_MS = 15 * 60_000;

/** Instants in [fromMs, toMs] that fall on a whole hour divisible by `stepHours` in the zone. */
export function hourTicks(
  fromMs: number,
  toMs: number,
  timeZone: string,
  stepHours: number,
): number[] {
  return clockTicks(fromMs, toMs, timeZone, stepHours * 60);
}

/**
 * Instants in [fromMs, toMs] whose local clock time is a multiple of `stepMinutes` (15, 30, 60,
 * 120…) since midnight in the zone.
 */
export function clockTicks(
  fromMs: number,
  toMs: number,
  timeZone: string,
  stepMinutes: number,
): number[] {
  const ticks: number[] = [];
  // Every zone offset in use is a multiple of 15 minutes, so whole local quarters fall on these.
  for (
    let t = Math.ceil(fromMs / QUARTER_HOUR_MS) * QUARTER_HOUR_MS;
    t <= toMs;
    t += QUARTER_HOUR_MS
  ) {
    const [hour, minute] = formatInTimeZone(t, timeZone, 'H:m').split(':').map(Number);
    if (hour === undefined || minute === undefined) continue;
    if ((hour * 60 + minute) % stepMinutes === 0) ticks.push(t);
  }
  return ticks;
}

const STEPS_MINUTES = [15, 30, 60, 120, 180, 360, 720];

/**
 * The finest clock step that leaves about `widthPx / 70` labels over the span ("HH:mm" needs
 * about 70 px to stay apart on a phone): an hour's chart gets quarter hours, a day's 2–6 h.
 */
export function tickStepMinutes(spanMs: number, widthPx: number): number {
  const labels = Math.max(2, Math.floor(widthPx / 70));
  const spanMinutes = spanMs / 60_000;
  return STEPS_MINUTES.find((step) => spanMinutes / step <= labels) ?? 1440;
}

/** "06:00", or the weekday at midnight so a day's turn is visible: "Tue". */
export function hourTickLabel(t: number, timeZone: string): string {
  const clock = formatInTimeZone(t, timeZone, 'HH:mm');
  return clock === '00:00' ? formatInTimeZone(t, timeZone, 'EEE') : clock;
}

const DAY_MS = 86_400_000;
const DAY_STEPS = [1, 2, 3, 7, 14];
// A date label ("30 Nov", "Tue 3") is 6 characters: about 60 px keeps two apart on a phone.
const DATE_LABEL_PX = 60;

/**
 * Local midnights of the shop in [fromMs, toMs], every `stepDays` days (weekly steps on
 * Mondays). Each comes from the local date, not from adding 24 h, so a day with a DST change
 * (23 or 25 hours) still ends on the next midnight.
 */
export function midnightTicks(
  fromMs: number,
  toMs: number,
  timeZone: string,
  stepDays: number,
): number[] {
  const ticks: number[] = [];
  const [y, m, d] = formatInTimeZone(fromMs, timeZone, 'yyyy-MM-dd').split('-').map(Number);
  // The calendar day as a count since 1970-01-01 (a Thursday; the 5th was a Monday).
  let day = Date.UTC(y!, m! - 1, d!) / DAY_MS;
  for (;;) {
    const date = new Date(day * DAY_MS).toISOString().slice(0, 10);
    const midnight = fromZonedTime(`${date}T00:00:00`, timeZone).getTime();
    if (midnight > toMs) break;
    const onStep =
      stepDays === 7 || stepDays === 14 ? (day - 4) % stepDays === 0 : day % stepDays === 0;
    if (midnight >= fromMs && onStep) ticks.push(midnight);
    day += 1;
  }
  return ticks;
}

export interface AxisTicks {
  ticks: number[];
  label: (t: number) => string;
}

/**
 * The time axis for any span: clock ticks ("06:00", the weekday at midnight) up to about two
 * days, then local midnights labelled with the date ("Tue 3", or "3 Mar" for wider steps).
 */
export function axisTicks(
  fromMs: number,
  toMs: number,
  timeZone: string,
  widthPx: number,
): AxisTicks {
  const spanMs = toMs - fromMs;
  const stepMinutes = tickStepMinutes(spanMs, widthPx);
  // Past two days, a clock label ("12:00") no longer says which day: dates instead.
  if (stepMinutes < 1440 && spanMs <= 2 * DAY_MS) {
    return {
      ticks: clockTicks(fromMs, toMs, timeZone, stepMinutes),
      label: (t) => hourTickLabel(t, timeZone),
    };
  }
  const labels = Math.max(2, Math.floor(widthPx / DATE_LABEL_PX));
  const stepDays = DAY_STEPS.find((step) => spanMs / DAY_MS / step <= labels) ?? 28;
  return {
    ticks: midnightTicks(fromMs, toMs, timeZone, stepDays),
    label: (t) => formatInTimeZone(t, timeZone, stepDays === 1 ? 'EEE d' : 'd MMM'),
  };
}
