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
  const ticks: number[] = [];
  // Every zone offset in use is a multiple of 15 minutes, so whole local hours fall on these.
  for (
    let t = Math.ceil(fromMs / QUARTER_HOUR_MS) * QUARTER_HOUR_MS;
    t <= toMs;
    t += QUARTER_HOUR_MS
  ) {
    const [hour, minute] = formatInTimeZone(t, timeZone, 'H:m').split(':').map(Number);
    if (minute === 0 && hour !== undefined && hour % stepHours === 0) ticks.push(t);
  }
  return ticks;
}

/** "06:00", or the weekday at midnight so a day's turn is visible: "Tue". */
export function hourTickLabel(t: number, timeZone: string): string {
  const clock = formatInTimeZone(t, timeZone, 'HH:mm');
  return clock === '00:00' ? formatInTimeZone(t, timeZone, 'EEE') : clock;
}
