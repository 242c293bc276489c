/**
 * Time-axis ticks on whole hours of the shop's own clock, not the viewer's: a shop in
 * Kolkata seen from London still gets ticks at 06:00, 12:00… local to the shop.
 */
import { formatInTimeZone } from 'date-fns-tz';

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
