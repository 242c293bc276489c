/**
 * The chart in words: a one-line summary under it (also the chart's accessible name) and the
 * rows of the "Show values" table. Temperatures in the reader's unit, times on the shop's clock.
 */
import { formatInTimeZone } from 'date-fns-tz';

import type { ReadingPoint } from '@/components/queries';
import type { TemperatureUnit } from '@/ingest/units';
import { formatMargin, formatTemperature } from '@/ingest/words';

const SIX_DAYS_MS = 6 * 86_400_000;

/**
 * "06:52" on the day of `nowMs` in the shop's zone, else "Tue 06:52"; over a span longer than
 * six days a weekday repeats, so the date instead: "3 Mar 06:52".
 */
export function shopClock(atMs: number, nowMs: number, timeZone: string, spanMs = 0): string {
  if (spanMs > SIX_DAYS_MS || Math.abs(nowMs - atMs) > SIX_DAYS_MS) {
    return formatInTimeZone(atMs, timeZone, 'd MMM HH:mm');
  }
  const sameDay =
    formatInTimeZone(atMs, timeZone, 'yyyy-MM-dd') ===
    formatInTimeZone(nowMs, timeZone, 'yyyy-MM-dd');
  return formatInTimeZone(atMs, timeZone, sameDay ? 'HH:mm' : 'EEE HH:mm');
}

export interface LowestMargin {
  marginK: number;
  atMs: number;
}

/**
 * The lowest dew margin among the points in [fromMs, toMs], with its time: a bucket's own lowest
 * (`marginMin`) so a short dip is not averaged away. The first of equal lows wins.
 */
export function lowestMargin(
  points: readonly ReadingPoint[],
  fromMs = -Infinity,
  toMs = Infinity,
): LowestMargin | null {
  let lowest: LowestMargin | null = null;
  for (const point of points) {
    const atMs = Date.parse(point.at);
    if (atMs < fromMs || atMs > toMs) continue;
    const marginK = point.marginMin ?? point.margin;
    if (marginK === null || !Number.isFinite(marginK)) continue;
    if (!lowest || marginK < lowest.marginK) lowest = { marginK, atMs };
  }
  return lowest;
}

/**
 * "Lowest margin +0.4 °C in the last 24 hours, at 06:52", or why there is none. `spanWords` names the range ("in the
 * last 7 days"), `spanMs` its length (a long span's times carry their date).
 */
export function summaryLine(
  points: readonly ReadingPoint[],
  unit: TemperatureUnit,
  timeZone: string,
  nowMs: number,
  spanWords = 'in the last 24 hours',
  spanMs = 0,
): string {
  if (points.length === 0) return `No readings ${spanWords}.`;
  const lowest = lowestMargin(points);
  if (!lowest)
    return 'No dew margin in this span: no surface temperature was measured or estimated.';
  const at = shopClock(lowest.atMs, nowMs, timeZone, spanMs);
  return `Lowest margin ${formatMargin(lowest.marginK, unit)} ${spanWords}, at ${at}`;
}

export interface ValueRow {
  key: string;
  time: string;
  surface: string;
  dewPoint: string;
  margin: string;
}

/** The newest `limit` points, newest first, as the values table shows them. */
export function valueRows(
  points: readonly ReadingPoint[],
  unit: TemperatureUnit,
  timeZone: string,
  nowMs: number,
  limit = 12,
  spanMs = 0,
): ValueRow[] {
  return points
    .slice(-limit)
    .reverse()
    .map((point) => ({
      key: point.at,
      time: shopClock(Date.parse(point.at), nowMs, timeZone, spanMs),
      surface: formatTemperature(point.surface, unit),
      dewPoint: formatTemperature(point.dewPoint, unit),
      margin: formatMargin(point.margin, unit),
    }));
}
